#include "tailwise/grid.h"

#include <cmath>

namespace tailwise {

RiskGrid normalRiskGrid(HorizonMoments oneDay, std::vector<int> horizons, std::vector<double> confidences)
{
    RiskGrid grid;
    grid.horizons = std::move(horizons);
    grid.confidences = std::move(confidences);
    grid.var.reserve(grid.horizons.size() * grid.confidences.size());
    grid.es.reserve(grid.var.capacity());
    for (int h : grid.horizons) {
        const HorizonMoments m{oneDay.mean * h, oneDay.sd * std::sqrt(static_cast<double>(h))};
        for (double c : grid.confidences) {
            const VarEs f = normalVarEs(m, c);
            grid.var.push_back(f.var);
            grid.es.push_back(f.es);
        }
    }
    return grid;
}

std::optional<double> normalVarTurningHorizon(HorizonMoments oneDay, double confidence)
{
    if (!(oneDay.mean > 0.0) || !(oneDay.sd > 0.0) || !(confidence > 0.5 && confidence < 1.0))
        return std::nullopt;
    const double root = normalQuantile(confidence) * oneDay.sd / (2.0 * oneDay.mean);
    const double h = root * root;
    if (!std::isfinite(h))
        return std::nullopt;
    return h;
}

} // namespace tailwise

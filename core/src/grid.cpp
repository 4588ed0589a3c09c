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
    // The factors depend on the confidence only: found once per column, not once per cell (a
    // year × 60 confidences is 15,000 cells). Each cell is then exactly normalVarEs's expression.
    std::vector<double> z, tail;
    z.reserve(grid.confidences.size());
    tail.reserve(grid.confidences.size());
    for (double c : grid.confidences) {
        z.push_back(normalQuantile(c));
        tail.push_back(normalTailMeanFactor(c));
    }
    for (int h : grid.horizons) {
        const HorizonMoments m{oneDay.mean * h, oneDay.sd * std::sqrt(static_cast<double>(h))};
        for (std::size_t k = 0; k < grid.confidences.size(); ++k) {
            grid.var.push_back(z[k] * m.sd - m.mean);
            grid.es.push_back(tail[k] * m.sd - m.mean);
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

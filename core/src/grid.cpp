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

} // namespace tailwise

// VaR and ES over a grid of horizons × confidences (normal model, square-root-of-time).
//
// Each cell is VaR(H, C) = z(C) √H σ_1 − H μ_1 and ES(H, C) = φ(z)/(1−C) √H σ_1 − H μ_1, from the
// one-day portfolio P&L moments (σ_1, μ_1). With a non-zero mean the H μ term grows faster than
// the √H term, so at long horizons VaR turns down: the grid shows where.
#pragma once

#include "tailwise/parametric.h"

#include <vector>

namespace tailwise {

struct RiskGrid {
    std::vector<int> horizons;       // trading days, rows
    std::vector<double> confidences; // columns
    std::vector<double> var;         // row-major, horizons.size() × confidences.size()
    std::vector<double> es;

    double varAt(std::size_t h, std::size_t c) const { return var[h * confidences.size() + c]; }
    double esAt(std::size_t h, std::size_t c) const { return es[h * confidences.size() + c]; }
};

RiskGrid normalRiskGrid(HorizonMoments oneDay, std::vector<int> horizons,
                        std::vector<double> confidences);

} // namespace tailwise

// VaR and ES over a grid of horizons × confidences (normal model, square-root-of-time).
//
// Each cell is VaR(H, C) = z(C) √H σ_1 − H μ_1 and ES(H, C) = φ(z)/(1−C) √H σ_1 − H μ_1, from the
// one-day portfolio P&L moments (σ_1, μ_1). With a non-zero mean the H μ term grows faster than
// the √H term, so at long horizons VaR turns down: the grid shows where.
#pragma once

#include "tailwise/parametric.h"

#include <optional>
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

// The horizon where normal VaR stops growing: ∂VaR/∂H = z σ_1 / (2√H) − μ_1 = 0 gives
//   H* = (z σ_1 / (2 μ_1))²,  z = Φ⁻¹(C),
// in trading days (not rounded). Beyond H* the expected gain H μ_1 outgrows the z √H σ_1 term
// and VaR falls. Defined only for an expected gain (μ_1 > 0) and a spread (σ_1 > 0) at C > 0.5;
// otherwise nullopt (VaR then grows with H for ever). Follows from the cell formula above.
std::optional<double> normalVarTurningHorizon(HorizonMoments oneDay, double confidence);

} // namespace tailwise

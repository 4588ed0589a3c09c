// VaR and ES over a grid of horizons × confidences.
//
// normalRiskGrid: the normal model, square-root-of-time. Each cell is VaR(H, C) = z(C) √H σ_1 − H μ_1 and ES(H, C) = φ(z)/(1−C) √H σ_1 − H μ_1, from the
// one-day portfolio P&L moments (σ_1, μ_1). With a non-zero mean the H μ term grows faster than
// the √H term, so at long horizons VaR turns down: the grid shows where.
//
// modelRiskGrid: every cell under the model that gave a report's figures (ModelDetails::used),
// with the headline's definitions at that (H, C), so the cell at the report's own horizon and
// confidence is its headline:
//   normal          as above
//   student-t       k_V(ν_H, C) √H σ_1 − H μ_1 (studentt.h; ν_H = ν, or 4 + H(ν − 4) under
//                   aggregate scaling, assumptions.h)
//   cornish-fisher  f_V(S_H, K_H, C) √H σ_1 − H μ_1 (cornishfisher.h; S_H = S, K_H = K, or S/√H, K/H)
//   historical      the window's scenarios at every confidence (allocation.h's
//                   historicalScenarioPnl): √H times the one-day quantile and tail mean, or the
//                   overlapping H-day sums (then horizons with fewer than 2 sums are an error)
//   monte-carlo     one set of seeded standard draws y_k (simulate.h) reused at every cell: the
//                   H-day losses −(H eᵀμ + √H y_k), so the cell is √H Q_C(−y) − H eᵀμ (the type 7
//                   quantile and the tail mean follow positive affine maps): smooth in H and C.
#pragma once

#include "tailwise/parametric.h"
#include "tailwise/result.h"
#include "tailwise/runcontrol.h"

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

struct RiskReport;
// Errors: Cancelled (monte-carlo); InsufficientData naming "horizon" (historical, overlapping).
Result<RiskGrid> modelRiskGrid(const RiskReport &report, std::vector<int> horizons, std::vector<double> confidences,
                               const RunControl &control = {});

// The horizon where normal VaR stops growing: ∂VaR/∂H = z σ_1 / (2√H) − μ_1 = 0 gives
//   H* = (z σ_1 / (2 μ_1))²,  z = Φ⁻¹(C),
// in trading days (not rounded). Beyond H* the expected gain H μ_1 outgrows the z √H σ_1 term
// and VaR falls. Defined only for an expected gain (μ_1 > 0) and a spread (σ_1 > 0) at C > 0.5;
// otherwise nullopt (VaR then grows with H for ever). Follows from the cell formula above.
std::optional<double> normalVarTurningHorizon(HorizonMoments oneDay, double confidence);

} // namespace tailwise

// VaR and ES over a grid of horizons × confidences under the model that gave a report's figures
// (ModelDetails::used), with the headline's definitions at every (H, C), so the cell at the
// report's own horizon and confidence is its headline:
//   normal          normalRiskGrid (grid.h): z(C) √H σ_1 − H μ_1
//   student-t       k_V(ν_H, C) √H σ_1 − H μ_1 (studentt.h; ν_H = ν under square-root scaling, or
//                   4 + H(ν − 4) under aggregate scaling, multidayscaling.h; the report's
//                   Assumptions::scaling says which)
//   cornish-fisher  f_V(S_H, K_H, C) √H σ_1 − H μ_1 (cornishfisher.h; S_H = S, K_H = K, or S/√H, K/H
//                   under aggregate scaling)
//   historical      the window's scenarios at every confidence (allocation.h's
//                   historicalScenarioPnl): √H times the one-day quantile and tail mean, or the
//                   overlapping H-day sums (horizons with fewer than 2 sums are an error)
//   monte-carlo     one set of seeded standard draws y_k (simulate.h) reused at every cell: the
//                   H-day losses are −(H eᵀμ + √H y_k), so the cell is √H Q_C(−y) − H eᵀμ (the type 7
//                   quantile and the tail mean follow positive affine maps): smooth in H and C, and
//                   the same draws as the headline's for the same seed.
// ES alike with the ES factors and tail means.
#pragma once

#include "tailwise/grid.h"
#include "tailwise/multidayscaling.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"
#include "tailwise/runcontrol.h"

#include <vector>

namespace tailwise {

// Errors: Cancelled (monte-carlo); InsufficientData naming "horizon" (historical, overlapping).
Result<RiskGrid> modelRiskGrid(const RiskReport &report, std::vector<int> horizons, std::vector<double> confidences,
                               const RunControl &control = {});

} // namespace tailwise

// What-if trades: the risk of the portfolio before and after a set of proposed trades.
//
// A trade changes one asset's quantity by Δq units (a holding given by value changes by Δq money);
// an asset of the price history that is not yet held may be traded. With exposures e before and
// e + Δe after (Δe_i = Δq_i × price_i):
//   incremental VaR    = VaR(e + Δe) − VaR(e)                      exact, under the chosen model
//   marginal estimate  = Σ_i ∂VaR/∂e_i · Δe_i                      first order in Δe
// (Jorion, Value at Risk, "VaR tools": incremental and marginal VaR (mem).) For the normal model the
// gradient is the Euler marginal VaR of contributions.h, z√H(Σe)_i/σ_p − Hμ_i. For the other
// models it is the derivative of that model's VaR along Δe by a central difference,
// (VaR(e + εΔe) − VaR(e − εΔe)) / (2ε) with ε = 1e-4, every model input (window, fitted ν or shape,
// Monte Carlo seed and draws) recomputed as the model itself would. The two figures agree to
// first order; their gap shows how far the trade is from small.
//
// Both portfolios are computed on the same list of assets (the holdings plus any newly traded
// asset at zero quantity), so a Monte Carlo run uses the same draws before and after (common
// random numbers). A trade that leaves a quantity at zero keeps the row with quantity zero.
// `control` reaches every run (2 for the normal model, 4 otherwise); progress covers them all and
// never goes back. Run a Monte Carlo what-if off the GUI thread.
// Errors: Reference (field "trade") for an asset the price history lacks; Value for a non-finite
// change; and any error of computeRisk.
#pragma once

#include "tailwise/risk.h"
#include "tailwise/runcontrol.h"

#include <span>
#include <string>
#include <vector>

namespace tailwise {

struct Trade {
    std::string asset;
    double change = 0.0; // units of the asset (money for a holding given by value)
};

// The holdings after the trades (several trades in one asset add up); new assets are appended in
// trade order with quantity = change.
Result<Holdings> applyTrades(const Holdings &holdings, std::span<const Trade> trades, const PriceHistory &prices);

struct WhatIfFigures {
    double varBefore = 0.0;
    double varAfter = 0.0;
    double incrementalVar = 0.0;    // varAfter − varBefore
    double marginalEstimate = 0.0;  // gradient · Δe
    double estimateGap = 0.0;       // incrementalVar − marginalEstimate
};

WhatIfFigures whatIfFigures(double varBefore, double varAfter, const Eigen::VectorXd &marginalVar,
                            const Eigen::VectorXd &exposureChange);

struct WhatIf {
    WhatIfFigures figures;
    std::string marginalMethod;      // how the marginal estimate was computed, for reports
    RiskReport before;               // on the common asset list
    RiskReport after;
    Holdings holdingsAfter;          // as applyTrades gives them
    Eigen::VectorXd exposureChange;  // Δe, in the order of before.holdings
    Warnings warnings;
};

Result<WhatIf> whatIf(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions,
                      std::span<const Trade> trades, const RunControl &control = {});

} // namespace tailwise

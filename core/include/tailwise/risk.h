// The whole calculation: price history + holdings + assumptions → a RiskReport value.
//
// Steps (each defined in its own header): returns and window (returns.h), daily moments
// (estimate.h), exposures (holdings.h), horizon moments σ_h = √H √(eᵀΣe), μ_h = H Σ e_i μ_i,
// VaR and ES (parametric.h), contributions (contributions.h). Fractions are of V = Σ e_i and are
// absent (nullopt) when V = 0, since a share of nothing is not defined.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/contributions.h"
#include "tailwise/estimate.h"
#include "tailwise/holdings.h"
#include "tailwise/parametric.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"

#include <Eigen/Core>

#include <optional>
#include <string>
#include <vector>

namespace tailwise {

struct HoldingRisk {
    std::string asset;
    double quantity = 0.0;
    double price = 0.0;
    double exposure = 0.0;               // money
    std::optional<double> weight;        // exposure / V
    double dailyVolatility = 0.0;        // σ_i of the asset's returns
    double marginalVar = 0.0;
    double componentVar = 0.0;
    std::optional<double> componentShare; // component / VaR
    double componentEs = 0.0;
    double standaloneVar = 0.0;
    double standaloneEs = 0.0;
};

struct RiskReport {
    Assumptions assumptions;
    double portfolioValue = 0.0;
    HorizonMoments horizon;     // μ_h, σ_h in money
    HorizonMoments oneDay;      // μ_1, σ_1 in money
    VarEs figures;
    std::optional<double> varFraction;
    std::optional<double> esFraction;
    double undiversifiedVar = 0.0;
    double diversificationBenefit = 0.0;
    std::vector<HoldingRisk> holdings;
    // The data behind the figure.
    int windowReturns = 0;
    Date windowFirst;
    Date windowLast;
    Eigen::VectorXd exposures;
    Eigen::MatrixXd windowReturnsMatrix; // the window's daily returns (for histograms, tests)
    Moments moments;
    Warnings warnings;
};

Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings,
                               const Assumptions &assumptions);

// The single-position mode of the CLI: one holding of value V with annual volatility and drift.
Result<RiskReport> computeSinglePositionRisk(const SinglePosition &position,
                                             const Assumptions &assumptions);

} // namespace tailwise

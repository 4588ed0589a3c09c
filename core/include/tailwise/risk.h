// The whole calculation: price history + holdings + assumptions → a RiskReport value.
//
// Steps (each defined in its own header): returns and window (returns.h), daily moments
// (estimate.h), exposures (holdings.h), horizon moments σ_h = √H √(eᵀΣe), μ_h = H Σ e_i μ_i,
// VaR and ES (parametric.h), contributions (contributions.h). Fractions are of V = Σ e_i and are
// absent (nullopt) when V = 0, since a share of nothing is not defined.
//
// The model (Assumptions::model) chooses how VaR and ES are computed: normal (parametric.h),
// student-t (studentt.h), cornish-fisher (cornishfisher.h), historical (historical.h) or
// monte-carlo (simulate.h). σ_h and μ_h are always the covariance-based horizon moments above; the
// contributions, standalone figures and diversification follow the model that gave the figures
// (allocation.h; ModelDetails::contributions equals ModelDetails::used). Student-t with ν fitted, or
// Cornish–Fisher, fall back to the normal model with a warning when the P&L's shape cannot be
// estimated or has no excess kurtosis; ModelDetails::used names the model that gave the figures.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/contributions.h"
#include "tailwise/estimate.h"
#include "tailwise/estimatecache.h"
#include "tailwise/holdings.h"
#include "tailwise/parametric.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"
#include "tailwise/runcontrol.h"
#include "tailwise/shape.h"

#include <Eigen/Core>

#include <cstdint>
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

// What the model used, beyond the figures. Fields a model does not use stay empty.
struct ModelDetails {
    RiskModel used = RiskModel::Normal;          // after any fallback
    RiskModel contributions = RiskModel::Normal; // the model the contributions follow
    std::optional<double> dof;                   // ν (student-t; monte-carlo with t draws)
    bool dofFitted = false;                      // ν came from the moment fit
    std::optional<Shape> shape;                  // S, K of the daily P&L (cornish-fisher, t fit)
    std::optional<bool> cornishFisherMonotone;
    // What the horizon figure used under the multi-day scaling (Assumptions::scaling,
    // multidayscaling.h): ν, or ν_H = 4 + H(ν − 4) under aggregate scaling (student-t); S and K,
    // or S/√H and K/H under aggregate scaling (cornish-fisher).
    std::optional<double> horizonDof;
    std::optional<Shape> horizonShape;
    std::optional<double> varStandardError;      // monte-carlo, money
    std::optional<double> esStandardError;       // monte-carlo, money
    std::string standardErrorMethod;
    int simulations = 0;                         // monte-carlo
    std::optional<std::uint64_t> seed;           // monte-carlo
    int scenarios = 0;                           // historical: losses the quantile was taken over
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
    ModelDetails model;
    Warnings warnings;
};

Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings,
                               const Assumptions &assumptions);
// The same with cancellation, progress and a thread count (only monte-carlo uses them; run it off
// the GUI thread). Errors additionally: Cancelled.
Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings,
                               const Assumptions &assumptions, const RunControl &control);
// The same, reusing the window and moments from `cache` when its key matches (estimatecache.h);
// `pricesRevision` identifies the price history's current version for the key.
Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings,
                               const Assumptions &assumptions, const RunControl &control,
                               EstimateCache &cache, std::uint64_t pricesRevision);

// The single-position mode of the CLI: one holding of value V with annual volatility and drift.
// Models that need the P&L history (historical, cornish-fisher, student-t with ν fitted) are
// refused here with an Assumption error naming "model".
Result<RiskReport> computeSinglePositionRisk(const SinglePosition &position,
                                             const Assumptions &assumptions);
Result<RiskReport> computeSinglePositionRisk(const SinglePosition &position,
                                             const Assumptions &assumptions, const RunControl &control);

} // namespace tailwise

// The assumptions behind a risk figure, and their checks.
//
// Every field has a domain; validate() refuses a value outside it with an Error whose `field`
// names the assumption (the CLI maps that name to its option, the window to its field).
#pragma once

#include "tailwise/multidayscaling.h"
#include "tailwise/result.h"

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace tailwise {

enum class ReturnType { Simple, Log };       // r = P_t/P_{t-1} − 1, or ln(P_t/P_{t-1})
enum class CovarianceEstimator { Sample, Ewma };
enum class MeanModel { Zero, Sample };       // daily mean taken as zero, or estimated
// normal: parametric.h; student-t: studentt.h; cornish-fisher: cornishfisher.h;
// historical: historical.h; monte-carlo: simulate.h.
enum class RiskModel { Normal, StudentT, CornishFisher, Historical, MonteCarlo };
// How historical simulation reaches an H-day horizon: √H times the one-day figures, or from the
// sums of H consecutive daily P&L (historical.h).
enum class HistoricalHorizon { SquareRoot, Overlapping };

// Degrees of freedom ν of the Student-t model and of Monte Carlo's t draws: unset (Student-t fits
// ν by moments, Monte Carlo draws normal), a given ν > 2, or fitted by moments (studentt.h).
struct DegreesOfFreedom {
    enum class Kind { Unset, Given, Fit };
    Kind kind = Kind::Unset;
    double value = 0.0; // ν when kind == Given

    static DegreesOfFreedom given(double nu) { return {Kind::Given, nu}; }
    static DegreesOfFreedom fit() { return {Kind::Fit, 0.0}; }
    friend bool operator==(const DegreesOfFreedom &, const DegreesOfFreedom &) = default;
};

struct Assumptions {
    double confidence = 0.99;      // C, 0.5 ≤ C ≤ 0.9999 (validate)
    int horizonDays = 1;           // H, whole trading days ≥ 1
    int daysPerYear = 252;         // N, for annualised read-outs and the single-position mode
    std::optional<int> window;     // number of most recent returns; all when unset
    ReturnType returns = ReturnType::Simple;
    CovarianceEstimator estimator = CovarianceEstimator::Sample;
    double lambda = 0.94;          // EWMA decay, 0 < λ < 1
    MeanModel mean = MeanModel::Zero;
    RiskModel model = RiskModel::Normal;
    DegreesOfFreedom dof;                                      // student-t, monte-carlo
    HistoricalHorizon historicalHorizon = HistoricalHorizon::SquareRoot; // historical
    MultiDayScaling scaling = MultiDayScaling::SquareRoot;     // student-t, cornish-fisher: H-day shape (multidayscaling.h)
    int simulations = 100000;                                  // monte-carlo draws, 1000 … 10,000,000
    std::uint64_t seed = 1;                                    // monte-carlo: same seed → same figures
};

Status validate(const Assumptions &assumptions);

// Names used in files, the CLI and JSON ("simple", "ewma", "normal", …) and their parsers.
std::string_view toName(ReturnType value);
std::string_view toName(CovarianceEstimator value);
std::string_view toName(MeanModel value);
std::string_view toName(RiskModel value);
std::string_view toName(HistoricalHorizon value); // "sqrt", "overlapping"
std::optional<ReturnType> parseReturnType(std::string_view name);
std::optional<CovarianceEstimator> parseEstimator(std::string_view name);
std::optional<MeanModel> parseMeanModel(std::string_view name);
std::optional<RiskModel> parseRiskModel(std::string_view name);
std::optional<HistoricalHorizon> parseHistoricalHorizon(std::string_view name);

// The EWMA's effective number of days, 1/(1−λ): the mean age weighting of its observations
// plus one (common practice as a read-out of λ; e.g. λ = 0.94 → about 16.7 days).
double ewmaEffectiveDays(double lambda);

} // namespace tailwise

#include "tailwise/assumptions.h"

#include <cmath>

namespace tailwise {

namespace {
std::string show(double v)
{
    if (std::isnan(v))
        return "not a number";
    if (std::isinf(v))
        return v > 0 ? "infinity" : "-infinity";
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.10g", v);
    return buffer;
}
} // namespace

Status validate(const Assumptions &a)
{
    if (!(a.confidence > 0.0 && a.confidence < 1.0))
        return fieldError(ErrorKind::Assumption, "confidence",
                          "expected a level strictly between 0 and 1 (e.g. 0.99), found " + show(a.confidence));
    if (a.horizonDays < 1)
        return fieldError(ErrorKind::Assumption, "horizon",
                          "expected a whole number of trading days of at least 1, found " + std::to_string(a.horizonDays));
    if (a.horizonDays > 100000)
        return fieldError(ErrorKind::Assumption, "horizon", "expected at most 100000 trading days, found " + std::to_string(a.horizonDays));
    if (a.daysPerYear < 1 || a.daysPerYear > 366)
        return fieldError(ErrorKind::Assumption, "days-per-year",
                          "expected a whole number of trading days a year between 1 and 366, found " + std::to_string(a.daysPerYear));
    if (a.window && *a.window < 2)
        return fieldError(ErrorKind::Assumption, "window",
                          "expected at least 2 returns in the window, found " + std::to_string(*a.window));
    if (!(a.lambda > 0.0 && a.lambda < 1.0))
        return fieldError(ErrorKind::Assumption, "lambda",
                          "expected a decay strictly between 0 and 1 (e.g. 0.94), found " + show(a.lambda));
    if (a.dof.kind == DegreesOfFreedom::Kind::Given && !(a.dof.value > 2.0 && a.dof.value <= 1e6))
        return fieldError(ErrorKind::Assumption, "dof",
                          "expected degrees of freedom greater than 2 and at most 1000000 (the t variance is "
                          "infinite at 2 or below), or 'fit', found " + show(a.dof.value));
    if (a.simulations < 1000 || a.simulations > 10000000)
        return fieldError(ErrorKind::Assumption, "simulations",
                          "expected between 1000 and 10000000 draws, found " + std::to_string(a.simulations));
    return Done{};
}

std::string_view toName(ReturnType v) { return v == ReturnType::Simple ? "simple" : "log"; }
std::string_view toName(CovarianceEstimator v) { return v == CovarianceEstimator::Sample ? "sample" : "ewma"; }
std::string_view toName(MeanModel v) { return v == MeanModel::Zero ? "zero" : "sample"; }
std::string_view toName(RiskModel v)
{
    switch (v) {
    case RiskModel::Normal: return "normal";
    case RiskModel::StudentT: return "student-t";
    case RiskModel::CornishFisher: return "cornish-fisher";
    case RiskModel::Historical: return "historical";
    case RiskModel::MonteCarlo: return "monte-carlo";
    }
    return "normal";
}
std::string_view toName(HistoricalHorizon v) { return v == HistoricalHorizon::SquareRoot ? "sqrt" : "overlapping"; }

std::optional<ReturnType> parseReturnType(std::string_view n)
{
    if (n == "simple") return ReturnType::Simple;
    if (n == "log") return ReturnType::Log;
    return std::nullopt;
}
std::optional<CovarianceEstimator> parseEstimator(std::string_view n)
{
    if (n == "sample") return CovarianceEstimator::Sample;
    if (n == "ewma") return CovarianceEstimator::Ewma;
    return std::nullopt;
}
std::optional<MeanModel> parseMeanModel(std::string_view n)
{
    if (n == "zero") return MeanModel::Zero;
    if (n == "sample") return MeanModel::Sample;
    return std::nullopt;
}
std::optional<RiskModel> parseRiskModel(std::string_view n)
{
    if (n == "normal") return RiskModel::Normal;
    if (n == "student-t") return RiskModel::StudentT;
    if (n == "cornish-fisher") return RiskModel::CornishFisher;
    if (n == "historical") return RiskModel::Historical;
    if (n == "monte-carlo") return RiskModel::MonteCarlo;
    return std::nullopt;
}
std::optional<HistoricalHorizon> parseHistoricalHorizon(std::string_view n)
{
    if (n == "sqrt") return HistoricalHorizon::SquareRoot;
    if (n == "overlapping") return HistoricalHorizon::Overlapping;
    return std::nullopt;
}

double ewmaEffectiveDays(double lambda) { return 1.0 / (1.0 - lambda); }

} // namespace tailwise

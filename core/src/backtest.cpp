#include "tailwise/backtest.h"

#include "tailwise/cornishfisher.h"
#include "tailwise/guard.h"
#include "tailwise/historical.h"
#include "tailwise/parametric.h"
#include "tailwise/returns.h"
#include "tailwise/shape.h"
#include "tailwise/studentt.h"

#include <boost/math/distributions/normal.hpp>

#include <algorithm>
#include <cassert>
#include <cmath>
#include <memory>
#include <optional>
#include <span>
#include <string>
#include <utility>

namespace tailwise {

namespace {

Error plainError(ErrorKind kind, std::string message)
{
    Error e;
    e.kind = kind;
    e.message = std::move(message);
    return e;
}

double portfolioSd(const ForecastInput &in)
{
    return std::sqrt(in.moments.portfolioVariance(in.exposures));
}

double portfolioMean(const ForecastInput &in)
{
    return in.exposures.dot(in.moments.mean());
}

Forecast normalForecast(const ForecastInput &in)
{
    return Forecast{normalQuantile(in.assumptions.confidence) * portfolioSd(in) - portfolioMean(in), false};
}

// The window's daily P&L with today's exposures (shape.h's dailyPnl), for the models that look at
// its shape or its empirical quantile.
Eigen::VectorXd windowPnl(const ForecastInput &in)
{
    return in.moments.windowReturns() * in.exposures;
}

std::optional<Shape> shapeOf(const Eigen::VectorXd &pnl)
{
    return momentShape(std::span<const double>(pnl.data(), static_cast<std::size_t>(pnl.size())));
}

Forecast studentTForecast(const ForecastInput &in)
{
    const DegreesOfFreedom &dof = in.assumptions.dof;
    std::optional<double> nu;
    if (dof.kind == DegreesOfFreedom::Kind::Given) {
        nu = dof.value;
    } else if (const auto shape = shapeOf(windowPnl(in))) {
        nu = fitDofByKurtosis(shape->excessKurtosis);
    }
    if (!nu)
        return Forecast{normalForecast(in).var, true};
    return Forecast{studentTVarFactor(*nu, in.assumptions.confidence) * portfolioSd(in) - portfolioMean(in), false};
}

Forecast cornishFisherForecast(const ForecastInput &in)
{
    const auto shape = shapeOf(windowPnl(in));
    if (!shape)
        return Forecast{normalForecast(in).var, true};
    // −z_cf(Φ⁻¹(α)), α = 1 − C, as cornishFisherFactors() gives it (without its ES quadrature).
    const double alpha = 1.0 - in.assumptions.confidence;
    const double z = boost::math::quantile(boost::math::normal(), alpha);
    return Forecast{-cornishFisherZ(z, *shape) * portfolioSd(in) - portfolioMean(in), false};
}

Forecast historicalForecast(const ForecastInput &in)
{
    const Eigen::VectorXd losses = -windowPnl(in);
    const VarEs figures =
        empiricalVarEs(std::span<const double>(losses.data(), static_cast<std::size_t>(losses.size())),
                       in.assumptions.confidence);
    return Forecast{figures.var, false};
}

} // namespace

Status checkBacktestModel(RiskModel model)
{
    // Written as a test rather than a switch so that models added to RiskModel are refused here
    // until the backtest learns them, instead of failing to compile.
    for (RiskModel supported : backtestModels())
        if (model == supported)
            return Done{};
    return fieldError(ErrorKind::Assumption, "model",
                      "the backtest does not support the '" + std::string(toName(model))
                          + "' model yet; it supports 'normal', 'student-t', 'cornish-fisher' and 'historical'");
}

Result<Forecast> forecastOneDayVar(RiskModel model, const ForecastInput &input)
{
    if (model == RiskModel::Normal)
        return normalForecast(input);
    if (model == RiskModel::StudentT)
        return studentTForecast(input);
    if (model == RiskModel::CornishFisher)
        return cornishFisherForecast(input);
    if (model == RiskModel::Historical)
        return historicalForecast(input);
    return checkBacktestModel(model).error();
}

void fillStatistics(BacktestResult &r)
{
    assert(!r.days.empty());
    // std::vector<bool> has no contiguous storage to view as a span; a plain array does.
    const std::unique_ptr<bool[]> hits(new bool[r.days.size()]);
    for (std::size_t i = 0; i < r.days.size(); ++i)
        hits[i] = r.days[i].exception;
    const std::span<const bool> view(hits.get(), r.days.size());
    r.observations = static_cast<int>(r.days.size());
    r.exceptions = static_cast<int>(std::count(view.begin(), view.end(), true));
    r.expectedExceptions = r.tailProbability * static_cast<double>(r.observations);
    r.kupiec = kupiecPof(r.exceptions, r.observations, r.tailProbability);
    r.christoffersen = christoffersen(view, r.tailProbability);
    r.zone = trafficLightZone(r.exceptions, r.observations, r.tailProbability);
}

std::vector<Date> exceptionDates(const BacktestResult &result)
{
    std::vector<Date> dates;
    for (const auto &d : result.days)
        if (d.exception)
            dates.push_back(d.date);
    return dates;
}

static Result<BacktestResult> runBacktestUnguarded(const BacktestRequest &request, std::stop_token stop,
                                                   const ProgressCallback &progress);

Result<BacktestResult> runBacktest(const BacktestRequest &request, std::stop_token stop, const ProgressCallback &progress)
{
    return catchLibraryErrors([&] { return runBacktestUnguarded(request, stop, progress); });
}

static Result<BacktestResult> runBacktestUnguarded(const BacktestRequest &request, std::stop_token stop,
                                                   const ProgressCallback &progress)
{
    const Assumptions &a = request.assumptions;
    const PriceHistory &prices = request.prices;
    if (auto ok = validate(a); !ok)
        return ok.error();
    if (!a.window)
        return fieldError(ErrorKind::Assumption, "window",
                          "a backtest needs a window length: the number of daily returns each forecast is "
                          "estimated from (e.g. 250)");
    if (auto ok = checkBacktestModel(a.model); !ok)
        return ok.error();
    if (request.holdings.empty())
        return fieldError(ErrorKind::InsufficientData, "holdings", "the portfolio has no holdings");
    if (auto ok = checkHoldings(request.holdings, prices); !ok)
        return ok.error();
    const int w = *a.window;
    const int available = prices.dayCount() - 1;
    if (w >= available)
        return fieldError(ErrorKind::InsufficientData, "window",
                          "a window of " + std::to_string(w) + " returns leaves no day to test: the price history has "
                              + std::to_string(std::max(available, 0)) + " returns (" + std::to_string(prices.dayCount())
                              + " days), and a backtest needs more returns than the window");

    // The held assets' columns, in holdings order.
    const Eigen::Index n = static_cast<Eigen::Index>(request.holdings.size());
    const Eigen::Index days = prices.prices.rows();
    Eigen::MatrixXd heldPrices(days, n);
    Eigen::VectorXd quantity(n), fixedValue(n);
    Eigen::Array<bool, Eigen::Dynamic, 1> byValue(n);
    BacktestResult result;
    result.assumptions = a;
    result.window = w;
    result.tailProbability = 1.0 - a.confidence;
    result.warnings = prices.warnings;
    bool overridden = false;
    for (Eigen::Index i = 0; i < n; ++i) {
        const Holding &h = request.holdings[static_cast<std::size_t>(i)];
        heldPrices.col(i) = prices.prices.col(prices.assetIndex(h.asset));
        byValue(i) = h.value.has_value();
        quantity(i) = h.value ? 0.0 : h.quantity;
        fixedValue(i) = h.value.value_or(0.0);
        overridden |= h.priceOverride.has_value();
    }
    if (overridden)
        result.warnings.push_back("price overrides in the holdings are not used: each past day is valued at its own close");
    if (a.horizonDays != 1)
        result.warnings.push_back("the backtest is of one-day VaR: the horizon of " + std::to_string(a.horizonDays)
                                  + " days is not used");
    if (w <= n)
        result.warnings.push_back("the window has " + std::to_string(w) + " returns for " + std::to_string(n)
                                  + " holdings: each covariance is singular and the forecasts rest on too little data");

    const Eigen::MatrixXd simple = computeReturns(heldPrices, ReturnType::Simple);
    const Eigen::MatrixXd logReturns = a.returns == ReturnType::Log ? computeReturns(heldPrices, ReturnType::Log)
                                                                    : Eigen::MatrixXd();
    const Eigen::MatrixXd &estimation = a.returns == ReturnType::Log ? logReturns : simple;
    RollingMoments moments(estimation, w, a.estimator, a.lambda, a.mean);

    // Return row k belongs to date k+1; the first tested day is t = W+1 (return row W), whose
    // window is return rows 0 … W−1, exactly where RollingMoments starts.
    const int tested = available - w;
    result.days.reserve(static_cast<std::size_t>(tested));
    const int progressStep = std::max(1, tested / 100);
    Eigen::VectorXd exposures(n);
    int fallbackDays = 0;
    for (int k = 0; k < tested; ++k) {
        if (stop.stop_requested())
            return plainError(ErrorKind::Cancelled, "the backtest was stopped before it finished");
        // Day t = W+1+k: its return is row t−1 of `simple`, its previous close is price row t−1.
        const Eigen::Index row = w + k;
        const Eigen::Index closeBefore = row;
        for (Eigen::Index i = 0; i < n; ++i)
            exposures(i) = byValue(i) ? fixedValue(i) : quantity(i) * heldPrices(closeBefore, i);
        auto forecast = forecastOneDayVar(a.model, ForecastInput{exposures, moments, a});
        if (!forecast)
            return forecast.error();
        fallbackDays += forecast.value().normalFallback ? 1 : 0;
        BacktestDay day;
        day.date = prices.dates[static_cast<std::size_t>(row + 1)];
        day.pnl = exposures.dot(simple.row(row).transpose());
        day.var = forecast.value().var;
        if (!std::isfinite(day.pnl) || !std::isfinite(day.var))
            return plainError(ErrorKind::Numerical, "the backtest gave a non-finite figure on " + toIso(day.date)
                                                        + ": the prices or holdings are too large to compute with");
        day.exception = -day.pnl > day.var;
        result.days.push_back(day);
        if (moments.canAdvance())
            moments.advance();
        if (progress && ((k + 1) % progressStep == 0 || k + 1 == tested))
            progress(static_cast<double>(k + 1) / static_cast<double>(tested));
    }

    fillStatistics(result);
    result.normalFallbackDays = fallbackDays;
    if (fallbackDays > 0)
        result.warnings.push_back("on " + std::to_string(fallbackDays) + " of " + std::to_string(tested) + " days the "
                                  + std::string(toName(a.model))
                                  + " model could not be fitted to the window's P&L (no spread, or no excess kurtosis "
                                    "for a Student-t) and the normal model was used for that day");
    if (result.observations < 250)
        result.warnings.push_back("only " + std::to_string(result.observations)
                                  + " days were tested: the coverage tests have little power on fewer than about 250");
    if (result.christoffersen.transitions.total() == 0)
        result.warnings.push_back("a single tested day has no day-to-day transitions: the independence test is not informative");
    return result;
}

Result<BacktestResult> runBacktest(const BacktestRequest &request, const RunControl &control)
{
    return runBacktest(request, control.stop, control.progress);
}

std::vector<RiskModel> backtestModels()
{
    return {RiskModel::Normal, RiskModel::StudentT, RiskModel::CornishFisher, RiskModel::Historical};
}

BacktestVerdict verdictAt(const BacktestResult &r, double testSize)
{
    assert(testSize > 0.0 && testSize < 1.0);
    BacktestVerdict v;
    v.testSize = testSize;
    v.kupiecRejected = r.kupiec.pValue < testSize;
    v.tooManyExceptions = r.exceptions > r.expectedExceptions;
    v.independenceRejected = r.christoffersen.transitions.total() > 0 && r.christoffersen.independence.pValue < testSize;
    v.clustering = r.christoffersen.pi1 > r.christoffersen.pi0;
    v.coverageRejected = r.christoffersen.conditionalCoverage.pValue < testSize;
    v.passed = !v.kupiecRejected && !v.independenceRejected && !v.coverageRejected;
    return v;
}

} // namespace tailwise

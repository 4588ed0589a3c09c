#include "tailwise/risk.h"

#include "tailwise/finitecheck.h"

#include "tailwise/allocation.h"
#include "tailwise/cornishfisher.h"
#include "tailwise/estimate.h"
#include "tailwise/guard.h"
#include "tailwise/historical.h"
#include "tailwise/returns.h"
#include "tailwise/simulate.h"
#include "tailwise/studentt.h"

#include <chrono>
#include <cmath>
#include <cstdio>
#include <span>
#include <string_view>
#include <unordered_map>
#include <vector>

namespace tailwise {

namespace {

using Clock = std::chrono::steady_clock;

double msBetween(Clock::time_point from, Clock::time_point to)
{
    return std::chrono::duration<double, std::milli>(to - from).count();
}

// Fills the fields that follow from exposures, moments and assumptions alone.
void fillFigures(RiskReport &report, const Eigen::VectorXd &exposures, const Eigen::MatrixXd &cov,
                 const Eigen::VectorXd &mean)
{
    const auto &a = report.assumptions;
    const double h = static_cast<double>(a.horizonDays);
    report.exposures = exposures;
    report.portfolioValue = exposures.sum();
    const double variance = std::max(0.0, exposures.dot(cov * exposures));
    report.oneDay = HorizonMoments{exposures.dot(mean), std::sqrt(variance)};
    report.horizon = HorizonMoments{h * report.oneDay.mean, std::sqrt(h) * report.oneDay.sd};
    report.figures = normalVarEs(report.horizon, a.confidence);
    if (report.portfolioValue == 0.0)
        report.warnings.push_back("the portfolio's net value is zero: VaR and ES cannot be given as a share of it");
    if (report.oneDay.sd == 0.0)
        report.warnings.push_back("the portfolio's P&L has zero variance over the window: VaR reflects the mean only");

    for (std::size_t i = 0; i < report.holdings.size(); ++i) {
        auto &hr = report.holdings[i];
        const auto k = static_cast<Eigen::Index>(i);
        hr.exposure = exposures(k);
        if (report.portfolioValue != 0.0)
            hr.weight = exposures(k) / report.portfolioValue;
        hr.dailyVolatility = std::sqrt(std::max(0.0, cov(k, k)));
    }
}

// The allocation of the model that gave the figures (allocation.h), into the holdings' rows.
void storeAllocation(RiskReport &report, const Allocation &c)
{
    report.undiversifiedVar = c.undiversifiedVar;
    report.diversificationBenefit = c.diversificationBenefit;
    report.model.contributions = report.model.used;
    for (std::size_t i = 0; i < report.holdings.size(); ++i) {
        auto &hr = report.holdings[i];
        const auto k = static_cast<Eigen::Index>(i);
        hr.marginalVar = c.marginalVar(k);
        hr.componentVar = c.componentVar(k);
        hr.componentShare.reset();
        if (report.figures.var != 0.0)
            hr.componentShare = c.componentVar(k) / report.figures.var;
        hr.componentEs = c.componentEs(k);
        hr.standaloneVar = c.standaloneVar(k);
        hr.standaloneEs = c.standaloneEs(k);
    }
    report.warnings.insert(report.warnings.end(), c.warnings.begin(), c.warnings.end());
}

// Figures the model gives but the user should not take at face value (common practice; each one a
// case that gave a figure with no word of caution):
//   - ν < 3: a Student-t scaled to the window's variance puts nearly all of it in rare extreme
//     losses (its kurtosis is infinite for ν ≤ 4), so the VaR at usual confidences comes out small;
//   - VaR or ES above the value of a book that only holds long positions: such a book cannot lose
//     more than its value; the figure is the model's, stretched past its range (a long horizon);
//   - a horizon longer than the returns in the window: the scaling to the horizon rests on more
//     days than the data has seen.
void addPlausibilityWarnings(RiskReport &report)
{
    const auto &a = report.assumptions;
    if (report.model.dof && *report.model.dof < 3.0)
        report.warnings.push_back("Student-t with " + std::to_string(*report.model.dof).substr(0, 6)
                                  + " degrees of freedom (below 3): scaled to the window's variance, nearly all of the "
                                    "spread sits in rare extreme losses, so VaR at this confidence is small and unreliable");
    const bool longOnly = report.exposures.size() > 0 && (report.exposures.array() >= 0.0).all();
    if (longOnly && report.portfolioValue > 0.0
        && (report.figures.var > report.portfolioValue || report.figures.es > report.portfolioValue))
        report.warnings.push_back(std::string(report.figures.var > report.portfolioValue ? "VaR" : "ES")
                                  + " exceeds the portfolio's value, which a book of long positions only cannot lose: "
                                    "the model is stretched beyond its range (e.g. by a long horizon)");
    if (report.windowReturns > 0 && a.horizonDays > report.windowReturns)
        report.warnings.push_back("the horizon of " + std::to_string(a.horizonDays) + " days is longer than the "
                                  + std::to_string(report.windowReturns)
                                  + " daily returns in the window: the figures extrapolate beyond the data");
}

// Fractions and the sign warning, from whichever model gave the figures.
void finishFigures(RiskReport &report)
{
    if (report.portfolioValue != 0.0) {
        report.varFraction = report.figures.var / report.portfolioValue;
        report.esFraction = report.figures.es / report.portfolioValue;
    }
    if (report.figures.var <= 0.0)
        report.warnings.push_back("the expected gain over the horizon exceeds the loss quantile: VaR is zero or negative "
                                  "(no loss is expected at this confidence)");
    addPlausibilityWarnings(report);
}

void appendWarnings(RiskReport &report, const Warnings &more)
{
    report.warnings.insert(report.warnings.end(), more.begin(), more.end());
}

// The P&L shape, or a warning saying why the model falls back to normal.
std::optional<Shape> pnlShape(RiskReport &report, const char *modelName)
{
    const Eigen::VectorXd pnl = dailyPnl(report.windowReturnsMatrix, report.exposures);
    auto shape = momentShape(std::span<const double>(pnl.data(), static_cast<std::size_t>(pnl.size())));
    if (!shape)
        report.warnings.push_back(std::string("the window's daily P&L has no spread, so its skewness and kurtosis are "
                                              "not defined: the ") + modelName + " model falls back to the normal model");
    return shape;
}

// ν for the t model or the t draws: given, fitted by moments, or none (normal) with a warning.
std::optional<double> chooseDof(RiskReport &report, const char *modelName)
{
    const auto &dof = report.assumptions.dof;
    if (dof.kind == DegreesOfFreedom::Kind::Given)
        return dof.value;
    auto shape = pnlShape(report, modelName);
    if (!shape)
        return std::nullopt;
    report.model.shape = shape;
    const auto nu = fitDofByKurtosis(shape->excessKurtosis);
    if (!nu) {
        report.warnings.push_back("the window's daily P&L has an excess kurtosis of " + std::to_string(shape->excessKurtosis)
                                  + " (not above zero), so no Student-t fits it by moments: the " + modelName
                                  + " model uses the normal instead");
        return std::nullopt;
    }
    report.model.dofFitted = true;
    return nu;
}

Error needsHistory(RiskModel model)
{
    return fieldError(ErrorKind::Assumption, "model",
                      "the " + std::string(toName(model)) + " model needs a price history (daily P&L), which the "
                      "single-position mode does not have");
}

// The inputs every allocation shares: Σe, σ_p (daily) and the holdings' own daily sd.
struct AllocationInputs {
    Eigen::VectorXd sigmaE;
    double sigmaP = 0.0;
    Eigen::VectorXd sd;
};

AllocationInputs allocationInputs(const RiskReport &report)
{
    AllocationInputs in;
    in.sigmaE = report.moments.covariance * report.exposures;
    in.sigmaP = report.oneDay.sd;
    in.sd = report.moments.covariance.diagonal().cwiseMax(0.0).cwiseSqrt();
    return in;
}

// The multi-day convention of the Student-t and Cornish–Fisher figures (multidayscaling.h).
MultiDayScaling scalingOf(const Assumptions &a) { return a.scaling; }

// ν for the horizon under the scaling convention (multidayscaling.h), with a warning when it
// cannot be aggregated.
double horizonDof(RiskReport &report, double nu)
{
    const auto &a = report.assumptions;
    if (scalingOf(a) != MultiDayScaling::Aggregate || a.horizonDays == 1)
        return nu;
    if (!(nu > 4.0)) {
        char shown[32];
        std::snprintf(shown, sizeof shown, "%.6g", nu);
        report.warnings.push_back(std::string("the Student-t with ") + shown
                                  + " degrees of freedom (4 or fewer) has no finite kurtosis, so the "
                                  + std::to_string(a.horizonDays) + "-day sum's degrees of freedom cannot be found from it: "
                                  "aggregate scaling keeps " + shown + ", as for one day");
    }
    return aggregateDof(nu, a.horizonDays);
}

// Replaces the normal figures of `report` with those of the chosen model, and allocates them to
// the holdings under the same model (allocation.h).
Status applyModel(RiskReport &report, const RunControl &control)
{
    const auto &a = report.assumptions;
    report.model = ModelDetails{};
    const bool haveHistory = report.windowReturnsMatrix.rows() > 0;
    const AllocationInputs in = allocationInputs(report);
    const Eigen::VectorXd &e = report.exposures;
    const Eigen::VectorXd &mean = report.moments.mean;
    auto normalAllocation = [&] {
        return ellipticalAllocation(e, in.sigmaE, in.sigmaP, in.sd, mean, a.horizonDays, normalQuantile(a.confidence),
                                    normalTailMeanFactor(a.confidence));
    };
    switch (a.model) {
    case RiskModel::Normal:
        break;
    case RiskModel::StudentT: {
        if (!haveHistory && a.dof.kind != DegreesOfFreedom::Kind::Given)
            return needsHistory(a.model);
        const auto nu = chooseDof(report, "student-t");
        if (!nu)
            break;
        report.model.used = RiskModel::StudentT;
        report.model.dof = nu;
        const double nuH = horizonDof(report, *nu);
        report.model.horizonDof = nuH;
        report.figures = studentTVarEs(report.horizon, nuH, a.confidence);
        Allocation c = ellipticalAllocation(e, in.sigmaE, in.sigmaP, in.sd, mean, a.horizonDays,
                                            studentTVarFactor(nuH, a.confidence), studentTEsFactor(nuH, a.confidence));
        storeAllocation(report, c);
        return Done{};
    }
    case RiskModel::CornishFisher: {
        if (!haveHistory)
            return needsHistory(a.model);
        const auto shape = pnlShape(report, "cornish-fisher");
        if (!shape)
            break;
        report.model.used = RiskModel::CornishFisher;
        report.model.shape = shape;
        const Shape used = scaledShape(*shape, a.horizonDays, scalingOf(a));
        report.model.horizonShape = used;
        const CornishFisherFactors f = cornishFisherFactors(a.confidence, used);
        report.model.cornishFisherMonotone = f.monotone;
        report.figures = VarEs{f.var * report.horizon.sd - report.horizon.mean, f.es * report.horizon.sd - report.horizon.mean};
        if (!f.monotone)
            report.warnings.push_back("the Cornish-Fisher expansion is not monotone for skewness " + std::to_string(used.skewness)
                                      + " and excess kurtosis " + std::to_string(used.excessKurtosis)
                                      + ": it is no longer a quantile function, and its VaR and ES are unreliable");
        Allocation c = cornishFisherAllocation(e, in.sigmaE, in.sigmaP, in.sd, mean, report.windowReturnsMatrix,
                                               a.horizonDays, a.confidence, scalingOf(a));
        storeAllocation(report, c);
        return Done{};
    }
    case RiskModel::Historical: {
        if (!haveHistory)
            return needsHistory(a.model);
        const Eigen::VectorXd pnl = dailyPnl(report.windowReturnsMatrix, report.exposures);
        auto hs = historicalVarEs(pnl, a.horizonDays, a.confidence, a.historicalHorizon);
        if (!hs)
            return hs.error();
        report.model.used = RiskModel::Historical;
        report.model.scenarios = hs.value().scenarios;
        appendWarnings(report, hs.value().warnings);
        // The figures from the scenario matrix, so that the components add up to them exactly.
        const bool overlapping = a.historicalHorizon == HistoricalHorizon::Overlapping && a.horizonDays > 1;
        const Eigen::MatrixXd scenarios = historicalScenarioPnl(report.windowReturnsMatrix, e, a.horizonDays,
                                                                a.historicalHorizon);
        Allocation c = scenarioAllocation(scenarios, a.confidence,
                                          overlapping ? 1.0 : std::sqrt(static_cast<double>(a.horizonDays)));
        finishAllocation(c, e);
        report.figures = c.total;
        storeAllocation(report, c);
        return Done{};
    }
    case RiskModel::MonteCarlo: {
        SimulationSettings settings{a.simulations, a.seed, std::nullopt, true};
        if (a.dof.kind != DegreesOfFreedom::Kind::Unset) {
            if (!haveHistory && a.dof.kind == DegreesOfFreedom::Kind::Fit)
                return needsHistory(a.model);
            settings.dof = chooseDof(report, "monte-carlo");
            report.model.dof = settings.dof;
        }
        const auto started = Clock::now();
        auto mc = simulateVarEs(report.exposures, report.moments.covariance, report.moments.mean, a.horizonDays,
                                a.confidence, settings, control);
        if (control.timings)
            control.timings->simulateMs = msBetween(started, Clock::now());
        if (!mc)
            return mc.error();
        report.model.used = RiskModel::MonteCarlo;
        report.model.simulations = mc.value().simulations;
        report.model.seed = a.seed;
        report.model.varStandardError = mc.value().varStandardError;
        report.model.esStandardError = mc.value().esStandardError;
        report.model.standardErrorMethod = mc.value().standardErrorMethod;
        report.figures = mc.value().figures;
        appendWarnings(report, mc.value().warnings);
        storeAllocation(report, *mc.value().allocation);
        return Done{};
    }
    }
    // Normal, or a fallback to it.
    storeAllocation(report, normalAllocation());
    return Done{};
}

} // namespace

Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions)
{
    return computeRisk(prices, holdings, assumptions, RunControl{});
}

Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions,
                               const RunControl &control)
{
    EstimateCache oneOff;
    return computeRisk(prices, holdings, assumptions, control, oneOff, 0);
}

namespace {

// Each holding's column in the price history (checkHoldings has made sure there is one), by one
// hash map instead of a scan of the assets per holding: a large book is priced on every edit.
std::vector<Eigen::Index> heldColumns(const PriceHistory &prices, const Holdings &holdings)
{
    std::unordered_map<std::string_view, Eigen::Index> column;
    column.reserve(prices.assets.size());
    for (std::size_t a = 0; a < prices.assets.size(); ++a)
        column.emplace(prices.assets[a], static_cast<Eigen::Index>(a)); // the first of a name, as assetIndex
    std::vector<Eigen::Index> out;
    out.reserve(holdings.size());
    for (const auto &h : holdings)
        out.push_back(column.at(h.asset));
    return out;
}

// The window of the held assets' returns and its moments: from the cache when the key matches.
Result<const EstimateEntry *> heldEstimate(const PriceHistory &prices, const Holdings &holdings,
                                           const std::vector<Eigen::Index> &columns, const Assumptions &assumptions,
                                           EstimateCache &cache, std::uint64_t pricesRevision)
{
    EstimateKey key{pricesRevision, {}, assumptions.returns, assumptions.window,
                    assumptions.estimator, assumptions.lambda, assumptions.mean};
    key.assets.reserve(holdings.size());
    for (const auto &h : holdings)
        key.assets.push_back(h.asset);
    if (const EstimateEntry *hit = cache.find(key))
        return hit;
    auto window = selectWindow(prices, assumptions.returns, assumptions.window);
    if (!window)
        return window.error();
    // Only the held assets enter the estimate, in holdings order.
    const Eigen::Index n = static_cast<Eigen::Index>(holdings.size());
    // A covariance over more holdings than a gigabyte holds (N² doubles), from fewer returns than
    // holdings (singular, so no figure could rest on it): refused before any N × N work.
    constexpr Eigen::Index maxSingularCovariance = 11585; // 11585² × 8 bytes ≈ 1 GiB
    const Eigen::Index returnsInWindow = window.value().returns.rows();
    if (n > maxSingularCovariance && returnsInWindow <= n)
        return fieldError(ErrorKind::InsufficientData, "holdings",
                          std::to_string(n) + " holdings with only " + std::to_string(returnsInWindow)
                              + " daily returns in the window: their covariance cannot be estimated (it needs more "
                                "returns than holdings) and would not fit in memory; give a longer price history or "
                                "fewer holdings");
    EstimateEntry entry;
    entry.heldReturns.resize(window.value().returns.rows(), n);
    for (Eigen::Index i = 0; i < n; ++i)
        entry.heldReturns.col(i) = window.value().returns.col(columns[static_cast<std::size_t>(i)]);
    entry.windowFirst = window.value().firstDate;
    entry.windowLast = window.value().lastDate;
    entry.moments = estimateMoments(entry.heldReturns, assumptions.estimator, assumptions.lambda, assumptions.mean);
    cache.store(std::move(key), std::move(entry));
    return cache.find(cache.lastKey());
}

} // namespace

static Result<RiskReport> computeRiskUnguarded(const PriceHistory &prices, const Holdings &holdings,
                                               const Assumptions &assumptions, const RunControl &control,
                                               EstimateCache &cache, std::uint64_t pricesRevision);

Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions,
                               const RunControl &control, EstimateCache &cache, std::uint64_t pricesRevision)
{
    return catchLibraryErrors([&] { return computeRiskUnguarded(prices, holdings, assumptions, control, cache, pricesRevision); });
}

static Result<RiskReport> computeRiskUnguarded(const PriceHistory &prices, const Holdings &holdings,
                                               const Assumptions &assumptions, const RunControl &control,
                                               EstimateCache &cache, std::uint64_t pricesRevision)
{
    if (auto ok = validate(assumptions); !ok)
        return ok.error();
    if (holdings.empty())
        return fieldError(ErrorKind::InsufficientData, "holdings", "the portfolio has no holdings");
    if (auto ok = checkHoldings(holdings, prices); !ok)
        return ok.error();
    const auto started = Clock::now();
    if (control.timings)
        *control.timings = StageTimings{};
    const std::vector<Eigen::Index> columns = heldColumns(prices, holdings);
    auto estimate = heldEstimate(prices, holdings, columns, assumptions, cache, pricesRevision);
    if (!estimate)
        return estimate.error();
    const auto estimated = Clock::now();
    const EstimateEntry &entry = *estimate.value();

    const Eigen::Index n = static_cast<Eigen::Index>(holdings.size());
    Eigen::VectorXd exposures(n);
    RiskReport report;
    report.assumptions = assumptions;
    report.holdings.resize(holdings.size());
    for (Eigen::Index i = 0; i < n; ++i) {
        const auto &h = holdings[static_cast<std::size_t>(i)];
        // holdingExposure and holdingPrice (holdings.h), with the column already found.
        const double price = h.priceOverride ? *h.priceOverride
                                             : prices.prices(prices.prices.rows() - 1, columns[static_cast<std::size_t>(i)]);
        exposures(i) = h.value ? *h.value : h.quantity * price;
        auto &hr = report.holdings[static_cast<std::size_t>(i)];
        hr.asset = h.asset;
        hr.price = h.value ? 0.0 : price;
        hr.quantity = h.value ? 0.0 : h.quantity;
    }
    if (auto ok = requireFiniteInputs(entry.heldReturns, exposures, holdings, prices.sourceName); !ok)
        return ok.error();
    report.windowReturns = static_cast<int>(entry.heldReturns.rows());
    report.windowFirst = entry.windowFirst;
    report.windowLast = entry.windowLast;
    report.warnings = prices.warnings;
    if (entry.heldReturns.rows() <= n)
        report.warnings.push_back("the window has " + std::to_string(entry.heldReturns.rows()) + " returns for " + std::to_string(n)
                                  + " holdings: the covariance is singular and the figures rest on too little data");
    report.moments = entry.moments;
    report.warnings.insert(report.warnings.end(), report.moments.warnings.begin(), report.moments.warnings.end());
    fillFigures(report, exposures, report.moments.covariance, report.moments.mean);
    report.windowReturnsMatrix = entry.heldReturns;
    if (auto ok = applyModel(report, control); !ok)
        return ok.error();
    finishFigures(report);
    if (auto ok = requireFiniteReport(report); !ok)
        return ok.error();
    if (control.timings) {
        control.timings->estimateMs = msBetween(started, estimated);
        control.timings->riskMs = msBetween(estimated, Clock::now()) - control.timings->simulateMs;
    }
    return report;
}

Result<RiskReport> computeSinglePositionRisk(const SinglePosition &position, const Assumptions &assumptions)
{
    return computeSinglePositionRisk(position, assumptions, RunControl{});
}

static Result<RiskReport> singlePositionUnguarded(const SinglePosition &position, const Assumptions &assumptions,
                                                  const RunControl &control);

Result<RiskReport> computeSinglePositionRisk(const SinglePosition &position, const Assumptions &assumptions,
                                             const RunControl &control)
{
    return catchLibraryErrors([&] { return singlePositionUnguarded(position, assumptions, control); });
}

static Result<RiskReport> singlePositionUnguarded(const SinglePosition &position, const Assumptions &assumptions,
                                                  const RunControl &control)
{
    if (auto ok = validate(assumptions); !ok)
        return ok.error();
    // Express the position as one asset with daily moments S/√N and M/N, so that the general
    // path gives σ_h = S√(H/N)·|V| and μ_h = M·H/N·V (parametric.h).
    const auto started = Clock::now();
    if (control.timings)
        *control.timings = StageTimings{};
    auto moments = singlePositionMoments(position, 1, assumptions.daysPerYear);
    if (!moments)
        return moments.error();
    RiskReport report;
    report.assumptions = assumptions;
    report.holdings.resize(1);
    report.holdings[0].asset = "position";
    const double n = static_cast<double>(assumptions.daysPerYear);
    Eigen::MatrixXd cov(1, 1);
    cov(0, 0) = position.annualVolatility * position.annualVolatility / n;
    Eigen::VectorXd mean(1);
    mean(0) = position.annualDrift / n;
    Eigen::VectorXd e(1);
    e(0) = position.value;
    report.moments.covariance = cov;
    report.moments.mean = mean;
    fillFigures(report, e, cov, mean);
    if (auto ok = applyModel(report, control); !ok)
        return ok.error();
    finishFigures(report);
    if (auto ok = requireFiniteReport(report); !ok)
        return ok.error();
    if (control.timings) // no estimate: the moments are given
        control.timings->riskMs = msBetween(started, Clock::now()) - control.timings->simulateMs;
    return report;
}

} // namespace tailwise

#include "tailwise/risk.h"

#include "tailwise/estimate.h"
#include "tailwise/returns.h"

#include <cmath>

namespace tailwise {

namespace {

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
    if (report.portfolioValue != 0.0) {
        report.varFraction = report.figures.var / report.portfolioValue;
        report.esFraction = report.figures.es / report.portfolioValue;
    } else {
        report.warnings.push_back("the portfolio's net value is zero: VaR and ES cannot be given as a share of it");
    }
    if (report.oneDay.sd == 0.0)
        report.warnings.push_back("the portfolio's P&L has zero variance over the window: VaR reflects the mean only");

    const Contributions c = normalContributions(exposures, cov, mean, a.horizonDays, a.confidence);
    report.undiversifiedVar = c.undiversifiedVar;
    report.diversificationBenefit = c.diversificationBenefit;
    for (std::size_t i = 0; i < report.holdings.size(); ++i) {
        auto &hr = report.holdings[i];
        const auto k = static_cast<Eigen::Index>(i);
        hr.exposure = exposures(k);
        if (report.portfolioValue != 0.0)
            hr.weight = exposures(k) / report.portfolioValue;
        hr.dailyVolatility = std::sqrt(std::max(0.0, cov(k, k)));
        hr.marginalVar = c.marginalVar(k);
        hr.componentVar = c.componentVar(k);
        if (report.figures.var != 0.0)
            hr.componentShare = c.componentVar(k) / report.figures.var;
        hr.componentEs = c.componentEs(k);
        hr.standaloneVar = c.standaloneVar(k);
        hr.standaloneEs = c.standaloneEs(k);
    }
    if (report.figures.var <= 0.0)
        report.warnings.push_back("the expected gain over the horizon exceeds the loss quantile: VaR is zero or negative "
                                  "(no loss is expected at this confidence)");
}

} // namespace

Result<RiskReport> computeRisk(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions)
{
    if (auto ok = validate(assumptions); !ok)
        return ok.error();
    if (holdings.empty())
        return fieldError(ErrorKind::InsufficientData, "holdings", "the portfolio has no holdings");
    if (auto ok = checkHoldings(holdings, prices); !ok)
        return ok.error();
    auto window = selectWindow(prices, assumptions.returns, assumptions.window);
    if (!window)
        return window.error();

    // Only the held assets enter the estimate, in holdings order.
    const Eigen::Index n = static_cast<Eigen::Index>(holdings.size());
    Eigen::MatrixXd held(window.value().returns.rows(), n);
    Eigen::VectorXd exposures(n);
    RiskReport report;
    report.assumptions = assumptions;
    report.holdings.resize(holdings.size());
    for (Eigen::Index i = 0; i < n; ++i) {
        const auto &h = holdings[static_cast<std::size_t>(i)];
        held.col(i) = window.value().returns.col(prices.assetIndex(h.asset));
        exposures(i) = holdingExposure(h, prices);
        auto &hr = report.holdings[static_cast<std::size_t>(i)];
        hr.asset = h.asset;
        hr.price = h.value ? 0.0 : holdingPrice(h, prices);
        hr.quantity = h.value ? 0.0 : h.quantity;
    }
    report.windowReturns = static_cast<int>(held.rows());
    report.windowFirst = window.value().firstDate;
    report.windowLast = window.value().lastDate;
    report.warnings = prices.warnings;
    if (held.rows() <= n)
        report.warnings.push_back("the window has " + std::to_string(held.rows()) + " returns for " + std::to_string(n)
                                  + " holdings: the covariance is singular and the figures rest on too little data");
    report.moments = estimateMoments(held, assumptions.estimator, assumptions.lambda, assumptions.mean);
    report.warnings.insert(report.warnings.end(), report.moments.warnings.begin(), report.moments.warnings.end());
    fillFigures(report, exposures, report.moments.covariance, report.moments.mean);
    report.windowReturnsMatrix = std::move(held);
    return report;
}

Result<RiskReport> computeSinglePositionRisk(const SinglePosition &position, const Assumptions &assumptions)
{
    if (auto ok = validate(assumptions); !ok)
        return ok.error();
    // Express the position as one asset with daily moments S/√N and M/N, so that the general
    // path gives σ_h = S√(H/N)·|V| and μ_h = M·H/N·V (parametric.h).
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
    return report;
}

} // namespace tailwise

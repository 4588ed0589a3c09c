#include "tailwise/whatif.h"

#include <algorithm>
#include <cmath>

namespace tailwise {

namespace {

int findHolding(const Holdings &holdings, const std::string &asset)
{
    for (std::size_t i = 0; i < holdings.size(); ++i)
        if (holdings[i].asset == asset)
            return static_cast<int>(i);
    return -1;
}

// Holdings given directly by money exposure, for evaluating VaR at arbitrary exposures.
Holdings byValue(const RiskReport &report, const Eigen::VectorXd &exposures)
{
    Holdings out(report.holdings.size());
    for (std::size_t i = 0; i < out.size(); ++i) {
        out[i].asset = report.holdings[i].asset;
        out[i].value = exposures(static_cast<Eigen::Index>(i));
    }
    return out;
}

// The k-th of `runs` computations reports into its own share of the caller's progress bar, so
// the whole what-if stays non-decreasing.
RunControl stage(const RunControl &control, int k, int runs)
{
    RunControl part = control;
    if (control.progress)
        part.progress = [&control, k, runs](double f) { control.progress((k + f) / runs); };
    return part;
}

} // namespace

Result<Holdings> applyTrades(const Holdings &holdings, std::span<const Trade> trades, const PriceHistory &prices)
{
    Holdings out = holdings;
    for (std::size_t t = 0; t < trades.size(); ++t) {
        const Trade &trade = trades[t];
        const std::string where = "trade " + std::to_string(t + 1) + " (" + trade.asset + ")";
        if (!std::isfinite(trade.change))
            return fieldError(ErrorKind::Value, "trade", where + ": expected a finite change in quantity");
        if (prices.assetIndex(trade.asset) < 0)
            return fieldError(ErrorKind::Reference, "trade",
                              where + ": the price history has no asset named \"" + trade.asset + "\"");
        const int i = findHolding(out, trade.asset);
        if (i < 0) {
            Holding h;
            h.asset = trade.asset;
            h.quantity = trade.change;
            out.push_back(h);
        } else if (out[static_cast<std::size_t>(i)].value) {
            *out[static_cast<std::size_t>(i)].value += trade.change;
        } else {
            out[static_cast<std::size_t>(i)].quantity += trade.change;
        }
    }
    return out;
}

WhatIfFigures whatIfFigures(double varBefore, double varAfter, const Eigen::VectorXd &marginalVar,
                            const Eigen::VectorXd &exposureChange)
{
    WhatIfFigures f;
    f.varBefore = varBefore;
    f.varAfter = varAfter;
    f.incrementalVar = varAfter - varBefore;
    f.marginalEstimate = marginalVar.dot(exposureChange);
    f.estimateGap = f.incrementalVar - f.marginalEstimate;
    return f;
}

Result<WhatIf> whatIf(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions,
                      std::span<const Trade> trades, const RunControl &control)
{
    auto after = applyTrades(holdings, trades, prices);
    if (!after)
        return after.error();
    // Before, on the same asset list as after: new assets at zero quantity.
    Holdings before = holdings;
    for (std::size_t i = holdings.size(); i < after.value().size(); ++i) {
        Holding h = after.value()[i];
        h.quantity = 0.0;
        before.push_back(h);
    }
    WhatIf out;
    out.holdingsAfter = after.value();
    const int runs = assumptions.model == RiskModel::Normal ? 2 : 4;
    auto beforeReport = computeRisk(prices, before, assumptions, stage(control, 0, runs));
    if (!beforeReport)
        return beforeReport.error();
    auto afterReport = computeRisk(prices, after.value(), assumptions, stage(control, 1, runs));
    if (!afterReport)
        return afterReport.error();
    out.before = std::move(beforeReport).value();
    out.after = std::move(afterReport).value();
    out.exposureChange = out.after.exposures - out.before.exposures;
    for (std::size_t i = 0; i < holdings.size(); ++i)
        if (holdings[i].value && std::any_of(trades.begin(), trades.end(), [&](const Trade &t) { return t.asset == holdings[i].asset; }))
            out.warnings.push_back("the holding " + holdings[i].asset
                                   + " is given by value, so its trade changes the value in money, not a quantity");

    Eigen::VectorXd gradient(out.before.exposures.size());
    if (assumptions.model == RiskModel::Normal) {
        for (std::size_t i = 0; i < out.before.holdings.size(); ++i)
            gradient(static_cast<Eigen::Index>(i)) = out.before.holdings[i].marginalVar;
        out.marginalMethod = "normal marginal VaR (Euler gradient) times the change in exposure";
    } else {
        constexpr double eps = 1e-4;
        const Eigen::VectorXd &e = out.before.exposures;
        auto up = computeRisk(prices, byValue(out.before, e + eps * out.exposureChange), assumptions, stage(control, 2, runs));
        if (!up)
            return up.error();
        auto down = computeRisk(prices, byValue(out.before, e - eps * out.exposureChange), assumptions,
                                stage(control, 3, runs));
        if (!down)
            return down.error();
        // The directional derivative is all the estimate needs: put it on the direction itself.
        const double derivative = (up.value().figures.var - down.value().figures.var) / (2.0 * eps);
        const double norm2 = out.exposureChange.squaredNorm();
        gradient = norm2 > 0.0 ? Eigen::VectorXd(out.exposureChange * (derivative / norm2))
                               : Eigen::VectorXd::Zero(e.size());
        out.marginalMethod = std::string("central difference of the ") + std::string(toName(assumptions.model))
                             + " VaR along the trade (step 1e-4 of the trade)";
    }
    out.figures = whatIfFigures(out.before.figures.var, out.after.figures.var, gradient, out.exposureChange);
    if (control.progress)
        control.progress(1.0);
    return out;
}

} // namespace tailwise

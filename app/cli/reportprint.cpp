#include "reportprint.h"

#include <cmath>
#include <cstdio>

#include "gridprint.h"
#include "modelprint.h"
#include "numbertext.h"

#include "tailwise/json.h"

#include <algorithm>
#include <cstdio>

namespace tailwise::cli {

namespace {

std::string pad(const std::string &s, std::size_t width, bool right)
{
    // Width in characters; the report is ASCII apart from asset names.
    if (s.size() >= width)
        return s;
    const std::string fill(width - s.size(), ' ');
    return right ? fill + s : s + fill;
}

std::string horizonWords(int days)
{
    return std::to_string(days) + (days == 1 ? " trading day" : " trading days");
}

std::string confidenceText(double c)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10g%%", c * 100.0);
    return buffer;
}

std::string methodWords(const RiskReport &r)
{
    const auto &a = r.assumptions;
    std::string s = std::string(toName(a.model)) + " model, ";
    s += a.estimator == CovarianceEstimator::Ewma ? "EWMA covariance (lambda " + fixed(a.lambda, 4) + ")" : "sample covariance";
    s += a.mean == MeanModel::Zero ? ", zero mean, " : ", estimated mean, ";
    s += std::string(toName(a.returns)) + " returns";
    return s;
}

std::string modelName(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal: return "normal";
    case RiskModel::StudentT: return "Student-t";
    case RiskModel::CornishFisher: return "Cornish-Fisher";
    case RiskModel::Historical: return "historical";
    case RiskModel::MonteCarlo: return "Monte Carlo";
    }
    return "normal";
}

std::string contributionMethodWords(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal:
    case RiskModel::StudentT: return "Euler allocation";
    case RiskModel::CornishFisher: return "Euler allocation with the skewness and kurtosis derivatives";
    case RiskModel::Historical: return "kernel estimate at the VaR, tail means for ES";
    case RiskModel::MonteCarlo: return "kernel estimate at the VaR over the draws, tail means for ES";
    }
    return "Euler allocation";
}

std::string onceInWords(double confidence)
{
    const double n = std::round(1.0 / (1.0 - confidence));
    char buffer[64];
    std::snprintf(buffer, sizeof buffer, "%.0f", n);
    return "once in " + std::string(buffer) + " horizons at " + confidenceText(confidence);
}

} // namespace

std::string reportText(const RiskReport &r, bool single, const ReportExtras &extras,
                       const std::optional<RunTimings> &timings)
{
    const auto &a = r.assumptions;
    // The currency beside each money figure of the summary, when the workbook states one.
    const std::string unit = extras.currency.empty() ? std::string() : " " + extras.currency;
    std::string out;
    out += "Tailwise - Value-at-Risk and Expected Shortfall\n\n";
    out += "Portfolio value     " + money(r.portfolioValue) + unit + "\n";
    if (!extras.currency.empty())
        out += "Currency            " + extras.currency + " (every money figure; only a label, nothing is converted)\n";
    out += "Confidence          " + confidenceText(a.confidence) + "\n";
    out += "Horizon             " + horizonWords(a.horizonDays) + "\n";
    if (single) {
        out += "Position            annual volatility and drift given directly, "
               + std::to_string(a.daysPerYear) + " trading days a year\n";
    } else {
        out += "Data window         " + std::to_string(r.windowReturns) + " daily returns, " + toIso(r.windowFirst)
               + " to " + toIso(r.windowLast) + "\n";
        out += "Method              " + methodWords(r) + "\n";
    }
    out += modelText(r);
    out += "\n";
    out += "Value-at-Risk       " + pad(money(r.figures.var), 16, true) + unit + "   " + percent(r.varFraction) + " of value\n";
    out += "Expected Shortfall  " + pad(money(r.figures.es), 16, true) + unit + "   " + percent(r.esFraction) + " of value\n";
    out += "Horizon mean P&L    " + pad(money(r.horizon.mean), 16, true) + unit + "\n";
    out += "Horizon P&L s.d.    " + pad(money(r.horizon.sd), 16, true) + unit + "\n";
    if (!single) {
        out += "Undiversified VaR   " + pad(money(r.undiversifiedVar), 16, true) + unit + "   (sum of the holdings' own VaR)\n";
        out += "Diversification     " + pad(money(r.diversificationBenefit), 16, true) + unit
               + "   (undiversified minus portfolio VaR, both " + modelName(r.model.used) + ")\n";
        if (r.diversificationBenefit < 0.0)
            out += "                    negative: under this model VaR is not subadditive here - the portfolio's VaR\n"
                   "                    is larger than the sum of the holdings' own VaRs\n";
    }
    out += limitsText(extras.limits, extras.currency);
    out += "\nIn words: over " + horizonWords(a.horizonDays) + ", the loss is not expected to exceed "
           + money(r.figures.var) + unit + " with " + confidenceText(a.confidence)
           + " confidence; in the worst " + confidenceText(1.0 - a.confidence) + " of cases the average loss is "
           + money(r.figures.es) + unit + ".\n";

    if (!single && !r.holdings.empty()) {
        out += "\nContributions under the " + modelName(r.model.contributions) + " model ("
               + contributionMethodWords(r.model.contributions) + "; the components add up to the portfolio VaR)\n";
        std::size_t nameWidth = 5;
        for (const auto &h : r.holdings)
            nameWidth = std::max(nameWidth, h.asset.size());
        nameWidth = std::min<std::size_t>(nameWidth, 24);
        out += pad("asset", nameWidth, false) + pad("exposure", 17, true) + pad("weight", 10, true)
               + pad("marginal VaR", 14, true) + pad("component VaR", 16, true) + pad("share", 10, true)
               + pad("own VaR", 16, true) + "\n";
        std::vector<const HoldingRisk *> sorted;
        for (const auto &h : r.holdings)
            sorted.push_back(&h);
        std::stable_sort(sorted.begin(), sorted.end(),
                         [](const HoldingRisk *x, const HoldingRisk *y) { return x->componentVar > y->componentVar; });
        for (const HoldingRisk *h : sorted) {
            out += pad(h->asset.substr(0, nameWidth), nameWidth, false) + pad(money(h->exposure), 17, true)
                   + pad(percent(h->weight, 1), 10, true) + pad(fixed(h->marginalVar, 5), 14, true)
                   + pad(money(h->componentVar), 16, true) + pad(percent(h->componentShare, 1), 10, true)
                   + pad(money(h->standaloneVar), 16, true) + "\n";
        }
    }
    if (extras.grid)
        out += gridText(r, *extras.grid);
    out += extrasText(extras);
    if (extras.stamp)
        out += stampText(*extras.stamp);
    if (!r.warnings.empty()) {
        out += "\nWarnings\n";
        for (const auto &w : r.warnings)
            out += "  - " + w + "\n";
    }
    out += "\nCautions: VaR is not the worst case - losses beyond it happen, about " + onceInWords(a.confidence)
           + " if the model holds. " + modelCaution(r.model.used)
           + " Figures are estimates from past data under the model's assumptions, for information only and not "
           "advice; regulatory use follows local rules and approved models.\n";
    if (timings) {
        out += "\nTimings (ms): load " + fixed(timings->loadMs, 1) + ", estimate " + fixed(timings->stages.estimateMs, 1)
               + ", risk " + fixed(timings->stages.riskMs, 1);
        if (timings->simulated)
            out += ", simulate " + fixed(timings->stages.simulateMs, 1);
        out += "\n";
    }
    return out;
}

std::string reportJson(const RiskReport &r, bool single, const ReportExtras &extras,
                       const std::optional<RunTimings> &timings, int indent)
{
    const auto &a = r.assumptions;
    JsonWriter j(indent);
    j.beginObject();
    if (extras.workbook)
        j.key("workbook").value(*extras.workbook);
    if (extras.stamp)
        writeStampJson(j, *extras.stamp);
    if (!extras.currency.empty()) // the workbook's currency code; absent when it states none
        j.key("currency").value(extras.currency);
    j.key("portfolio_value").value(r.portfolioValue);
    j.key("confidence").value(a.confidence);
    j.key("horizon_days").value(a.horizonDays);
    j.key("model").value(toName(a.model));
    writeModelJson(j, r);
    j.key("horizon_mean_money").value(r.horizon.mean);
    j.key("horizon_sd_money").value(r.horizon.sd);
    j.key("var").value(r.figures.var);
    j.key("var_fraction").value(r.varFraction);
    j.key("es").value(r.figures.es);
    j.key("es_fraction").value(r.esFraction);
    j.key("undiversified_var").value(r.undiversifiedVar);
    j.key("diversification_benefit").value(r.diversificationBenefit);
    j.key("assumptions").beginObject();
    j.key("days_per_year").value(a.daysPerYear);
    writeModelAssumptionsJson(j, a);
    if (single) {
        j.key("input").value("single-position");
    } else {
        j.key("input").value("holdings");
        j.key("returns").value(toName(a.returns));
        j.key("estimator").value(toName(a.estimator));
        if (a.estimator == CovarianceEstimator::Ewma)
            j.key("lambda").value(a.lambda);
        j.key("mean").value(toName(a.mean));
        j.key("window_returns").value(r.windowReturns);
        j.key("window_start").value(toIso(r.windowFirst));
        j.key("window_end").value(toIso(r.windowLast));
    }
    j.endObject();
    j.key("contributions").beginArray();
    for (const auto &h : r.holdings) {
        j.beginObject();
        j.key("asset").value(h.asset);
        j.key("exposure").value(h.exposure);
        j.key("weight").value(h.weight);
        j.key("daily_volatility").value(h.dailyVolatility);
        j.key("marginal_var").value(h.marginalVar);
        j.key("component_var").value(h.componentVar);
        j.key("component_share").value(h.componentShare);
        j.key("component_es").value(h.componentEs);
        j.key("standalone_var").value(h.standaloneVar);
        j.key("standalone_es").value(h.standaloneEs);
        j.endObject();
    }
    j.endArray();
    if (extras.grid)
        writeGridJson(j, r, *extras.grid);
    writeExtrasJson(j, extras);
    if (extras.stamp)
        writeLimitsJson(j, extras.limits);
    if (timings) {
        j.key("timings_ms").beginObject();
        j.key("load").value(timings->loadMs);
        j.key("estimate").value(timings->stages.estimateMs);
        j.key("risk").value(timings->stages.riskMs);
        if (timings->simulated)
            j.key("simulate").value(timings->stages.simulateMs);
        j.endObject();
    }
    j.key("warnings").beginArray();
    for (const auto &w : r.warnings)
        j.value(w);
    j.endArray();
    j.endObject();
    return j.text() + "\n";
}

} // namespace tailwise::cli

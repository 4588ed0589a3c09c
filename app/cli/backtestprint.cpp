#include "backtestprint.h"

#include "numbertext.h"

#include "tailwise/json.h"

#include <cstdio>

namespace tailwise::cli {

namespace {

std::string pad(const std::string &s, std::size_t width, bool right)
{
    if (s.size() >= width)
        return s;
    const std::string fill(width - s.size(), ' ');
    return right ? fill + s : s + fill;
}

std::string level(double fraction)
{
    char buffer[32];
    std::snprintf(buffer, sizeof buffer, "%.10g%%", fraction * 100.0);
    return buffer;
}

std::string statistic(double value)
{
    return fixed(value, 4);
}

std::string probability(double p)
{
    char buffer[32];
    if (p >= 0.0001)
        std::snprintf(buffer, sizeof buffer, "%.4f", p);
    else
        std::snprintf(buffer, sizeof buffer, "%.2e", p);
    return buffer;
}


std::string modelWords(const Assumptions &a)
{
    switch (a.model) {
    case RiskModel::StudentT:
        return a.dof.kind == DegreesOfFreedom::Kind::Given
                   ? "Student-t model (" + fixed(a.dof.value, 2) + " degrees of freedom), "
                   : std::string("Student-t model (degrees of freedom fitted to each window's P&L), ");
    case RiskModel::CornishFisher: return "Cornish-Fisher model (skewness and kurtosis of each window's P&L), ";
    case RiskModel::Historical: return "historical model (empirical quantile of each window's P&L), ";
    default: return std::string(toName(a.model)) + " model, ";
    }
}

std::string methodWords(const Assumptions &a)
{
    std::string s = modelWords(a);
    if (a.model != RiskModel::Historical) {
        s += a.estimator == CovarianceEstimator::Ewma ? "EWMA covariance (lambda " + fixed(a.lambda, 4) + ")"
                                                      : std::string("sample covariance");
        s += a.mean == MeanModel::Zero ? ", zero mean, " : ", estimated mean, ";
    }
    s += a.returns == ReturnType::Simple ? "simple returns" : "log returns for the forecast, simple returns for the P&L";
    return s;
}

std::string kupiecVerdict(const BacktestResult &r, const BacktestVerdict &v)
{
    const std::string c = level(r.assumptions.confidence);
    if (!v.kupiecRejected)
        return "not rejected: the number of exceptions is consistent with " + c + " VaR";
    if (v.tooManyExceptions)
        return "rejected: too many exceptions, the model understates the risk";
    return "rejected: too few exceptions, the model overstates the risk";
}

std::string independenceVerdict(const BacktestResult &r, const BacktestVerdict &v)
{
    if (r.christoffersen.transitions.total() == 0)
        return "not informative: no day-to-day transitions";
    if (!v.independenceRejected)
        return "not rejected: no sign that exceptions cluster in time";
    if (v.clustering)
        return "rejected: an exception makes another the next day more likely (clustering)";
    return "rejected: exceptions are spread more evenly than chance would give";
}

std::string coverageVerdict(const BacktestVerdict &v)
{
    if (!v.coverageRejected)
        return "not rejected: rate and timing of exceptions together are consistent";
    return "rejected: rate and timing of exceptions together are not consistent";
}

std::string zoneWords(Zone z)
{
    switch (z) {
    case Zone::Green: return "green (the number of exceptions is within what chance gives a correct model)";
    case Zone::Yellow: return "yellow (more exceptions than usual for a correct model; look closer)";
    case Zone::Red: return "red (so many exceptions that a correct model is very unlikely)";
    }
    return "";
}

std::string dayLine(const BacktestDay &d, bool flag)
{
    return "  " + toIso(d.date) + pad(money(d.pnl), 18, true) + pad(money(d.var), 18, true)
           + (flag && d.exception ? "   exception" : "") + "\n";
}

// Breaks a paragraph into lines of at most `width` characters at spaces.
std::string wrap(const std::string &text, std::size_t width = 100)
{
    std::string out, line;
    std::size_t start = 0;
    while (start < text.size()) {
        std::size_t end = text.find(' ', start);
        if (end == std::string::npos)
            end = text.size();
        const std::string word = text.substr(start, end - start);
        if (!line.empty() && line.size() + 1 + word.size() > width) {
            out += line + "\n";
            line.clear();
        }
        if (!line.empty())
            line += ' ';
        line += word;
        start = end + 1;
    }
    if (!line.empty())
        out += line + "\n";
    return out;
}

} // namespace

std::string backtestText(const BacktestPrintInput &in)
{
    const BacktestResult &r = in.result;
    const Assumptions &a = r.assumptions;
    const std::string c = level(a.confidence);
    std::string out;
    out += "Tailwise - backtest of one-day Value-at-Risk\n\n";
    out += "Prices              " + in.pricesPath + "\n";
    out += "Holdings            " + in.holdingsPath + " (" + std::to_string(in.holdingCount)
           + (in.holdingCount == 1 ? " holding" : " holdings")
           + "; quantities are valued at the previous close, values kept constant)\n";
    out += "Method              " + methodWords(a) + "\n";
    out += "Window              " + std::to_string(r.window) + " daily returns, rolled forward one day at a time\n";
    out += "Confidence          " + c + "\n";
    out += "Days tested         " + std::to_string(r.observations);
    if (!r.days.empty())
        out += " (" + toIso(r.days.front().date) + " to " + toIso(r.days.back().date) + ")";
    out += "\n\n";

    const double rate = r.observations > 0 ? static_cast<double>(r.exceptions) / r.observations : 0.0;
    out += "Exceptions          " + std::to_string(r.exceptions) + " (expected " + fixed(r.expectedExceptions, 2)
           + "; rate " + percent(rate) + " against " + percent(r.tailProbability) + ")\n";
    out += "Zone                " + zoneWords(r.zone.zone) + "\n";
    out += "                    P(this many exceptions or fewer) = " + percent(r.zone.cumulativeProbability, 4)
           + " for a correct model;\n                    green below 95%, yellow below 99.99%, red from there\n\n";

    const auto &ch = r.christoffersen;
    const BacktestVerdict verdict = verdictAt(r, verdictTestSize);
    out += pad("Tests at " + level(verdictTestSize) + " size", 32, false) + pad("statistic", 10, true)
           + pad("p-value", 11, true) + "   verdict\n";
    out += pad("  Kupiec proportion of failures", 32, false) + pad(statistic(r.kupiec.lr), 10, true)
           + pad(probability(r.kupiec.pValue), 11, true) + "   " + kupiecVerdict(r, verdict) + "\n";
    out += pad("  Christoffersen independence", 32, false) + pad(statistic(ch.independence.lr), 10, true)
           + pad(probability(ch.independence.pValue), 11, true) + "   " + independenceVerdict(r, verdict) + "\n";
    out += pad("  Conditional coverage", 32, false) + pad(statistic(ch.conditionalCoverage.lr), 10, true)
           + pad(probability(ch.conditionalCoverage.pValue), 11, true) + "   " + coverageVerdict(verdict) + "\n";
    out += "  Day-to-day transitions n00 " + std::to_string(ch.transitions.n00) + ", n01 " + std::to_string(ch.transitions.n01)
           + ", n10 " + std::to_string(ch.transitions.n10) + ", n11 " + std::to_string(ch.transitions.n11) + "\n\n";

    const bool passed = verdict.passed;
    std::string words = "In words: on " + std::to_string(r.observations) + " days the loss exceeded the " + c + " VaR "
           + std::to_string(r.exceptions) + (r.exceptions == 1 ? " time" : " times") + ", against about "
           + fixed(r.expectedExceptions, 1) + " expected. ";
    words += passed ? "At the " + level(verdictTestSize) + " test size none of the tests rejects the model"
                  : "At the " + level(verdictTestSize) + " test size the model is rejected";
    words += "; the zone is " + std::string(toName(r.zone.zone)) + ".";
    out += wrap(words);

    if (in.series) {
        out += "\nEvery tested day" + pad("P&L", 14, true) + pad("VaR", 18, true) + "\n";
        for (const auto &d : r.days)
            out += dayLine(d, true);
    } else if (r.exceptions > 0) {
        out += "\nExceptions (date, P&L, VaR)\n";
        for (const auto &d : r.days)
            if (d.exception)
                out += dayLine(d, false);
    }
    if (!r.warnings.empty()) {
        out += "\nWarnings\n";
        for (const auto &w : r.warnings)
            out += "  - " + w + "\n";
    }
    out += '\n';
    out += wrap("Cautions: VaR is not the worst case - on a correct model losses exceed it on about "
           + level(r.tailProbability) + " of days, and by how much it does not say. A backtest shows how the model "
           "would have done on this history with these holdings kept fixed, not how it will do. The traffic-light "
           "zones were set for 250 days at 99%; elsewhere they follow the same binomial rule. Tests on few days have "
           "little power. Figures are estimates, for information only and not advice; regulatory use follows local "
           "rules and approved models.");
    return out;
}

std::string backtestJson(const BacktestResult &r, bool series)
{
    JsonWriter j;
    j.beginObject();
    j.key("observations").value(r.observations);
    j.key("exceptions").value(r.exceptions);
    j.key("expected_exceptions").value(r.expectedExceptions);
    j.key("kupiec").beginObject();
    j.key("lr").value(r.kupiec.lr);
    j.key("p_value").value(r.kupiec.pValue);
    j.endObject();
    const auto &ch = r.christoffersen;
    j.key("christoffersen").beginObject();
    j.key("lr_ind").value(ch.independence.lr);
    j.key("p_ind").value(ch.independence.pValue);
    j.key("lr_cc").value(ch.conditionalCoverage.lr);
    j.key("p_cc").value(ch.conditionalCoverage.pValue);
    j.key("transitions").beginArray();
    j.value(ch.transitions.n00).value(ch.transitions.n01).value(ch.transitions.n10).value(ch.transitions.n11);
    j.endArray();
    j.endObject();
    j.key("zone").value(toName(r.zone.zone));
    if (series) {
        j.key("series").beginArray();
        for (const auto &d : r.days) {
            j.beginObject();
            j.key("date").value(toIso(d.date));
            j.key("pnl").value(d.pnl);
            j.key("var").value(d.var);
            j.key("exception").value(d.exception);
            j.endObject();
        }
        j.endArray();
    }
    j.endObject();
    return j.text() + "\n";
}

} // namespace tailwise::cli

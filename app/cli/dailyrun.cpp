#include "dailyrun.h"

#include "numbertext.h"

#include "tailwise/asof.h"
#include "tailwise/inputhash.h"
#include "tailwise/sha256.h"
#include "tailwise/version.h"

#include <algorithm>
#include <cstdio>

namespace tailwise::cli {

std::string dailyHelpText()
{
    return R"(
Daily runs:
  --as-of DATE         compute as of DATE (YYYY-MM-DD): the history ends there (a day without
                       prices takes the last day before it) and holdings are valued at that close
  --limit SPEC         a limit on VaR or ES, repeatable, replacing the workbook's limits:
                       MEASURE=AMOUNT[%][,warn=W%][,group=NAME], MEASURE var or es, AMOUNT money
                       or percent of value (%), the warning level 80% of the limit unless stated.
                       Each limit's use and state (ok, warning, breached) is reported
  --fail-on-breach     exit 3 when a limit is breached
  --record FILE.db     append the run to a history database (see tailwise-cli history --help)
  --xlsx FILE          also write the tables (summary, contributions, limits) to an .xlsx workbook
Every report carries the tool version, the as-of date, the seed (Monte Carlo) and input_sha256, one
SHA-256 of the prices, holdings and assumptions, so a figure can be traced to its inputs.
Exit status 3: a limit breached with --fail-on-breach.
)";
}

Status takeDailyOptions(std::vector<std::string> &args, DailyOptions &options, const std::vector<std::string> &accepted)
{
    std::vector<std::string> rest;
    auto takes = [&](const std::string &name) { return std::find(accepted.begin(), accepted.end(), name) != accepted.end(); };
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &a = args[i];
        if (a == "--fail-on-breach" && takes(a)) {
            options.failOnBreach = true;
            continue;
        }
        const bool withValue = a == "--as-of" || a == "--limit" || a == "--record" || a == "--xlsx";
        if (!withValue || !takes(a)) {
            rest.push_back(a);
            continue;
        }
        if (i + 1 >= args.size())
            return fieldError(ErrorKind::Value, a, "expected a value after " + a);
        const std::string &v = args[++i];
        // --limit repeats by design; the others are single-valued: given twice is refused.
        const bool again = (a == "--as-of" && options.asOf) || (a == "--record" && !options.record.empty())
                           || (a == "--xlsx" && !options.xlsx.empty());
        if (again)
            return fieldError(ErrorKind::Value, a, a + ": given more than once: give it once");
        if (a == "--as-of")
            options.asOf = v;
        else if (a == "--limit")
            options.limits.push_back(v);
        else if (a == "--record")
            options.record = v;
        else
            options.xlsx = v;
    }
    args = std::move(rest);
    return Done{};
}

Result<DailySettings> applyDailyOptions(const DailyOptions &options, const std::vector<Limit> &workbookLimits)
{
    DailySettings s;
    if (options.asOf) {
        auto d = parseAsOfDate(*options.asOf);
        if (!d)
            return fieldError(ErrorKind::Value, "--as-of", d.error().message.substr(std::string("as-of: ").size()));
        s.asOf = d.value();
    }
    if (options.limits.empty()) {
        s.limits = workbookLimits;
    } else {
        for (const auto &text : options.limits) {
            auto l = parseLimit(text, "--limit");
            if (!l)
                return l.error();
            s.limits.push_back(l.value());
        }
    }
    if (const auto checked = checkLimits(s.limits, {}, "--limit"); !checked)
        return checked.error();
    return s;
}

RunStamp makeStamp(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions,
                   const std::optional<Date> &asOf)
{
    RunStamp s;
    s.toolVersion = toolVersion();
    s.asOf = asOf ? toIso(*asOf) : (prices.dates.empty() ? std::string() : toIso(prices.dates.back()));
    if (assumptions.model == RiskModel::MonteCarlo)
        s.seed = assumptions.seed;
    s.inputSha256 = inputSha256(prices, holdings, assumptions);
    return s;
}

void writeStampJson(JsonWriter &j, const RunStamp &stamp)
{
    j.key("tool_version").value(stamp.toolVersion);
    j.key("as_of").value(stamp.asOf);
    if (stamp.seed)
        j.key("seed").value(std::to_string(*stamp.seed)); // a string: a JSON number cannot hold 64 bits
    j.key("input_sha256").value(stamp.inputSha256);
}

void writeLimitsJson(JsonWriter &j, const std::vector<LimitUse> &uses)
{
    j.key("limits").beginArray();
    for (const auto &u : uses) {
        j.beginObject();
        j.key("measure").value(toName(u.limit.measure));
        j.key("group");
        if (u.limit.group.empty())
            j.null();
        else
            j.value(u.limit.group);
        j.key("limit").value(u.limitMoney);
        j.key("warning_level").value(u.limit.warningLevel);
        j.key("value").value(u.value);
        j.key("use").value(u.use);
        j.key("state").value(toName(u.state));
        j.endObject();
    }
    j.endArray();
}

std::string withStampJson(const std::string &json, const RunStamp &stamp)
{
    const std::size_t open = json.find('{');
    if (open == std::string::npos)
        return json;
    JsonWriter j;
    j.beginObject();
    writeStampJson(j, stamp);
    j.endObject();
    const std::string keys = j.text(); // "{\n  \"tool_version\": …\n}"
    const std::size_t first = keys.find('\n'), last = keys.rfind('\n');
    return json.substr(0, open + 1) + keys.substr(first, last - first) + "," + json.substr(open + 1);
}

std::string stampText(const RunStamp &stamp)
{
    std::string out = "\nRun\n";
    out += "  As of             " + stamp.asOf + "\n";
    out += "  Inputs (SHA-256)  " + stamp.inputSha256 + "\n";
    if (stamp.seed)
        out += "  Seed              " + std::to_string(*stamp.seed) + "\n";
    out += "  Tailwise          " + stamp.toolVersion + "\n";
    return out;
}

std::string limitsText(const std::vector<LimitUse> &uses, const std::string &currency)
{
    if (uses.empty())
        return {};
    const std::string unit = currency.empty() ? std::string() : " " + currency;
    std::string out = "\nLimits\n";
    for (const auto &u : uses) {
        std::string measure = u.limit.measure == LimitMeasure::Var ? "VaR" : "ES";
        std::string what = measure + " limit " + money(u.limitMoney) + unit;
        if (u.limit.percentOfValue)
            what += " (" + formatShortest(u.limit.amount) + "% of value)";
        std::string state = u.state == LimitState::Breached ? "BREACHED" : (u.state == LimitState::Warning ? "WARNING" : "ok");
        out += "  " + what + ": " + measure + " " + money(u.value) + unit + " uses " + percent(u.use, 1)
               + " of it (warning at " + percent(u.limit.warningLevel, 0) + ") - " + state + "\n";
    }
    return out;
}

std::optional<double> lastDayPnl(const PriceHistory &prices, const Holdings &holdings)
{
    const int t = prices.dayCount() - 1;
    if (t < 1)
        return std::nullopt;
    double pnl = 0.0;
    for (const auto &h : holdings) {
        const int c = prices.assetIndex(h.asset);
        if (c < 0)
            continue;
        const double before = prices.prices(t - 1, c), now = prices.prices(t, c);
        pnl += h.value ? *h.value * (now / before - 1.0) : h.quantity * (now - before);
    }
    return pnl;
}

store::RunRecord makeRunRecord(const std::string &workbook, const RiskReport &report, const RunStamp &stamp,
                               const PriceHistory &prices, const Holdings &holdings,
                               const std::vector<LimitUse> &limits)
{
    store::RunRecord r;
    r.workbook = workbook;
    r.asOf = stamp.asOf;
    r.inputSha256 = stamp.inputSha256;
    r.pricesSha256 = inputSha256(prices, {}, Assumptions{});
    r.holdingsSha256 = inputSha256(PriceHistory{}, holdings, Assumptions{});
    r.assumptions = canonicalAssumptionsText(report.assumptions);
    r.assumptionsSha256 = sha256Hex(r.assumptions);
    r.toolVersion = stamp.toolVersion;
    r.portfolioValue = report.portfolioValue;
    r.var = report.figures.var;
    r.es = report.figures.es;
    r.realisedPnl = lastDayPnl(prices, holdings);
    for (const auto &h : report.holdings)
        r.components.push_back({"holding", h.asset, h.exposure, h.componentVar, h.componentEs});
    for (const auto &u : limits)
        r.limits.push_back({std::string(toName(u.limit.measure)), u.limit.group, u.limitMoney, u.limit.warningLevel, u.value,
                            u.use, std::string(toName(u.state))});
    return r;
}

Status recordRun(store::HistoryStore &store, const store::RunRecord &record)
{
    auto done = store.record(record);
    if (!done)
        return done.error();
    if (!done.value())
        std::fprintf(stderr, "tailwise-cli: %s: %s as of %s with these inputs is already recorded; not recorded again\n",
                     store.path().c_str(), record.workbook.c_str(), record.asOf.c_str());
    return Done{};
}

} // namespace tailwise::cli

#include "batchcommand.h"

#include "dailyrun.h"
#include "exitstatus.h"
#include "reportprint.h"
#include "varextras.h"
#include "workbookinput.h"

#include "tailwise/asof.h"
#include "tailwise/json.h"
#include "tailwise/risk.h"
#include "tailwise/filewrite.h"
#include "tailwise/xlsx/tableexport.h"

#include <atomic>
#include <algorithm>
#include <charconv>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <thread>

namespace tailwise::cli {

std::string batchHelpText()
{
    return R"(tailwise-cli batch WORKBOOK... | --list FILE [options]

Computes many workbooks (.tailwise), each with its stored assumptions and limits, in parallel, and
reports one line per workbook in the order given. A workbook that cannot be computed is reported
on its line with its message ("error"); the others go on.

Options:
  --list FILE          the workbooks, one path per line (blank lines and lines starting with #
                       are skipped; relative paths are from the current folder)
  --as-of DATE         compute as of DATE (YYYY-MM-DD): each history ends there
  --record FILE.db     append each computed run to the history database
  --out FILE           write the results to FILE instead of standard output: .csv (the headline
                       columns) or .jsonl (one JSON object per line: the `var --json` figures plus
                       "workbook"; "workbook" and "error" for a workbook that failed)
  -j N                 N workbooks at a time (default: the machine's processor count)
  --limit SPEC         a limit for every workbook instead of the workbooks' own, repeatable:
                       MEASURE=AMOUNT[%][,warn=W%][,group=NAME], MEASURE var or es
  --fail-on-breach     exit 3 when a limit is breached
  --help               this text

Exit status: 0 every workbook computed, 1 at least one failed (its line says why), 2 bad usage,
3 a limit breached with --fail-on-breach (and none failed).
)";
}

Result<std::vector<std::string>> readBatchList(const std::string &path)
{
    std::ifstream in(path);
    if (!in)
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, "cannot be read (missing, or not allowed)");
    std::vector<std::string> out;
    std::string line;
    while (std::getline(in, line)) {
        if (!line.empty() && line.back() == '\r')
            line.pop_back();
        const auto first = line.find_first_not_of(" \t");
        if (first == std::string::npos || line[first] == '#')
            continue;
        const auto last = line.find_last_not_of(" \t");
        out.push_back(line.substr(first, last - first + 1));
    }
    return out;
}

namespace {

struct Outcome {
    std::string workbook; // as listed
    std::string error;    // empty: computed
    std::optional<RiskReport> report;
    ReportExtras extras;
    std::optional<store::RunRecord> record;
};

Outcome computeOne(const std::string &path, const DailyOptions &daily, bool wantRecord)
{
    Outcome o;
    o.workbook = path;
    auto loaded = readWorkbookInput(path);
    if (!loaded) {
        o.error = loaded.error().message;
        return o;
    }
    auto &wb = loaded.value();
    auto settings = applyDailyOptions(daily, wb.limits);
    if (!settings) {
        o.error = path + ": " + settings.error().message;
        return o;
    }
    if (settings.value().asOf) {
        auto cut = cutHistoryAt(wb.prices, *settings.value().asOf);
        if (!cut) {
            o.error = path + ": --as-of" + cut.error().message.substr(cut.error().field.size());
            return o;
        }
        wb.prices = std::move(cut).value();
    }
    auto report = computeRisk(wb.prices, wb.holdings, wb.assumptions);
    if (!report) {
        o.error = path + ": " + report.error().message;
        return o;
    }
    const RiskReport &r = report.value();
    auto uses = evaluateLimits(settings.value().limits, {r.figures.var, r.figures.es, r.portfolioValue});
    if (!uses) {
        o.error = path + ": " + uses.error().message;
        return o;
    }
    o.extras.currency = wb.currency.toStdString();
    o.extras.limits = uses.value();
    o.extras.stamp = makeStamp(wb.prices, wb.holdings, wb.assumptions, settings.value().asOf);
    o.extras.workbook = path;
    if (wantRecord) {
        const std::string name = wb.title.isEmpty() ? std::filesystem::path(path).stem().string() : wb.title.toStdString();
        o.record = makeRunRecord(name, r, *o.extras.stamp, wb.prices, wb.holdings, o.extras.limits);
    }
    o.report = std::move(report).value();
    return o;
}

std::string worstState(const std::vector<LimitUse> &uses)
{
    LimitState worst = LimitState::Ok;
    for (const auto &u : uses)
        worst = std::max(worst, u.state);
    return uses.empty() ? std::string() : std::string(toName(worst));
}

xlsx::Table resultsTable(const std::vector<Outcome> &outcomes)
{
    using xlsx::CellKind;
    xlsx::Table t{"Results",
                  {{"workbook", CellKind::Text},
                   {"as_of", CellKind::Date},
                   {"portfolio_value", CellKind::Money},
                   {"var", CellKind::Money},
                   {"var_fraction", CellKind::Percent},
                   {"es", CellKind::Money},
                   {"es_fraction", CellKind::Percent},
                   {"confidence", CellKind::Number},
                   {"horizon_days", CellKind::Integer},
                   {"model", CellKind::Text},
                   {"limits_state", CellKind::Text},
                   {"input_sha256", CellKind::Text},
                   {"error", CellKind::Text}},
                  {}};
    for (const auto &o : outcomes) {
        if (!o.report) {
            t.rows.push_back({o.workbook, {}, {}, {}, {}, {}, {}, {}, {}, {}, {}, {}, o.error});
            continue;
        }
        const RiskReport &r = *o.report;
        auto opt = [](std::optional<double> v) { return v ? xlsx::Cell(*v) : xlsx::Cell(); };
        t.rows.push_back({o.workbook, o.extras.stamp->asOf, r.portfolioValue, r.figures.var, opt(r.varFraction), r.figures.es,
                          opt(r.esFraction), r.assumptions.confidence, static_cast<double>(r.assumptions.horizonDays),
                          std::string(toName(r.model.used)), worstState(o.extras.limits), o.extras.stamp->inputSha256,
                          std::string()});
    }
    return t;
}

std::string resultsJsonl(const std::vector<Outcome> &outcomes)
{
    std::string out;
    for (const auto &o : outcomes) {
        if (o.report) {
            out += reportJson(*o.report, false, o.extras, std::nullopt, 0);
        } else {
            JsonWriter j(0);
            j.beginObject();
            j.key("workbook").value(o.workbook);
            j.key("error").value(o.error);
            j.endObject();
            out += j.text() + "\n";
        }
    }
    return out;
}

} // namespace

int runBatchCommand(const std::vector<std::string> &argsIn)
{
    std::vector<std::string> args = argsIn;
    DailyOptions daily;
    if (const auto taken = takeDailyOptions(args, daily, {"--as-of", "--limit", "--fail-on-breach", "--record"}); !taken)
        return fail(exitUsage, taken.error().message);
    std::vector<std::string> workbooks;
    std::string listPath, outPath;
    unsigned jobs = std::max(1u, std::thread::hardware_concurrency());
    std::vector<std::string> seen; // the single-valued options given so far
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &a = args[i];
        if (a == "--help" || a == "-h") {
            std::fputs(batchHelpText().c_str(), stdout);
            return exitOk;
        }
        if (a == "--list" || a == "--out" || a == "-j" || a == "--jobs") {
            if (i + 1 >= args.size())
                return fail(exitUsage, a + ": expected a value after " + a);
            const std::string &v = args[++i];
            // Each is single-valued: given twice is ambiguous, so refused (never the last one silently).
            const std::string canonical = a == "--jobs" ? "-j" : a;
            if (std::find(seen.begin(), seen.end(), canonical) != seen.end())
                return fail(exitUsage, a + ": given more than once: give it once");
            seen.push_back(canonical);
            if (a == "--list") {
                listPath = v;
            } else if (a == "--out") {
                outPath = v;
            } else {
                unsigned n = 0;
                const auto [end, ec] = std::from_chars(v.data(), v.data() + v.size(), n);
                if (v.empty() || ec != std::errc() || end != v.data() + v.size() || n < 1 || n > 256)
                    return fail(exitUsage, a + ": expected a whole number of workbooks at a time from 1 to 256, found \"" + v + "\"");
                jobs = n;
            }
        } else if (!a.empty() && a[0] == '-') {
            return fail(exitUsage, "batch: unknown option \"" + a + "\" (see tailwise-cli batch --help)");
        } else {
            workbooks.push_back(a);
        }
    }
    if (!listPath.empty() && !workbooks.empty())
        return fail(exitUsage, "batch: give the workbooks or --list FILE, not both");
    if (!listPath.empty()) {
        auto listed = readBatchList(listPath);
        if (!listed)
            return fail(exitBadInput, listed.error().message);
        workbooks = std::move(listed).value();
    }
    if (workbooks.empty())
        return fail(exitUsage, "batch: expected workbooks (tailwise-cli batch A.tailwise B.tailwise, or --list FILE)");
    const bool csv = outPath.size() >= 4 && outPath.compare(outPath.size() - 4, 4, ".csv") == 0;
    const bool jsonl = outPath.size() >= 6 && outPath.compare(outPath.size() - 6, 6, ".jsonl") == 0;
    if (!outPath.empty() && !csv && !jsonl)
        return fail(exitUsage, "--out: expected a file ending in .csv or .jsonl, found \"" + outPath + "\"");
    // The results file must not replace a workbook or the list it came from.
    if (!outPath.empty()) {
        std::vector<std::string> inputs = workbooks;
        inputs.push_back(listPath);
        if (auto ok = checkOutputIsNotAnInput(outPath, inputs); !ok)
            return fail(exitUsage, ok.error().message);
    }
    // Checked once before any work: the options every workbook shares.
    if (const auto checked = applyDailyOptions(daily, {}); !checked)
        return fail(exitUsage, checked.error().message);
    std::optional<store::HistoryStore> store;
    if (!daily.record.empty()) {
        auto opened = store::HistoryStore::open(daily.record);
        if (!opened)
            return fail(exitBadInput, opened.error().message);
        store.emplace(std::move(opened).value());
    }

    std::vector<Outcome> outcomes(workbooks.size());
    std::atomic<std::size_t> next{0};
    auto worker = [&] {
        for (std::size_t i = next++; i < workbooks.size(); i = next++)
            outcomes[i] = computeOne(workbooks[i], daily, store.has_value());
    };
    std::vector<std::thread> threads;
    const unsigned n = std::min<unsigned>(jobs, static_cast<unsigned>(workbooks.size()));
    for (unsigned t = 1; t < n; ++t)
        threads.emplace_back(worker);
    worker();
    for (auto &t : threads)
        t.join();

    if (store) // in input order, one transaction each
        for (auto &o : outcomes)
            if (o.record)
                if (const auto recorded = recordRun(*store, *o.record); !recorded) {
                    o.error = recorded.error().message;
                    o.report.reset();
                }

    const std::string text = csv ? xlsx::tableCsv(resultsTable(outcomes)) : resultsJsonl(outcomes);
    if (outPath.empty()) {
        std::fputs(text.c_str(), stdout);
    } else if (const auto written = xlsx::writeFileAtomically(outPath, text); !written) {
        return fail(exitBadInput, written.error().message);
    }
    std::size_t failed = 0;
    bool breached = false;
    for (const auto &o : outcomes) {
        failed += o.report ? 0 : 1;
        breached = breached || anyBreached(o.extras.limits);
    }
    if (failed > 0) {
        std::fprintf(stderr, "tailwise-cli: batch: %zu of %zu workbooks failed (each on its line)\n", failed, outcomes.size());
        return exitBadInput;
    }
    if (daily.failOnBreach && breached)
        return exitBreach;
    return exitOk;
}

} // namespace tailwise::cli

#include "historycommand.h"

#include "exitstatus.h"
#include "numbertext.h"
#include "tableexports.h"

#include "tailwise/filewrite.h"
#include "tailwise/json.h"
#include "tailwise/store/historystore.h"
#include "tailwise/version.h"

#include <algorithm>
#include <cstdio>

namespace tailwise::cli {

std::string historyHelpText()
{
    return R"(tailwise-cli history FILE.db [--workbook TITLE] [--json | --csv] [--xlsx FILE]

The figures recorded in a history database (by `var --record FILE.db` or `batch --record FILE.db`):
for each workbook, one line per run in as-of order with the portfolio value, VaR, ES, the realised
P&L of the as-of day (the holdings' change in value from the day before's close), the change in VaR
from the previous record and what changed since then (holdings, market data, assumptions), and the
worst state of the run's limits.

Options:
  --workbook TITLE   only this workbook's runs
  --json             one JSON object: {"database", "schema_version", "runs": [...]}
  --csv              one CSV table (header first)
  --xlsx FILE        also write the table to an .xlsx workbook (one sheet)
  --help             this text

Exit status: 0 success, 1 the database cannot be read (not ours, newer, locked), 2 bad usage.
)";
}

namespace {

std::string pad(const std::string &s, std::size_t width)
{
    return s.size() >= width ? s : std::string(width - s.size(), ' ') + s;
}

std::string historyJson(const std::string &path, int schema, const std::vector<HistoryRow> &rows)
{
    JsonWriter j;
    j.beginObject();
    j.key("database").value(path);
    j.key("schema_version").value(schema);
    j.key("tool_version").value(toolVersion());
    j.key("runs").beginArray();
    for (const auto &row : rows) {
        const auto &r = row.run;
        j.beginObject();
        j.key("workbook").value(r.workbook);
        j.key("as_of").value(r.asOf);
        j.key("recorded_at").value(r.recordedAt);
        j.key("tool_version").value(r.toolVersion);
        j.key("input_sha256").value(r.inputSha256);
        j.key("portfolio_value").value(r.portfolioValue);
        j.key("var").value(r.var);
        j.key("es").value(r.es);
        j.key("realised_pnl").value(r.realisedPnl);
        j.key("var_change").value(row.varChange);
        j.key("es_change").value(row.esChange);
        j.key("changed").beginArray();
        for (const auto &c : row.changed)
            j.value(c);
        j.endArray();
        j.key("limits").beginArray();
        for (const auto &l : r.limits) {
            j.beginObject();
            j.key("measure").value(l.measure);
            j.key("group");
            if (l.group.empty())
                j.null();
            else
                j.value(l.group);
            j.key("limit").value(l.limit);
            j.key("warning_level").value(l.warningLevel);
            j.key("value").value(l.value);
            j.key("use").value(l.use);
            j.key("state").value(l.state);
            j.endObject();
        }
        j.endArray();
        j.endObject();
    }
    j.endArray();
    j.endObject();
    return j.text() + "\n";
}

std::string historyText(const std::string &path, const std::vector<HistoryRow> &rows)
{
    std::string out = "Tailwise - recorded figures in " + path + "\n";
    if (rows.empty())
        return out + "\nNo runs recorded yet.\n";
    std::string current;
    for (const auto &row : rows) {
        const auto &r = row.run;
        if (r.workbook != current) {
            current = r.workbook;
            out += "\n" + current + "\n";
            out += "  as of       " + pad("value", 16) + pad("VaR", 14) + pad("ES", 14) + pad("realised P&L", 14)
                   + pad("VaR change", 13) + "  what changed; limits\n";
        }
        std::string changed;
        for (const auto &c : row.changed)
            changed += (changed.empty() ? "" : ", ") + c;
        if (row.varChange && changed.empty())
            changed = "nothing";
        if (!row.varChange)
            changed = "first record";
        std::string limits = row.worstLimitState.empty() ? std::string() : "; limits " + row.worstLimitState;
        out += "  " + r.asOf + "  " + pad(money(r.portfolioValue), 16) + pad(money(r.var), 14) + pad(money(r.es), 14)
               + pad(r.realisedPnl ? money(*r.realisedPnl) : std::string("n/a"), 14)
               + pad(row.varChange ? money(*row.varChange) : std::string("-"), 13) + "  " + changed + limits + "\n";
    }
    return out;
}

} // namespace

int runHistoryCommand(const std::vector<std::string> &args)
{
    std::string path, workbook, xlsxPath;
    bool json = false, csv = false;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &a = args[i];
        if (a == "--help" || a == "-h") {
            std::fputs(historyHelpText().c_str(), stdout);
            return exitOk;
        }
        if (a == "--json") {
            json = true;
        } else if (a == "--csv") {
            csv = true;
        } else if (a == "--workbook" || a == "--xlsx") {
            if (i + 1 >= args.size())
                return fail(exitUsage, a + ": expected a value after " + a);
            std::string &target = a == "--workbook" ? workbook : xlsxPath;
            if (!target.empty())
                return fail(exitUsage, a + ": given more than once: give it once");
            target = args[++i];
            if (target.empty())
                return fail(exitUsage, a + ": expected a value, found an empty text");
        } else if (!a.empty() && a[0] == '-') {
            return fail(exitUsage, "history: unknown option \"" + a + "\" (see tailwise-cli history --help)");
        } else if (path.empty()) {
            path = a;
        } else {
            return fail(exitUsage, "history: one database at a time, found \"" + path + "\" and \"" + a + "\"");
        }
    }
    if (path.empty())
        return fail(exitUsage, "history: expected the history database (tailwise-cli history FILE.db)");
    if (json && csv)
        return fail(exitUsage, "--json and --csv: choose one");
    if (!xlsxPath.empty())
        if (auto ok = checkOutputIsNotAnInput(xlsxPath, {path}, "--xlsx"); !ok)
            return fail(exitUsage, ok.error().message);
    auto store = store::HistoryStore::open(path, store::OpenOptions{30000, false});
    if (!store)
        return fail(exitBadInput, store.error().message);
    if (!workbook.empty()) {
        const auto names = store.value().workbooks();
        if (!names)
            return fail(exitBadInput, names.error().message);
        if (std::find(names.value().begin(), names.value().end(), workbook) == names.value().end()) {
            std::string known;
            for (const auto &n : names.value())
                known += (known.empty() ? "" : ", ") + ("\"" + n + "\"");
            return fail(exitBadInput, "--workbook: no runs of \"" + workbook + "\" in " + path
                                          + (known.empty() ? std::string(" (it holds none yet)") : " (it holds " + known + ")"));
        }
    }
    const auto runs = store.value().runs(workbook);
    if (!runs)
        return fail(exitBadInput, runs.error().message);
    const auto rows = historyRows(runs.value());
    if (json)
        std::fputs(historyJson(path, store.value().schemaVersion(), rows).c_str(), stdout);
    else if (csv)
        std::fputs(xlsx::tableCsv(historyTable(rows)).c_str(), stdout);
    else
        std::fputs(historyText(path, rows).c_str(), stdout);
    if (!xlsxPath.empty())
        if (const auto written = xlsx::writeXlsx(xlsxPath, {historyTable(rows)}); !written)
            return fail(exitBadInput, written.error().message);
    return exitOk;
}

} // namespace tailwise::cli

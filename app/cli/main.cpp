// tailwise-cli: the command line over the core. Thin: parse, call core, print.
// Exit status: 0 success, 1 bad input data, 2 bad usage, 3 a limit breached with --fail-on-breach.
#include "backtestcommand.h"
#include "batchcommand.h"
#include "dailyrun.h"
#include "historycommand.h"
#include "tableexports.h"
#include "reportprint.h"
#include "exitstatus.h"
#include "optiongroups.h"
#include "varextras.h"
#include "varoptions.h"
#include "workbookinput.h"
#include "packcommand.h"
#include "pdfreportcommand.h"
#include "rendercommand.h"

#include "gridprint.h"

#include "tailwise/asof.h"
#include "tailwise/filewrite.h"
#include "tailwise/modelgrid.h"
#include "tailwise/holdings.h"
#include "tailwise/sha256.h"
#include "tailwise/inputhash.h"
#include "tailwise/version.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"

#include <cerrno>
#include <chrono>
#include <cstring>
#include <exception>
#include <filesystem>
#include <new>

#include <unistd.h>
#include <cstdio>
#include <optional>
#include <string>
#include <vector>

namespace {

using tailwise::cli::exitBadInput;
using tailwise::cli::exitOk;
using tailwise::cli::exitUsage;
using tailwise::cli::fail;
using tailwise::cli::messageFor;

const char *topHelp = R"(tailwise-cli: Value-at-Risk and Expected Shortfall from the command line

Usage:
  tailwise-cli var [options]     risk figures of a portfolio (tailwise-cli var --help)
  tailwise-cli backtest [options]  would the VaR have held up? (tailwise-cli backtest --help)
  tailwise-cli pack [options]    make a workbook (.tailwise) from CSV files (tailwise-cli pack --help)
  tailwise-cli batch WORKBOOK... | --list FILE
                                 many workbooks at once (tailwise-cli batch --help)
  tailwise-cli history FILE.db   the recorded figures (tailwise-cli history --help)
  tailwise-cli render WORKBOOK --chart KIND --out FILE
                                 draw a chart to PNG, SVG or PDF (tailwise-cli render --help)
  tailwise-cli report WORKBOOK --out FILE.pdf
                                 the workbook's PDF report (tailwise-cli report --help)
  tailwise-cli --help            this text
  tailwise-cli --version
)";

int runVar(std::vector<std::string> args)
{
    using namespace tailwise;
    cli::DailyOptions daily; // --as-of, --limit, --fail-on-breach, --record, --xlsx (dailyrun.h)
    if (const auto taken = cli::takeDailyOptions(args, daily, {"--as-of", "--limit", "--fail-on-breach", "--record", "--xlsx"});
        !taken)
        return fail(exitUsage, taken.error().message);
    const auto started = std::chrono::steady_clock::now();
    auto msSinceStart = [&] {
        return std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - started).count();
    };
    // The options are checked first (a usage error before any file is read); with a workbook,
    // its stored assumptions are the starting point and the options given override them.
    auto request = cli::parseVarOptions(args);
    if (!request)
        return fail(exitUsage, request.error().message);
    if (request.value().help) {
        std::fputs((cli::varHelpText() + cli::dailyHelpText()).c_str(), stdout);
        return exitOk;
    }
    if (const auto checked = cli::applyDailyOptions(daily, {}); !checked)
        return fail(exitUsage, checked.error().message);
    if (!daily.xlsx.empty()) // the tables must not replace an input
        if (auto ok = checkOutputIsNotAnInput(daily.xlsx,
                                              {request.value().pricesPath, request.value().holdingsPath,
                                               request.value().workbookPath},
                                              "--xlsx");
            !ok)
            return fail(exitUsage, ok.error().message);
    std::optional<ui::WorkbookContents> workbook;
    if (!request.value().workbookPath.empty()) {
        auto loaded = cli::readWorkbookInput(request.value().workbookPath);
        if (!loaded)
            return fail(exitBadInput, loaded.error().message);
        workbook = std::move(loaded).value();
        for (const auto &w : workbook->warnings) // e.g. assumptions the file lacks took defaults
            std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());
        request = cli::parseVarOptions(args, workbook->assumptions, true);
        if (!request)
            return fail(exitUsage, request.error().message);
    }
    const auto &req = request.value();
    auto settings = cli::applyDailyOptions(daily, workbook ? workbook->limits : std::vector<Limit>{});
    if (!settings)
        return fail(exitUsage, settings.error().message);
    if (req.single && (settings.value().asOf || !daily.record.empty()))
        return fail(exitUsage, std::string(settings.value().asOf ? "--as-of" : "--record")
                                   + ": needs a price history (--workbook, or --prices with --holdings), not --value");
    // The inputs as used (after the as-of cut), for the stamp and the record.
    PriceHistory usedPrices;
    Holdings usedHoldings;
    std::string recordName;
    Result<RiskReport> report = Error{};
    Result<cli::ReportExtras> extras = cli::ReportExtras{};
    cli::RunTimings timings;
    timings.simulated = req.assumptions.model == RiskModel::MonteCarlo;
    RunControl control;
    control.timings = &timings.stages;
    if (req.single) {
        report = computeSinglePositionRisk(*req.single, req.assumptions, control);
    } else if (workbook) {
        timings.loadMs = msSinceStart(); // the workbook was read before the options were parsed
        if (settings.value().asOf) {
            auto cut = cutHistoryAt(workbook->prices, *settings.value().asOf);
            if (!cut)
                return fail(exitBadInput, "--as-of" + cut.error().message.substr(cut.error().field.size()));
            workbook->prices = std::move(cut).value();
        }
        usedPrices = workbook->prices;
        usedHoldings = workbook->holdings;
        recordName = workbook->title.isEmpty() ? std::filesystem::path(req.workbookPath).stem().string()
                                               : workbook->title.toStdString();
        report = computeRisk(workbook->prices, workbook->holdings, req.assumptions, control);
        if (report)
            extras = cli::computeExtras(req.models, workbook->prices, workbook->holdings, req.assumptions);
    } else {
        const auto loading = std::chrono::steady_clock::now();
        auto prices = readPriceCsv(req.pricesPath);
        if (!prices)
            return fail(exitBadInput, prices.error().message);
        auto holdings = readHoldingsCsv(req.holdingsPath, &prices.value());
        if (!holdings)
            return fail(exitBadInput, holdings.error().message);
        timings.loadMs = std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - loading).count();
        if (settings.value().asOf) {
            auto cut = cutHistoryAt(prices.value(), *settings.value().asOf);
            if (!cut)
                return fail(exitBadInput, "--as-of" + cut.error().message.substr(cut.error().field.size()));
            prices = std::move(cut).value();
        }
        usedPrices = prices.value();
        usedHoldings = holdings.value();
        recordName = std::filesystem::path(req.holdingsPath).stem().string();
        report = computeRisk(prices.value(), holdings.value(), req.assumptions, control);
        if (report)
            extras = cli::computeExtras(req.models, prices.value(), holdings.value(), req.assumptions);
    }
    if (!report)
        return fail(exitBadInput, messageFor(report.error()));
    if (!extras)
        return fail(exitBadInput, messageFor(extras.error()));
    if (workbook)
        extras.value().currency = workbook->currency.toStdString();
    if (req.grid) {
        auto grid = modelRiskGrid(report.value(), cli::gridHorizons(report.value()), cli::gridConfidences(report.value()));
        if (!grid)
            return fail(exitBadInput, messageFor(grid.error()));
        extras.value().grid = std::move(grid).value();
    }
    const RiskReport &figures = report.value();
    auto limitUses = evaluateLimits(settings.value().limits, {figures.figures.var, figures.figures.es, figures.portfolioValue});
    if (!limitUses)
        return fail(exitBadInput, messageFor(limitUses.error()));
    extras.value().limits = limitUses.value();
    if (req.single) {
        // No price history: the position and the assumptions are the inputs.
        cli::RunStamp stamp;
        stamp.toolVersion = toolVersion();
        stamp.inputSha256 = sha256Hex("single-position\nvalue=" + formatShortest(req.single->value) + "\nvolatility="
                                      + formatShortest(req.single->annualVolatility) + "\ndrift="
                                      + formatShortest(req.single->annualDrift) + "\n"
                                      + canonicalAssumptionsText(req.assumptions));
        extras.value().stamp = stamp;
    } else {
        extras.value().stamp = cli::makeStamp(usedPrices, usedHoldings, req.assumptions, settings.value().asOf);
    }
    const bool single = req.single.has_value();
    std::optional<cli::RunTimings> shownTimings;
    if (req.timings)
        shownTimings = timings;
    const std::string text = req.json ? cli::reportJson(report.value(), single, extras.value(), shownTimings)
                                      : cli::reportText(report.value(), single, extras.value(), shownTimings);
    std::fputs(text.c_str(), stdout);
    if (req.json)
        for (const auto &w : report.value().warnings)
            std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());
    if (!daily.record.empty()) {
        auto store = store::HistoryStore::open(daily.record);
        if (!store)
            return fail(exitBadInput, store.error().message);
        const auto record = cli::makeRunRecord(recordName, figures, *extras.value().stamp, usedPrices, usedHoldings,
                                               extras.value().limits);
        if (const auto recorded = cli::recordRun(store.value(), record); !recorded)
            return fail(exitBadInput, recorded.error().message);
    }
    if (!daily.xlsx.empty())
        if (const auto written = cli::writeVarWorkbook(daily.xlsx, figures, extras.value()); !written)
            return fail(exitBadInput, written.error().message);
    if (daily.failOnBreach && anyBreached(extras.value().limits))
        return cli::exitBreach;
    return exitOk;
}

} // namespace

namespace {

int runCommand(const std::vector<std::string> &args)
{
    if (args.empty())
        return fail(exitUsage, std::string("expected a command\n\n") + topHelp);
    if (args[0] == "--help" || args[0] == "-h" || args[0] == "help") {
        std::fputs(topHelp, stdout);
        return exitOk;
    }
    if (args[0] == "--version") {
        std::printf("tailwise-cli %s\n", tailwise::toolVersion());
        return exitOk;
    }
    if (args[0] == "var")
        return runVar({args.begin() + 1, args.end()});
    if (args[0] == "pack")
        return tailwise::cli::runPackCommand({args.begin() + 1, args.end()});
    if (args[0] == "backtest")
        return tailwise::cli::runBacktestCommand({args.begin() + 1, args.end()});
    if (args[0] == "batch")
        return tailwise::cli::runBatchCommand({args.begin() + 1, args.end()});
    if (args[0] == "history")
        return tailwise::cli::runHistoryCommand({args.begin() + 1, args.end()});
    if (args[0] == "render")
        return tailwise::cli::runRenderCommand({args.begin() + 1, args.end()});
    if (args[0] == "report")
        return tailwise::cli::runPdfReportCommand({args.begin() + 1, args.end()});
    return fail(exitUsage, "unknown command \"" + args[0] + "\" (expected: var, backtest, pack, batch, history, render, report)");
}

} // namespace

int main(int argc, char **argv)
{
    const std::vector<std::string> args(argv + 1, argv + argc);
    // Redirected output is written at the end in one flush, so that a failure (a full disk) is
    // seen there with its reason. The buffer is our own: glibc ignores the size when it is asked
    // to allocate one, and would write (and fail) every 4 KiB, leaving errno unset at the end.
    static char outputBuffer[1 << 22];
    if (!::isatty(STDOUT_FILENO))
        std::setvbuf(stdout, outputBuffer, _IOFBF, sizeof outputBuffer);
    int code = exitOk;
    // Whatever a library throws (a special function outside its domain, memory running out) ends
    // as a message and exit 2, never as an abort.
    try {
        code = runCommand(args);
    } catch (const std::bad_alloc &) {
        std::fflush(stdout);
        return fail(exitBadInput, "not enough memory for this computation (the input may be too large)");
    } catch (const std::exception &e) {
        std::fflush(stdout);
        return fail(exitUsage, std::string("could not compute this: ") + e.what());
    } catch (...) {
        std::fflush(stdout);
        return fail(exitUsage, "could not compute this: an unexpected failure");
    }
    // Output written to standard output must have arrived (a full disk behind `> file`, a closed
    // pipe): otherwise a non-zero exit with the system's reason.
    errno = 0;
    if (std::fflush(stdout) != 0 || std::ferror(stdout)) {
        const int error = errno;
        return fail(code == exitOk ? exitBadInput : code,
                    std::string("could not write the output: ") + (error != 0 ? std::strerror(error) : "write failed"));
    }
    return code;
}

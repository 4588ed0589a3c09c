#include "backtestcommand.h"

#include "exitstatus.h"

#include "backtestoptions.h"
#include "backtestprint.h"
#include "dailyrun.h"
#include "tableexports.h"
#include "optiongroups.h"
#include "workbookinput.h"

#include "document/backtestrequest.h"

#include "tailwise/filewrite.h"
#include "tailwise/asof.h"
#include "tailwise/backtest.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <cstdio>

namespace tailwise::cli {

int runBacktestCommand(const std::vector<std::string> &argsIn)
{
    std::vector<std::string> args = argsIn;
    DailyOptions daily; // --as-of, --xlsx (dailyrun.h)
    if (const auto taken = takeDailyOptions(args, daily, {"--as-of", "--xlsx"}); !taken)
        return fail(exitUsage, taken.error().message);
    const auto settings = applyDailyOptions(daily, {});
    if (!settings)
        return fail(exitUsage, settings.error().message);
    auto parsed = parseBacktestOptions(args);
    if (!parsed)
        return fail(exitUsage, parsed.error().message);
    const BacktestOptions &options = parsed.value();
    if (options.help) {
        std::fputs((backtestHelpText() + "\nAlso: --as-of DATE (the history ends there), --xlsx FILE (the days and the exceptions, one sheet each).\n").c_str(), stdout);
        return exitOk;
    }
    if (!daily.xlsx.empty()) // the tables must not replace an input
        if (auto ok = checkOutputIsNotAnInput(daily.xlsx, {options.pricesPath, options.holdingsPath, options.workbookPath},
                                              "--xlsx");
            !ok)
            return fail(exitUsage, ok.error().message);
    BacktestRequest request;
    if (!options.workbookPath.empty()) {
        // The workbook's assumptions, backtest window and first backtest model; then the options.
        auto contents = readWorkbookInput(options.workbookPath);
        if (!contents)
            return fail(exitBadInput, contents.error().message);
        const ui::BacktestSettings settings = contents.value().backtest.value_or(ui::BacktestSettings{});
        request = ui::backtestRequestFor(contents.value(), settings, settings.models.front());
        auto withOptions = parseBacktestOptions(args, request.assumptions, true);
        if (!withOptions)
            return fail(exitUsage, withOptions.error().message);
        request.assumptions = withOptions.value().assumptions;
    } else {
        auto prices = readPriceCsv(options.pricesPath);
        if (!prices)
            return fail(exitBadInput, prices.error().message);
        auto holdings = readHoldingsCsv(options.holdingsPath, &prices.value());
        if (!holdings)
            return fail(exitBadInput, holdings.error().message);
        request.prices = std::move(prices).value();
        request.holdings = std::move(holdings).value();
        request.assumptions = options.assumptions;
    }
    if (settings.value().asOf) {
        auto cut = cutHistoryAt(request.prices, *settings.value().asOf);
        if (!cut)
            return fail(exitBadInput, "--as-of" + cut.error().message.substr(cut.error().field.size()));
        request.prices = std::move(cut).value();
    }
    const RunStamp stamp = makeStamp(request.prices, request.holdings, request.assumptions, settings.value().asOf);
    const auto result = runBacktest(request);
    if (!result)
        return fail(exitBadInput, messageFor(result.error()));
    const BacktestResult &r = result.value();
    if (options.json) {
        std::fputs(withStampJson(backtestJson(r, options.series), stamp).c_str(), stdout);
        for (const auto &w : r.warnings)
            std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());
    } else {
        const std::string pricesName = options.workbookPath.empty() ? options.pricesPath : options.workbookPath + " (workbook)";
        const std::string holdingsName = options.workbookPath.empty() ? options.holdingsPath : options.workbookPath + " (workbook)";
        const BacktestPrintInput input{r, pricesName, holdingsName,
                                       static_cast<int>(request.holdings.size()), options.series};
        std::fputs((backtestText(input) + stampText(stamp)).c_str(), stdout);
    }
    if (!daily.xlsx.empty())
        if (const auto written = xlsx::writeXlsx(daily.xlsx, backtestTables(r)); !written)
            return fail(exitBadInput, written.error().message);
    return exitOk;
}

} // namespace tailwise::cli

#include "backtestcommand.h"

#include "exitstatus.h"

#include "backtestoptions.h"
#include "backtestprint.h"

#include "tailwise/backtest.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <cstdio>

namespace tailwise::cli {

namespace {

// A core error about a field is said as the option the user typed ("window: …" → "--window: …").
std::string messageFor(const Error &error)
{
    if (!error.field.empty() && error.message.rfind(error.field + ": ", 0) == 0)
        return backtestOptionForField(error.field) + error.message.substr(error.field.size());
    return error.message;
}

} // namespace

int runBacktestCommand(const std::vector<std::string> &args)
{
    auto parsed = parseBacktestOptions(args);
    if (!parsed)
        return fail(exitUsage, parsed.error().message);
    const BacktestOptions &options = parsed.value();
    if (options.help) {
        std::fputs(backtestHelpText().c_str(), stdout);
        return exitOk;
    }
    BacktestRequest request;
    auto prices = readPriceCsv(options.pricesPath);
    if (!prices)
        return fail(exitBadInput, prices.error().message);
    auto holdings = readHoldingsCsv(options.holdingsPath, &prices.value());
    if (!holdings)
        return fail(exitBadInput, holdings.error().message);
    request.prices = std::move(prices).value();
    request.holdings = std::move(holdings).value();
    request.assumptions = options.assumptions;

    const auto result = runBacktest(request);
    if (!result)
        return fail(exitBadInput, messageFor(result.error()));
    const BacktestResult &r = result.value();
    if (options.json) {
        std::fputs(backtestJson(r, options.series).c_str(), stdout);
        for (const auto &w : r.warnings)
            std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());
    } else {
        const BacktestPrintInput input{r, options.pricesPath, options.holdingsPath,
                                       static_cast<int>(request.holdings.size()), options.series};
        std::fputs(backtestText(input).c_str(), stdout);
    }
    return exitOk;
}

} // namespace tailwise::cli

// The options of `tailwise-cli backtest`: the shared groups of optiongroups.h with the backtest's
// wording (--window is the rolling window). Every refusal names the option; nothing is read from
// disk here.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/result.h"

#include <string>
#include <vector>

namespace tailwise::cli {

struct BacktestOptions {
    std::string pricesPath;
    std::string holdingsPath;
    std::string workbookPath; // --workbook: prices, holdings, assumptions and backtest window
    Assumptions assumptions;  // assumptions.window is the rolling window, always set after parsing
    bool json = false;
    bool series = false;      // every tested day, not only the exceptions
    bool help = false;
};

// `start` is where the assumptions begin: the defaults, or a workbook's (with its backtest window
// and model); the options given override it. With --workbook and `startIsWorkbook` false, the checks
// that depend on the stored assumptions wait for the second call.
Result<BacktestOptions> parseBacktestOptions(const std::vector<std::string> &args, const Assumptions &start = Assumptions{},
                                             bool startIsWorkbook = false);
std::string backtestHelpText();

} // namespace tailwise::cli

// Parsing of `tailwise-cli backtest` options into a core BacktestRequest's settings. Every refusal
// names the option and says what was expected; nothing is read from disk here.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/result.h"

#include <string>
#include <vector>

namespace tailwise::cli {

struct BacktestOptions {
    std::string pricesPath;
    std::string holdingsPath;
    Assumptions assumptions; // assumptions.window is the rolling window, always set after parsing
    bool json = false;
    bool series = false;     // every tested day, not only the exceptions
    bool help = false;
};

Result<BacktestOptions> parseBacktestOptions(const std::vector<std::string> &args);
std::string backtestHelpText();

// A core field's name as the backtest's option ("model" → "--model").
std::string backtestOptionForField(const std::string &field);

} // namespace tailwise::cli

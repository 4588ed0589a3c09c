// `tailwise-cli backtest`: parse the options, read the files, run the core backtest, print.
#pragma once

#include <string>
#include <vector>

namespace tailwise::cli {

// Returns the exit status: 0 success, 1 bad input data, 2 bad usage (as `tailwise-cli var`).
int runBacktestCommand(const std::vector<std::string> &args);

} // namespace tailwise::cli

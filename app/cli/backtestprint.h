// The command line's two ways to print a BacktestResult: a readable report with verdicts in words,
// and one JSON object with the keys of issue 5.
#pragma once

#include "tailwise/backtest.h"

#include <string>

namespace tailwise::cli {

// Test size for the verdicts in words: a test "rejects" when its p-value is below it.
inline constexpr double verdictTestSize = 0.05;

struct BacktestPrintInput {
    const BacktestResult &result;
    std::string pricesPath;
    std::string holdingsPath;
    int holdingCount = 0;
    bool series = false; // list every tested day, not only the exceptions
};

std::string backtestText(const BacktestPrintInput &input);
// Keys: observations, exceptions, expected_exceptions, kupiec {lr, p_value}, christoffersen
// {lr_ind, p_ind, lr_cc, p_cc, transitions [n00, n01, n10, n11]}, zone; with `series` also
// series [{date, pnl, var, exception}].
std::string backtestJson(const BacktestResult &result, bool series);

} // namespace tailwise::cli

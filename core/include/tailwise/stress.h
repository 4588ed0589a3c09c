// Stress: the P&L of today's holdings under named price shocks, and the window's worst days
// replayed on today's holdings.
//
// Scenario file (CSV, the text rules of prices.h): a header `asset,shock` (any order, any case),
// then one row per asset with its shock as a fraction of the price (−0.2 = the price falls 20%).
// Assets without a row are unchanged. Errors name file, line and column: an unknown or missing
// column, an empty asset, an asset the price history lacks, an asset listed twice, a shock that is
// not a finite number or is −1 or below (a price cannot fall to zero or beneath), no rows at all.
// The scenario's name is the file name without its folder and extension.
//
// P&L of a scenario, money, gains positive (exact for positions linear in price):
//   P&L = Σ_i e_i s_i,  e_i today's exposure (holdings.h), s_i the shock
// Worst days: each window day t replayed on today's exposures, P&L_t = Σ_i e_i (P_{t,i}/P_{t−1,i} − 1)
// (simple price changes whatever the return type the estimate uses, because a replay moves the
// prices); the `count` lowest, worst first, with their dates (common practice).
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/date.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"

#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

namespace tailwise {

struct StressScenario {
    std::string name;
    std::vector<std::pair<std::string, double>> shocks; // asset, fraction
};

// `prices` may be nullptr to skip the asset check.
Result<StressScenario> parseScenarioCsv(std::string_view text, const std::string &sourceName, std::string name,
                                        const PriceHistory *prices);
Result<StressScenario> readScenarioCsv(const std::string &path, const PriceHistory *prices);

struct StressOutcome {
    std::string name;
    double pnl = 0.0;           // money, gains positive
    std::optional<Date> date;   // the day replayed (worst days only)
};

// Holdings must be valid for `prices` (checkHoldings).
double scenarioPnl(const StressScenario &scenario, const PriceHistory &prices, const Holdings &holdings);

// The window's `count` worst days (fewer if the window is shorter). Errors: those of selectWindow.
Result<std::vector<StressOutcome>> worstDays(const PriceHistory &prices, const Holdings &holdings,
                                             const Assumptions &assumptions, int count = 5);

// Every scenario, then the worst days, in one list.
Result<std::vector<StressOutcome>> runStress(const PriceHistory &prices, const Holdings &holdings,
                                             const Assumptions &assumptions,
                                             const std::vector<StressScenario> &scenarios, int worstDayCount = 5);

} // namespace tailwise

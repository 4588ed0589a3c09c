// Limits on the risk figures and their use.
//
// A limit caps VaR or ES (the measure), either as an amount of money or as a percentage of the
// portfolio value V, for the whole book or for one group of holdings. Its use is the figure as a
// fraction of the limit, u = figure / L (L in money: the amount, or p × V for a percentage). Its
// state (common practice in risk limit monitoring; the thresholds are the tool's own):
//   breached  u > 1            (the figure is over the limit)
//   warning   w ≤ u ≤ 1        (w: the warning level, 80 % of the limit unless stated)
//   ok        u < w
// Text form (the command line's --limit): MEASURE=AMOUNT[%][,warn=W%][,group=NAME], MEASURE `var`
// or `es`, AMOUNT > 0 (money, or percent of value with %), 0 < W ≤ 100.
#pragma once

#include "tailwise/result.h"

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace tailwise {

enum class LimitMeasure { Var, Es };
enum class LimitState { Ok, Warning, Breached };

struct Limit {
    LimitMeasure measure = LimitMeasure::Var;
    std::string group;        // empty: the whole book
    double amount = 0.0;      // money; or percent of value (e.g. 2.5 for 2.5 %) when percentOfValue
    bool percentOfValue = false;
    double warningLevel = 0.8; // fraction of the limit, 0 < w ≤ 1
    friend bool operator==(const Limit &, const Limit &) = default;
};

struct LimitUse {
    Limit limit;
    double limitMoney = 0.0; // L
    double value = 0.0;      // the figure
    double use = 0.0;        // figure / L
    LimitState state = LimitState::Ok;
};

std::string_view toName(LimitMeasure measure); // "var", "es"
std::string_view toName(LimitState state);     // "ok", "warning", "breached"
std::optional<LimitMeasure> parseLimitMeasure(std::string_view name);
std::optional<LimitState> parseLimitState(std::string_view name);

// Parses the text form above; errors name `option` (e.g. "--limit") and what was expected.
Result<Limit> parseLimit(std::string_view text, const std::string &option = "--limit");
// The text form of a limit, which parseLimit reads back to the same limit.
std::string limitText(const Limit &limit);

// Refuses a limit on a group that is not among `knownGroups` (naming the group and the groups
// there are) and an amount or warning level outside its domain.
Status checkLimits(const std::vector<Limit> &limits, const std::vector<std::string> &knownGroups,
                   const std::string &option = "--limit");

// The figures a limit is checked against: the book's VaR, ES and value (groups: later, by name).
struct LimitFigures {
    double var = 0.0;
    double es = 0.0;
    double portfolioValue = 0.0;
};

// Use and state of each book-level limit. A percentage limit on a book whose value is not positive
// has no money amount: an error naming the limit.
Result<std::vector<LimitUse>> evaluateLimits(const std::vector<Limit> &limits, const LimitFigures &figures);

// True when any limit is breached.
bool anyBreached(const std::vector<LimitUse> &uses);

} // namespace tailwise

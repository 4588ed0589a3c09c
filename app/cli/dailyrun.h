// What a daily run adds to a computation: the as-of date (the history cut there, asof.h), the
// stamp that makes a figure traceable (tool version, as-of date, seed, input SHA-256), the limits'
// use and state (limits.h), and a record in the history database (store/historystore.h).
// Shared by `var` and `batch`; `history` reads what they recorded.
#pragma once

#include "tailwise/date.h"
#include "tailwise/holdings.h"
#include "tailwise/json.h"
#include "tailwise/limits.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"
#include "tailwise/store/historystore.h"

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

namespace tailwise::cli {

inline constexpr int exitBreach = 3; // --fail-on-breach and a limit is breached

// The options as typed.
struct DailyOptions {
    std::optional<std::string> asOf; // --as-of DATE
    std::vector<std::string> limits; // --limit SPEC, repeatable
    bool failOnBreach = false;       // --fail-on-breach
    std::string record;              // --record FILE.db
    std::string xlsx;                // --xlsx FILE
};

// Takes the options above out of `args` (each with its value), leaving the rest to the command's
// own parser. `accepted` lists the ones the command takes ("--as-of", "--limit", …); the others
// are left in place for the command's parser to refuse. Error: an option without its value.
Status takeDailyOptions(std::vector<std::string> &args, DailyOptions &options, const std::vector<std::string> &accepted);

// The help of these options for `var` (appended to its help text).
std::string dailyHelpText();

// The options read: the as-of date and the limits (given on the command line they replace the
// workbook's; otherwise the workbook's apply). Errors name the option.
struct DailySettings {
    std::optional<Date> asOf;
    std::vector<Limit> limits;
};
Result<DailySettings> applyDailyOptions(const DailyOptions &options, const std::vector<Limit> &workbookLimits);

// What makes a figure traceable.
struct RunStamp {
    std::string toolVersion;
    std::string asOf; // YYYY-MM-DD: the given date, else the history's last date
    std::optional<std::uint64_t> seed; // when the model draws (monte-carlo)
    std::string inputSha256;
};

// `prices` as used (already cut at the as-of date).
RunStamp makeStamp(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions,
                   const std::optional<Date> &asOf);
// "tool_version", "as_of", "seed" (when used) and "input_sha256" as keys of the open object.
void writeStampJson(JsonWriter &j, const RunStamp &stamp);
// "limits": [{measure, group, limit, warning_level, value, use, state}], group null for the book.
void writeLimitsJson(JsonWriter &j, const std::vector<LimitUse> &uses);
// The JSON object `json` (as printed, "{" first) with the stamp's keys first.
std::string withStampJson(const std::string &json, const RunStamp &stamp);
// A plain-text block: the stamp's lines and a limits table with each state in words.
std::string stampText(const RunStamp &stamp);
std::string limitsText(const std::vector<LimitUse> &uses, const std::string &currency);

// The holdings' P&L on the last day of `prices` (from the day before's close to that day's):
// Σ qᵢ (Pᵢ,T − Pᵢ,T−1) for holdings by quantity, eᵢ (Pᵢ,T/Pᵢ,T−1 − 1) for holdings given by value.
// Absent when the history has fewer than two days.
std::optional<double> lastDayPnl(const PriceHistory &prices, const Holdings &holdings);

// One run as the history database keeps it.
store::RunRecord makeRunRecord(const std::string &workbook, const RiskReport &report, const RunStamp &stamp,
                               const PriceHistory &prices, const Holdings &holdings,
                               const std::vector<LimitUse> &limits);

// Records the run; says on stderr when it was already recorded. Error: the database's message.
Status recordRun(store::HistoryStore &store, const store::RunRecord &record);

} // namespace tailwise::cli

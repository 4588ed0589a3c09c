// Number text for the command line's readable report: thousands separators, fixed decimals.
// (The JSON uses the shortest round-trip form instead; see tailwise/json.h.)
#pragma once

#include <optional>
#include <string>

namespace tailwise::cli {

// 1234567.891 → "1,234,567.89"
std::string money(double value, int decimals = 2);
// 0.02345 → "2.35%"; nullopt → "n/a"
std::string percent(std::optional<double> fraction, int decimals = 2);
std::string fixed(double value, int decimals);

} // namespace tailwise::cli

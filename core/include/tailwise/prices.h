// Daily price history: one row per date, one column per asset.
//
// File format (CSV, UTF-8, comma separator, LF or CRLF line ends, an optional UTF-8 byte-order
// mark): a header `date,<asset>,<asset>,…` (names may be double-quoted), then one row per trading
// day with an ISO date (YYYY-MM-DD) and one price per asset. Blank lines are skipped.
//
// Rules and the errors they give (every error names the file, line and column):
//   - dates strictly increase;
//   - a price is a finite decimal number > 0 (NaN, inf, zero, negatives are refused);
//   - a row has exactly as many cells as the header;
//   - asset names are non-empty and unique.
// Gaps: an empty cell is a missing price. It is filled with the asset's previous price (carried
// forward: the asset is taken as unchanged that day, a zero return), and the count is reported
// as a warning. Rows before every asset has its first price are dropped, also with a warning.
//
// Limits (refused with a message, so that a wrong file cannot exhaust memory): file size, number
// of columns and rows, length of a line, and prices in all (rows × assets, which bounds the memory
// a file of mostly empty cells could claim) — see the constants below.
#pragma once

#include "tailwise/date.h"
#include "tailwise/result.h"

#include <Eigen/Core>

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

namespace tailwise {

struct PriceLimits {
    static constexpr std::size_t maxFileBytes = 512u * 1024u * 1024u;
    static constexpr std::size_t maxAssets = 20000;
    static constexpr std::size_t maxRows = 200000;
    static constexpr std::size_t maxLineBytes = 1024u * 1024u;
    static constexpr std::size_t maxCells = 10000000; // rows × assets, e.g. 2,000 assets × 5,000 days
};

struct PriceHistory {
    std::vector<std::string> assets;
    std::vector<Date> dates;
    // rows = dates, columns = assets; every entry finite and > 0 after gap filling.
    Eigen::MatrixXd prices;
    Warnings warnings;
    std::string sourceName; // the file it was read from, for messages

    int assetCount() const { return static_cast<int>(assets.size()); }
    int dayCount() const { return static_cast<int>(dates.size()); }
    // Index of an asset by exact name, or -1.
    int assetIndex(std::string_view name) const;
};

// Parses CSV text; `sourceName` is used in messages (a file path, or e.g. "pasted text").
Result<PriceHistory> parsePriceCsv(std::string_view text, const std::string &sourceName);
// Reads and parses a file; refuses a missing file, a directory, or one over the size limit.
Result<PriceHistory> readPriceCsv(const std::string &path);

// Writes the history as CSV in the format above (shortest round-trip decimal form of each price).
std::string writePriceCsv(const PriceHistory &history);

} // namespace tailwise

#include "tailwise/asof.h"

#include <algorithm>

namespace tailwise {

Result<PriceHistory> cutHistoryAt(const PriceHistory &prices, Date asOf)
{
    const std::string source = prices.sourceName.empty() ? std::string("the price history") : prices.sourceName;
    if (prices.dates.empty())
        return fieldError(ErrorKind::InsufficientData, "as-of", source + " has no dates");
    const std::string range = toIso(prices.dates.front()) + " to " + toIso(prices.dates.back());
    if (asOf < prices.dates.front())
        return fieldError(ErrorKind::Value, "as-of",
                          "the date " + toIso(asOf) + " is before the history of " + source + " (" + range + ")");
    if (asOf > prices.dates.back())
        return fieldError(ErrorKind::Value, "as-of",
                          "the date " + toIso(asOf) + " is after the history of " + source + " (" + range + ")");
    const auto end = std::upper_bound(prices.dates.begin(), prices.dates.end(), asOf);
    const int rows = static_cast<int>(end - prices.dates.begin());
    PriceHistory cut;
    cut.assets = prices.assets;
    cut.dates.assign(prices.dates.begin(), end);
    cut.prices = prices.prices.topRows(rows);
    cut.warnings = prices.warnings;
    cut.sourceName = prices.sourceName;
    return cut;
}

Result<Date> parseAsOfDate(const std::string &text)
{
    if (const auto d = parseIsoDate(text))
        return *d;
    return fieldError(ErrorKind::Value, "as-of", "expected a date as YYYY-MM-DD, found \"" + text + "\"");
}

} // namespace tailwise

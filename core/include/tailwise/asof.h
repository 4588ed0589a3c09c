// Computing as of a past date: the price history cut after that date, so that the window ends
// there and every holding is valued at that date's close (holdings.h values a holding at the last
// close of the history it is given). A date that is not a trading day of the history takes the
// last trading day before it (common practice: the latest close known on that date).
#pragma once

#include "tailwise/date.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"

namespace tailwise {

// The rows of `prices` dated on or before `asOf`. Errors (naming the option `--as-of`, the date and
// the history's range): a date before the history's first date or after its last.
Result<PriceHistory> cutHistoryAt(const PriceHistory &prices, Date asOf);

// Parses the text of an as-of date (ISO 8601, YYYY-MM-DD); the error names `--as-of`.
Result<Date> parseAsOfDate(const std::string &text);

} // namespace tailwise

// The currency a workbook's money is in, as a code of three capital letters in the style of
// ISO 4217 (EUR, GBP, USD). Only the shape is checked: the tool never converts between
// currencies, it only says which one the figures are in, so a code it has not heard of is fine.
#pragma once

#include "tailwise/result.h"

#include <QString>

#include <string>

namespace tailwise::ui {

// Three letters A–Z, nothing else (no spaces, no lower case).
bool isCurrencyCode(const QString &text);

// `text` trimmed; empty stays empty (not stated). Otherwise it must be a code; the error names
// `field` (an option such as "--currency" or a file field such as "currency") and what was found.
tailwise::Result<QString> parseCurrencyCode(const QString &text, const std::string &field);

// What a money axis or figure says its unit is: the code, or `fallback` (e.g. "money") when none.
inline QString moneyUnitText(const QString &currency, const QString &fallback)
{
    return currency.isEmpty() ? fallback : currency;
}

} // namespace tailwise::ui

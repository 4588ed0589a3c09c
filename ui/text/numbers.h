// Numbers and dates as the window, its charts, captions and the PDF report show them: in the
// user's locale (thousands separators, decimal mark, date order), one rule per kind of figure.
// Files and the JSON stay locale-independent; these functions are for people only. A value that
// is not finite (or absent) never reaches a screen or a page: it is shown as a dash ("no figure").
#pragma once

#include "tailwise/date.h"

#include <QString>

#include <optional>

namespace tailwise::ui {

// 1234567.891 → "1,234,567.89" (en_GB) or "1.234.567,89" (de_DE); never "-0".
QString moneyText(double value, int decimals = 2);
// The same with a plus sign on gains: "+1,234".
QString signedMoneyText(double value, int decimals = 0);
// A confidence level or a tail probability as a percentage without trailing zeros:
// 0.99 → "99%", 0.975 → "97.5%", 0.01 → "1%".
QString confidenceText(double level);
// 0.02345 → "2.35%" in the locale's form; nullopt or non-finite → dash.
QString percentText(std::optional<double> fraction, int decimals = 2);
// A quantity: as many decimals as it needs, up to 6.
QString quantityText(double value);
// Plain locale number with up to `maxDecimals`, trailing zeros dropped (for edit fields).
QString numberText(double value, int maxDecimals = 10);
QString dateText(tailwise::Date date);
// "1 trading day", "10 trading days" (English plurals without a translation file loaded).
QString tradingDaysText(int days);
// `one` when n == 1, else `many` with %1 replaced by n in the locale's form.
QString countText(int n, const QString &one, const QString &many);

// Reads a number typed by the user: the locale's form first ("1.234,5" in German), then the
// C form ("1234.5"), so a figure pasted from a file or another program still reads. Group
// separators are accepted. Returns nullopt for anything else, and for non-finite values.
std::optional<double> readNumber(const QString &text);

} // namespace tailwise::ui

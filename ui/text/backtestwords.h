// The backtest's results in words: the zone, each test's verdict, p-values and test sizes as the
// window shows them. One wording for the backtest view and the PDF report.
#pragma once

#include "tailwise/backtest.h"

#include <QString>

namespace tailwise::ui::backtestwords {

// A p-value as read in reports: four decimals, or "< 0.0001" below that; a dash if not finite.
QString pValueText(double p);
// A test size as a percentage without trailing zeros (0.05 → "5 %").
QString sizeText(double testSize);
QString zoneName(tailwise::Zone zone);    // "Green"
QString zoneMeaning(tailwise::Zone zone); // "within what chance gives a correct model"
QString kupiecWords(const tailwise::BacktestResult &r, const tailwise::BacktestVerdict &v);
QString independenceWords(const tailwise::BacktestResult &r, const tailwise::BacktestVerdict &v);
QString coverageWords(const tailwise::BacktestVerdict &v);
// What a backtest does not show (under the backtest view and in the report).
QString caution();

} // namespace tailwise::ui::backtestwords

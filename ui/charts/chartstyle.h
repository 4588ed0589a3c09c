// Shared look of the charts: one restrained palette, fonts, and number text in the user's locale.
//
// The colours differ in lightness as well as hue, so every pair stays apart when printed in
// greyscale (checked by their luma values in the palette comment in chartstyle.cpp).
// Number text never shows NaN or infinity: a non-finite value reads as "n/a".
#pragma once

#include <QColor>
#include <QFont>
#include <QString>

class QCustomPlot;
class QCPAxis;

namespace tailwise::ui::chartstyle {

QColor ink();        // axes, text, main curve
QColor slate();      // risk-adding bars, first series
QColor teal();       // second series, map marker
QColor rust();       // loss tail, VaR marker
QColor ochre();      // hedges, ES marker
QColor sand();       // histogram fill, light areas
QColor mist();       // grid lines
QColor seriesColor(int index); // a colour for the index-th of several lines (cycles)
Qt::PenStyle seriesPenStyle(int index); // and a dash pattern, so lines differ without colour

QFont labelFont();   // axis labels, legends
QFont tickFont();
QFont noteFont();

// Plain axis style: ink axes, light grid, label fonts.
void styleAxis(QCPAxis *axis);
void stylePlot(QCustomPlot *plot);

// The charts' number text: text/numbers.h's rules (one rule each for money, percent and
// confidence, a dash for no figure), with the charts' default decimals.
QString money(double value, int decimals = 0);
QString signedMoney(double value, int decimals = 0);
QString percent(double fraction, int decimals = 1);
// The unit a money axis names: the workbook's currency code ("EUR"), or "money" when none is stated.
QString moneyUnit(const QString &currency);
// A confidence as a percentage without trailing zeros: 0.975 → "97.5%", 0.99 → "99%".
QString confidenceText(double confidence);

// A round step (1, 2, 2.5 or 5 × 10^k) that cuts `span` into about `target` pieces.
double niceStep(double span, int target);

} // namespace tailwise::ui::chartstyle

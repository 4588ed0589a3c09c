// What the figures are and are not, in one wording for the window's line under the figures, the
// About box and the PDF report.
#pragma once

#include <QList>
#include <QString>

namespace tailwise::ui {

struct Caution {
    QString title;
    QString text;
};
// Each follows the confidence of the figures ("about once in 40 horizons at 97.5%").
// "once in 40 horizons at 97.5%": 1/(1 − C) rounded to a whole number.
QString onceInText(double confidence);
// The cautions as titled plain paragraphs (the report sets them itself).
QList<Caution> cautions(double confidence);
// The same as rich text, for the About box and the tooltip.
QString cautionsFullText(double confidence);
// The always-visible line.
QString cautionsShortText(double confidence);

} // namespace tailwise::ui

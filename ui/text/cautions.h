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
// The cautions as titled plain paragraphs (the report sets them itself).
QList<Caution> cautions();
// The same as rich text, for the About box and the tooltip.
QString cautionsFullText();
// The always-visible line.
QString cautionsShortText();

} // namespace tailwise::ui

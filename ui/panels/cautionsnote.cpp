#include "cautionsnote.h"

#include "text/cautions.h"

namespace tailwise::ui {

CautionsNote::CautionsNote(QWidget *parent) : QLabel(parent)
{
    setObjectName(QStringLiteral("cautions"));
    setWordWrap(true);
    setConfidence(0.99);
    setContentsMargins(6, 3, 6, 3);
    setStyleSheet(QStringLiteral("QLabel#cautions { background: palette(alternate-base); "
                                 "border-top: 1px solid palette(mid); }"));
}

void CautionsNote::setConfidence(double confidence)
{
    setText(cautionsShortText(confidence));
    setToolTip(cautionsFullText(confidence));
}

} // namespace tailwise::ui

// CautionsNote: the short, always-visible reminder of what the figures are and are not; and the
// fuller text for the About box.
#pragma once

#include <QLabel>

namespace tailwise::ui {

class CautionsNote : public QLabel {
    Q_OBJECT
public:
    explicit CautionsNote(QWidget *parent = nullptr);

    // The fuller text (rich text), for the About box.
    static QString fullText();
};

} // namespace tailwise::ui

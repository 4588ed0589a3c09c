// CautionsNote: the short, always-visible reminder of what the figures are and are not; and the
// fuller text for the About box and the PDF report (one wording for both).
#pragma once

#include <QLabel>
#include <QList>

namespace tailwise::ui {

class CautionsNote : public QLabel {
    Q_OBJECT
public:
    explicit CautionsNote(QWidget *parent = nullptr);

    // The fuller text (rich text), for the About box.
    static QString fullText();
    // The same, as titled plain paragraphs (the report sets them itself).
    struct Caution {
        QString title;
        QString text;
    };
    static QList<Caution> cautions();
    // The always-visible line.
    static QString shortText();
};

} // namespace tailwise::ui

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

    // Follows the confidence of the figures: "about once in 40 horizons at 97.5%".
    void setConfidence(double confidence);

    // "once in 40 horizons at 97.5%": 1/(1 − C) rounded to a whole number.
    static QString onceInText(double confidence);
    // The fuller text (rich text), for the About box.
    static QString fullText(double confidence = 0.99);
    // The same, as titled plain paragraphs (the report sets them itself).
    struct Caution {
        QString title;
        QString text;
    };
    static QList<Caution> cautions(double confidence = 0.99);
    // The always-visible line.
    static QString shortText(double confidence = 0.99);
};

} // namespace tailwise::ui

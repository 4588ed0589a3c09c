// CautionsNote: the short, always-visible reminder of what the figures are and are not (its words
// are text/cautions.h's, shared with the About box and the PDF report).
#pragma once

#include <QLabel>

namespace tailwise::ui {

class CautionsNote : public QLabel {
    Q_OBJECT
public:
    explicit CautionsNote(QWidget *parent = nullptr);

    // Follows the confidence of the figures: "about once in 40 horizons at 97.5%".
    void setConfidence(double confidence);
};

} // namespace tailwise::ui

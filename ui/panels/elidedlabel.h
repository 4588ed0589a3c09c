// A one-line label that never asks for more width than it is given: text wider than the label is
// elided at the end (the whole text in the tooltip), so a long workbook title (up to 200
// characters, tailwise/textlimits.h) cannot widen the window beyond the screen.
#pragma once

#include <QLabel>

namespace tailwise::ui {

class ElidedLabel : public QLabel {
    Q_OBJECT
public:
    explicit ElidedLabel(QWidget *parent = nullptr);
    // The whole text; text() is what is shown.
    void setFullText(const QString &text);
    QString fullText() const { return m_full; }
    QSize minimumSizeHint() const override;
    QSize sizeHint() const override;

protected:
    void resizeEvent(QResizeEvent *event) override;

private:
    void elide();
    QString m_full;
};

} // namespace tailwise::ui

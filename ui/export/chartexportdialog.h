// ChartExportDialog: collects how a chart is to be exported — which chart, the size (a preset or
// width × height in mm), the resolution for PNG, the format, the currency for money axes and the
// caption (prefilled from the results in plain words, editable) — with a small preview drawn by
// the same code that writes the file. It writes nothing itself: the caller takes settings().
// Changing the chart writes that chart's caption again, unless the user has edited it.
#pragma once

#include "export/chartrender.h"

#include <QDialog>

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QLineEdit;
class QPlainTextEdit;
class QPushButton;

namespace tailwise::ui {

class ChartExportDialog : public QDialog {
    Q_OBJECT
public:
    ChartExportDialog(const WorkbookResults &results, ChartKind kind, const ChartExportSettings &last,
                      QWidget *parent = nullptr);

    ChartExportSettings settings() const;

    QComboBox *chartChoice() const { return m_chart; }
    QComboBox *sizeChoice() const { return m_size; }
    QComboBox *formatChoice() const { return m_format; }
    QComboBox *dpiChoice() const { return m_dpi; }
    QDoubleSpinBox *widthMm() const { return m_width; }
    QDoubleSpinBox *heightMm() const { return m_height; }
    QPlainTextEdit *captionEdit() const { return m_caption; }
    QLabel *preview() const { return m_preview; }

signals:
    // "Copy" was pressed: put the chart as set on the clipboard.
    void copyRequested(const tailwise::ui::ChartExportSettings &settings);

private:
    void chartChanged();
    void sizeChanged();
    void updatePreview();

    const WorkbookResults &m_results;
    QComboBox *m_chart = nullptr;
    QComboBox *m_size = nullptr;
    QDoubleSpinBox *m_width = nullptr;
    QDoubleSpinBox *m_height = nullptr;
    QComboBox *m_format = nullptr;
    QComboBox *m_dpi = nullptr;
    QLineEdit *m_currency = nullptr;
    QPlainTextEdit *m_caption = nullptr;
    QLabel *m_preview = nullptr;
    QLabel *m_unavailable = nullptr;
    QPushButton *m_save = nullptr;
    bool m_captionEdited = false;
    bool m_settingCaption = false;
};

} // namespace tailwise::ui

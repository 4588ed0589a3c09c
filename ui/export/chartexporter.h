// ChartExporter: the window's Export Chart and Copy Chart commands. It gathers the results the
// workbook's results store has — the report, the backtest and the model comparison when they are
// current (nothing is recomputed on the GUI thread; a part not yet computed is requested, and
// the export says to try again once it is ready) — into WorkbookResults, opens the export dialog
// on the chart it is given (the tab in view), asks for the file and writes it through
// writeChart. It reads no widget. The last settings are kept for the next export of the session.
#pragma once

#include "export/chartrender.h"

#include <QObject>

#include <optional>

class QWidget;

namespace tailwise::ui {

class Workbook;

class ChartExporter : public QObject {
    Q_OBJECT
public:
    ChartExporter(Workbook &workbook, QWidget *window);

    // What the window can export now; nullopt without figures.
    std::optional<WorkbookResults> currentResults() const;

    // Opens the dialog on `kind` (the chart in view), the loss tail in `unit` (as it is shown);
    // writes what the user chose.
    void exportChart(ChartKind kind, LossTailUnit unit);
    // Puts `kind` on the clipboard at the last settings' size and dpi.
    void copyChart(ChartKind kind, LossTailUnit unit);
    // Writes without a dialog (tests); returns the reason when nothing was written.
    QString writeFile(const QString &path, const ChartExportSettings &settings) const;

    const ChartExportSettings &lastSettings() const { return m_last; }

signals:
    void statusMessage(const QString &text);

private:
    void copy(const ChartExportSettings &settings, const WorkbookResults &results);

    Workbook &m_workbook;
    QWidget *m_window;
    ChartExportSettings m_last;
};

} // namespace tailwise::ui

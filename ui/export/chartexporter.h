// ChartExporter: the window's Export Chart and Copy Chart commands. It gathers the results the
// window already has — the workbook's report, the backtest view's finished run, the comparison
// table when it is current (nothing is recomputed on the GUI thread) — into WorkbookResults,
// opens the export dialog on the chart of the tab in view, asks for the file and writes it
// through writeChart. The last settings are kept for the next export of the session.
#pragma once

#include "export/chartrender.h"

#include <QObject>

#include <optional>

class QWidget;

namespace tailwise::ui {

class ChartTabs;
class Workbook;

class ChartExporter : public QObject {
    Q_OBJECT
public:
    ChartExporter(Workbook &workbook, ChartTabs &charts, QWidget *window);

    // What the window can export now; nullopt without figures.
    std::optional<WorkbookResults> currentResults() const;

    // Opens the dialog on the chart in view (or the loss tail); writes what the user chose.
    void exportChart();
    // Puts the chart in view on the clipboard at the last settings' size and dpi.
    void copyChart();
    // Writes without a dialog (tests); returns the reason when nothing was written.
    QString writeFile(const QString &path, const ChartExportSettings &settings) const;

    const ChartExportSettings &lastSettings() const { return m_last; }

signals:
    void statusMessage(const QString &text);

private:
    void copy(const ChartExportSettings &settings, const WorkbookResults &results);

    Workbook &m_workbook;
    ChartTabs &m_charts;
    QWidget *m_window;
    ChartExportSettings m_last;
};

} // namespace tailwise::ui

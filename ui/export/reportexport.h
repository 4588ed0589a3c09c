// A workbook's PDF report in two steps: compute what it shows (any thread, no display needed),
// then write the pages (the thread of the QApplication, which may be offscreen: the charts are
// widgets drawn off-screen, chartrender.h). The window's File ▸ Export Report… and
// `tailwise-cli report` both come here, so they make the same report.
#pragma once

#include "document/workbookcontents.h"
#include "export/workbookresults.h"

#include "tailwise/backtest.h"
#include "tailwise/result.h"

#include <QDate>
#include <QString>

class QIODevice;

#include <utility>
#include <vector>

namespace tailwise::ui {

// Everything the report shows, computed from the workbook's inputs alone.
struct ReportData {
    WorkbookContents contents;
    tailwise::Result<WorkbookResults> results = tailwise::Error{};
    // The backtest settings' further models, each backtested as the first (WorkbookResults has the
    // first); empty when the workbook sets no backtest or only one model.
    std::vector<std::pair<tailwise::RiskModel, tailwise::Result<tailwise::BacktestResult>>> otherBacktests;
};

ReportData computeReportData(WorkbookContents contents);

// Writes the report to `pdfPath`; `workbookName` is the file's name for the page headers.
// Returns the number of pages, or an error naming the file.
tailwise::Result<int> writeReport(const ReportData &data, const QString &workbookName, const QString &pdfPath,
                                  QDate date = QDate::currentDate());
// The same report into `device` (e.g. a buffer for standard output); returns the number of pages.
int writeReport(const ReportData &data, const QString &workbookName, QIODevice &device,
                QDate date = QDate::currentDate());

} // namespace tailwise::ui

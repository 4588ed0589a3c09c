// A workbook's PDF report in two steps: compute what it shows (any thread, no display needed),
// then write the pages (the thread of the QGuiApplication, which may be offscreen). The window's
// File ▸ Export Report… and `tailwise-cli report` both come here, so they make the same report.
#pragma once

#include "document/workbookcontents.h"
#include "reportsections.h"

#include "tailwise/result.h"

#include <QDate>
#include <QString>

namespace tailwise::ui {

// Everything the report shows, computed from the workbook's inputs alone.
struct ReportData {
    WorkbookContents contents;
    tailwise::Result<tailwise::RiskReport> report = tailwise::Error{};
    std::optional<report::BacktestPart> backtest;
    std::optional<tailwise::Result<std::vector<tailwise::ModelRow>>> models;
};

ReportData computeReportData(WorkbookContents contents);

// Writes the report to `pdfPath`; `workbookName` is the file's name for the page headers.
// Returns the number of pages, or an error naming the file.
tailwise::Result<int> writeReport(const ReportData &data, const QString &workbookName, const QString &pdfPath,
                                  QDate date = QDate::currentDate());

} // namespace tailwise::ui

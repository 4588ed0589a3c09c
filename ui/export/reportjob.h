// ReportJob: makes a workbook's PDF report for the window without holding up the GUI thread.
// The figures, backtest and model comparison are computed on a pool thread from a copy of the
// inputs; the pages are then drawn on the GUI thread (reportexport.h). Deletes itself when done.
#pragma once

#include "document/workbookcontents.h"

#include <QObject>
#include <QString>

namespace tailwise::ui {

class ReportJob : public QObject {
    Q_OBJECT
public:
    ReportJob(WorkbookContents contents, QString workbookName, QString pdfPath, QObject *parent = nullptr);
    void start();

signals:
    // `problem` is empty on success; `pages` is the number written.
    void finished(const QString &pdfPath, const QString &problem, int pages);

private:
    WorkbookContents m_contents;
    QString m_workbookName;
    QString m_pdfPath;
};

} // namespace tailwise::ui

#include "reportjob.h"

#include "reportexport.h"

#include <QCoreApplication>
#include <QPointer>
#include <QThreadPool>

#include <memory>

namespace tailwise::ui {

ReportJob::ReportJob(WorkbookContents contents, QString workbookName, QString pdfPath, QObject *parent)
    : QObject(parent), m_contents(std::move(contents)), m_workbookName(std::move(workbookName)),
      m_pdfPath(std::move(pdfPath))
{
}

void ReportJob::start()
{
    QPointer<ReportJob> self(this);
    auto contents = std::make_shared<WorkbookContents>(m_contents);
    QThreadPool::globalInstance()->start([self, contents] {
        auto data = std::make_shared<ReportData>(computeReportData(std::move(*contents)));
        // Back on the GUI thread: the QPointer is only looked at there.
        QMetaObject::invokeMethod(
            QCoreApplication::instance(),
            [self, data] {
                if (!self)
                    return;
                const auto written = writeReport(*data, self->m_workbookName, self->m_pdfPath);
                emit self->finished(self->m_pdfPath,
                                    written ? QString() : QString::fromStdString(written.error().message),
                                    written ? written.value() : 0);
                self->deleteLater();
            },
            Qt::QueuedConnection);
    });
}

} // namespace tailwise::ui

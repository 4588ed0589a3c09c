// The workbook's limits beside the headline: each limit's use and its state in words (bold, never
// colour alone, when one is breached), kept through saving and opening the workbook. The states
// follow tailwise/limits.h (common practice: a warning level below the limit, breached above it).
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "mainwindow.h"

#include "tailwise/limits.h"

#include <QLabel>
#include <QTemporaryDir>
#include <QTest>

using namespace tailwise;
using namespace tailwise::ui;

class TestHeadlineLimits : public QObject {
    Q_OBJECT
private slots:
    void initTestCase()
    {
        QCoreApplication::setOrganizationName(QStringLiteral("TailwiseTests"));
        QCoreApplication::setApplicationName(QStringLiteral("TailwiseWindowTests"));
    }

    void limitsShowBesideTheHeadlineInWords()
    {
        auto contents = loadWorkbook(QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise"));
        QVERIFY(contents.ok());
        // The sample's 10-day 99% VaR is about 5% of its value: over a 1% limit, far under 99%.
        contents.value().limits = {parseLimit("var=1%").value(), parseLimit("es=99%,warn=90%").value()};
        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("limited.tailwise"));
        QVERIFY(saveWorkbook(contents.value(), path).ok());

        MainWindow w;
        QCOMPARE(w.openWorkbookFile(path), QString());
        auto *label = w.findChild<QLabel *>(QStringLiteral("headlineLimits"));
        QVERIFY(label);
        QTRY_VERIFY(label->text().contains(QStringLiteral("BREACHED")));
        QVERIFY2(label->text().contains(QStringLiteral("— ok")), qPrintable(label->text()));
        QVERIFY(label->text().startsWith(QStringLiteral("Limits (one breached)")));
        QVERIFY(label->font().bold());
        QVERIFY(!label->isHidden());

        // Saved from the window and opened again: the limits are kept.
        const QString again = dir.filePath(QStringLiteral("again.tailwise"));
        QCOMPARE(w.saveWorkbookFile(again), QString());
        const auto reread = loadWorkbook(again);
        QVERIFY(reread.ok());
        QCOMPARE(reread.value().limits, contents.value().limits);

        // A workbook without limits shows none.
        QCOMPARE(w.openWorkbookFile(QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise")), QString());
        QTRY_VERIFY(label->isHidden());
    }
};

QTEST_MAIN(TestHeadlineLimits)
#include "test_headlinelimits.moc"

// A save from the window that fails on a full disk — at any point of the file — never looks like
// a save: the message gives the system's reason, the workbook keeps its unsaved mark and its
// contents, and the file saved before is byte-for-byte what it was. The disk is a stub of
// write(2) that fails after a number of bytes (tailwise/filewrite.h's test hook). And no save or
// export replaces a file the workbook was read from.
#include "../fulldiskwrite.h"
#include "document/commands.h"
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "mainwindow.h"
#include "windowfixture.h"

#include "tailwise/filewrite.h"

#include <QFile>
#include <QTemporaryDir>
#include <QTest>

#include <cerrno>

#include <unistd.h>

using namespace tailwise;
using namespace tailwise::ui;
using namespace tailwise::ui::test;

namespace {

using tailwise::test::limitedWrite;

QByteArray readAll(const QString &path)
{
    QFile f(path);
    return f.open(QIODevice::ReadOnly) ? f.readAll() : QByteArray();
}

} // namespace

class TestSaveFailure : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() { isolateSettings(); }

    void fullDiskKeepsTheUnsavedMark()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("fund.tailwise"));
        QVERIFY(w->saveWorkbookFile(path).isEmpty());
        const QByteArray saved = readAll(path);
        edit::setTitle(wb, QStringLiteral("Changed after the save"));
        QVERIFY(wb.isModified());
        const qsizetype size = workbookJson(wb.contents()).value().size();
        testing::setFileWriteFunctions(limitedWrite);
        for (const qsizetype n : {qsizetype(0), qsizetype(1), size / 2, size - 1}) {
            tailwise::test::g_writeBudget = static_cast<std::size_t>(n);
            const QString problem = w->saveWorkbookFile(path);
            QVERIFY2(problem.contains(QStringLiteral("No space left on device")), qPrintable(problem));
            QVERIFY2(problem.contains(path), qPrintable(problem));
            QVERIFY(wb.isModified());
            QCOMPARE(wb.title(), QStringLiteral("Changed after the save"));
            QCOMPARE(readAll(path), saved);
            QCOMPARE(QDir(dir.path()).entryList(QDir::Files | QDir::Hidden).size(), qsizetype(1));
        }
        testing::setFileWriteFunctions(nullptr);
        QVERIFY(w->saveWorkbookFile(path).isEmpty());
        QVERIFY(!wb.isModified());
    }

    // Save As and the exports never replace a file the workbook was read from (the imported CSVs,
    // and for exports the workbook's own file), by name or through a hard link; nothing is written
    // and the workbook keeps its unsaved mark.
    void outputNeverReplacesAnInput()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        QTemporaryDir dir;
        const QString prices = dir.filePath(QStringLiteral("prices.csv"));
        const QString holdings = dir.filePath(QStringLiteral("holdings.csv"));
        QVERIFY(QFile::copy(samplePath("prices.csv"), prices));
        QVERIFY(QFile::copy(samplePath("holdings.csv"), holdings));
        QVERIFY(w->importPriceHistoryFile(prices).isEmpty());
        QVERIFY(w->holdingsEditor()->importHoldingsFile(holdings).isEmpty());
        const QByteArray pricesBefore = readAll(prices), holdingsBefore = readAll(holdings);
        const QString link = dir.filePath(QStringLiteral("another-name.csv"));
        QCOMPARE(::link(QFile::encodeName(prices).constData(), QFile::encodeName(link).constData()), 0);

        for (const QString &target : {prices, holdings, link}) {
            const QString problem = w->saveWorkbookFile(target);
            QVERIFY2(problem.contains(QStringLiteral("would replace")) && problem.contains(target), qPrintable(problem));
            QVERIFY(wb.isModified());
        }
        const QString problem = w->holdingsEditor()->exportHoldingsFile(holdings);
        QVERIFY2(problem.contains(QStringLiteral("would replace")), qPrintable(problem));
        QCOMPARE(readAll(prices), pricesBefore);
        QCOMPARE(readAll(holdings), holdingsBefore);

        // The workbook's own file: Save writes it, an export must not.
        const QString book = dir.filePath(QStringLiteral("fund.tailwise"));
        QVERIFY(w->saveWorkbookFile(book).isEmpty());
        const QByteArray bookBefore = readAll(book);
        QVERIFY(w->holdingsEditor()->exportHoldingsFile(book).contains(QStringLiteral("would replace")));
        QCOMPARE(readAll(book), bookBefore);
        QVERIFY(w->saveWorkbookFile(book).isEmpty());
    }
};

QTEST_MAIN(TestSaveFailure)
#include "test_savefailure.moc"

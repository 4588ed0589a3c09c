// Never losing work: the recovery file (ui/document/recoveryfile.h) is written after the interval
// while there are unsaved changes and only then, reads back to the same workbook, goes away on
// save and clean close; a file left by a session that died (its lock stale) is offered and
// restored as unsaved work titled as its workbook, while a live session's file is never offered
// (leftoverrecovery.h, panels/recoveryoffer.h); a failed save keeps the unsaved work. Offscreen.
//
// The expectations are the behaviour the task asks for (common practice for desktop editors: a
// periodic copy of unsaved work, offered after a crash); no published values are involved.
#include "document/commands.h"
#include "document/leftoverrecovery.h"
#include "document/recoveryfile.h"
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "mainwindow.h"
#include "windowfixture.h"

#include <QAbstractButton>
#include <QApplication>
#include <QDir>
#include <QFile>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLocale>
#include <QLockFile>
#include <QMessageBox>
#include <QProcess>
#include <QSignalSpy>
#include <QStandardPaths>
#include <QStatusBar>
#include <QTemporaryDir>
#include <QTest>
#include <QTimer>
#include <QUndoStack>

using namespace tailwise;
using namespace tailwise::ui;
using namespace tailwise::ui::test;

namespace {

constexpr int kShortIntervalMs = 40;

QByteArray readAll(const QString &path)
{
    QFile f(path);
    return f.open(QIODevice::ReadOnly) ? f.readAll() : QByteArray();
}

// Two contents are the same workbook when they write the same text (the writer stores every input).
QByteArray textOf(const WorkbookContents &c)
{
    const auto json = workbookJson(c);
    return json ? json.value() : QByteArray("refused: ") + json.error().message.c_str();
}

WorkbookContents sampleContents()
{
    auto loaded = loadWorkbook(samplePath("larchmere.tailwise"));
    if (!loaded)
        qFatal("sample workbook: %s", loaded.error().message.c_str());
    return std::move(loaded).value();
}

// What a crash leaves: the recovery file and a lock naming a process that no longer runs. The
// lock is written by QLockFile itself (so it carries this machine's name and boot id) and then
// given the number of a process that has ended.
void leaveStaleLock(const QString &recoveryPath)
{
    const QString lockPath = recoveryPath + QLatin1String(RecoveryFile::lockSuffix);
    QByteArray content;
    {
        QLockFile lock(lockPath);
        QVERIFY(lock.tryLock(0));
        content = readAll(lockPath);
        lock.unlock();
    }
    QProcess gone;
    gone.start(QStringLiteral("sleep"), {QStringLiteral("30")});
    QVERIFY(gone.waitForStarted());
    const qint64 deadPid = gone.processId();
    gone.kill();
    QVERIFY(gone.waitForFinished());
    QList<QByteArray> lines = content.split('\n');
    QVERIFY(lines.size() >= 3);
    lines[0] = QByteArray::number(deadPid);
    QFile out(lockPath);
    QVERIFY(out.open(QIODevice::WriteOnly));
    out.write(lines.join('\n'));
}

} // namespace

class TestRecovery : public QObject {
    Q_OBJECT
private slots:
    void initTestCase()
    {
        isolateSettings();
        // The window's recovery folder (AppLocalDataLocation) goes to a test location, under a
        // home of this run's own, so that runs side by side on one machine never share it.
        QVERIFY(m_home.isValid());
        qputenv("HOME", QFile::encodeName(m_home.path()));
        QStandardPaths::setTestModeEnabled(true);
        QVERIFY(RecoveryFile::defaultFolder().startsWith(m_home.path()));
    }
    void init() { QDir(RecoveryFile::defaultFolder()).removeRecursively(); }
    void cleanupTestCase() { QDir(RecoveryFile::defaultFolder()).removeRecursively(); }

    void writesAfterTheIntervalOnlyWhenModified()
    {
        QTemporaryDir dir;
        Workbook wb;
        wb.resetContents(sampleContents(), QStringLiteral("/somewhere/fund.tailwise"));
        RecoveryFile recovery(wb, dir.path());
        QCOMPARE(recovery.intervalMs(), 60 * 1000); // the default: a minute
        recovery.setIntervalMs(kShortIntervalMs);

        // Clean: nothing is written, however long it waits.
        QTest::qWait(5 * kShortIntervalMs);
        QVERIFY(!QFile::exists(recovery.path()));

        // An edit, then undone before the interval is over: back to the saved state, nothing kept.
        edit::setTitle(wb, QStringLiteral("Changed"));
        wb.undoStack()->undo();
        QTest::qWait(5 * kShortIntervalMs);
        QVERIFY(!QFile::exists(recovery.path()));

        // An edit: not at once, but after the interval.
        QSignalSpy written(&recovery, &RecoveryFile::written);
        Holding h = wb.holdings()[0];
        h.quantity = 4321.5;
        edit::setHolding(wb, 0, h, QStringLiteral("Change quantity"));
        QVERIFY(!QFile::exists(recovery.path()));
        QTRY_VERIFY_WITH_TIMEOUT(QFile::exists(recovery.path()), 5000);
        QCOMPARE(written.count(), 1);
        QVERIFY(recovery.path().startsWith(dir.path()));
        QVERIFY(QFile::exists(recovery.path() + QLatin1String(RecoveryFile::lockSuffix)));

        // No further change, no further write.
        QTest::qWait(5 * kShortIntervalMs);
        QCOMPARE(written.count(), 1);
    }

    void fileReadsBackToTheSameWorkbook()
    {
        QTemporaryDir dir;
        Workbook wb;
        wb.resetContents(sampleContents(), QStringLiteral("/somewhere/fund.tailwise"));
        RecoveryFile recovery(wb, dir.path());
        Assumptions a = wb.assumptions();
        a.confidence = 0.975;
        a.model = RiskModel::Historical;
        edit::setAssumptions(wb, a, QStringLiteral("Change assumptions"));
        edit::setTitle(wb, QStringLiteral("Recovered «fund»"));
        const QDateTime before = QDateTime::currentDateTimeUtc().addSecs(-1);
        QVERIFY(recovery.writeNow());

        // An ordinary workbook file (it opens with File ▸ Open too) holding exactly the edits…
        const auto back = loadWorkbook(recovery.path());
        QVERIFY2(back.ok(), back.ok() ? "" : back.error().message.c_str());
        QCOMPARE(textOf(back.value()), textOf(wb.contents()));
        // …and a note of where it belongs and when it was kept.
        const QJsonObject note = QJsonDocument::fromJson(readAll(recovery.path())).object().value(QStringLiteral("recovery")).toObject();
        QCOMPARE(note.value(QStringLiteral("workbook")).toString(), QStringLiteral("/somewhere/fund.tailwise"));
        const QDateTime saved = QDateTime::fromString(note.value(QStringLiteral("saved")).toString(), Qt::ISODate);
        QVERIFY2(saved.isValid() && saved >= before && saved <= QDateTime::currentDateTimeUtc().addSecs(1),
                 qPrintable(note.value(QStringLiteral("saved")).toString()));
    }

    void saveUndoAndCleanCloseRemoveIt()
    {
        QTemporaryDir dir;
        Workbook wb;
        wb.resetContents(sampleContents(), QString());
        RecoveryFile recovery(wb, dir.path());
        const QString lock = recovery.path() + QLatin1String(RecoveryFile::lockSuffix);

        // Saved: gone, lock and all.
        edit::setTitle(wb, QStringLiteral("One"));
        QVERIFY(recovery.writeNow());
        QVERIFY(QFile::exists(recovery.path()));
        QVERIFY(saveWorkbook(wb.contents(), dir.filePath(QStringLiteral("fund.tailwise"))).ok());
        wb.markSaved(dir.filePath(QStringLiteral("fund.tailwise")));
        QVERIFY(!QFile::exists(recovery.path()));
        QVERIFY(!QFile::exists(lock));

        // Undone back to the saved state: gone.
        edit::setTitle(wb, QStringLiteral("Two"));
        QVERIFY(recovery.writeNow());
        wb.undoStack()->undo();
        QVERIFY(!QFile::exists(recovery.path()));

        // A clean close (the user saved or discarded): gone.
        edit::setTitle(wb, QStringLiteral("Three"));
        QVERIFY(recovery.writeNow());
        recovery.discard();
        QVERIFY(!QFile::exists(recovery.path()));
        QVERIFY(!QFile::exists(lock));
        QCOMPARE(QDir(dir.path()).entryList(QDir::Files | QDir::Hidden),
                 QStringList{QStringLiteral("fund.tailwise")});
    }

    void windowSaveAndCloseRemoveIt()
    {
        QTemporaryDir dir;
        auto w = sampleWindow();
        RecoveryFile &recovery = w->recoveryFile();
        QCOMPARE(recovery.folder(), RecoveryFile::defaultFolder());
        recovery.setIntervalMs(kShortIntervalMs);
        edit::setTitle(w->workbook(), QStringLiteral("Edited"));
        QTRY_VERIFY_WITH_TIMEOUT(QFile::exists(recovery.path()), 5000);
        QCOMPARE(w->saveWorkbookFile(dir.filePath(QStringLiteral("fund.tailwise"))), QString());
        QVERIFY(!QFile::exists(recovery.path()));

        edit::setTitle(w->workbook(), QStringLiteral("Edited again"));
        QVERIFY(recovery.writeNow());
        QCOMPARE(w->saveWorkbookFile(dir.filePath(QStringLiteral("fund.tailwise"))), QString());
        QVERIFY(w->close()); // nothing unsaved: no question
        QVERIFY(QDir(RecoveryFile::defaultFolder()).entryList(QDir::Files | QDir::Hidden).isEmpty());
    }

    void leftoverOfADeadSessionIsOfferedAndRestored()
    {
        // The session that crashed: it had unsaved edits to a workbook with a path.
        const QString original = QDir(QDir::tempPath()).filePath(QStringLiteral("crashed-fund.tailwise"));
        QString leftover;
        QByteArray lostWork;
        {
            Workbook wb;
            wb.resetContents(sampleContents(), original);
            RecoveryFile recovery(wb, RecoveryFile::defaultFolder());
            Holding h = wb.holdings()[2];
            h.quantity = -777.0;
            edit::setHolding(wb, 2, h, QStringLiteral("Change quantity"));
            QVERIFY(recovery.writeNow());
            leftover = recovery.path();
            lostWork = textOf(wb.contents());
        } // the process "dies": the file stays…
        leaveStaleLock(leftover); // …with a lock whose process has gone
        QVERIFY(QFile::exists(leftover));

        // The next start: the window offers it, naming the workbook and the time.
        auto w = std::make_unique<MainWindow>();
        int asked = 0;
        const auto outcome = w->offerRecovery([&](const LeftoverRecovery &offer, int others) {
            ++asked;
            if (offer.workbookPath() != original || others != 0 || !offer.contents().ok()
                || offer.savedAt().secsTo(QDateTime::currentDateTimeUtc()) > 60)
                return RecoveryChoice::Later;
            return RecoveryChoice::Restore;
        });
        QCOMPARE(asked, 1);
        QCOMPARE(outcome.choice, RecoveryChoice::Restore);
        QVERIFY2(!outcome.failed, qPrintable(outcome.message));

        // Restored as unsaved work, titled as the original so that Save writes there.
        Workbook &wb = w->workbook();
        QVERIFY(wb.isModified());
        QCOMPARE(wb.filePath(), original);
        QVERIFY(w->windowTitle().startsWith(QStringLiteral("crashed-fund.tailwise")));
        QVERIFY(w->isWindowModified());
        QCOMPARE(wb.holdings()[2].quantity, -777.0);
        QCOMPARE(textOf(wb.contents()), lostWork);
        // The leftover has gone only because the work is already in this window's own file.
        QVERIFY(!QFile::exists(leftover));
        QVERIFY(!QFile::exists(leftover + QLatin1String(RecoveryFile::lockSuffix)));
        QVERIFY(QFile::exists(w->recoveryFile().path()));
        QCOMPARE(textOf(loadWorkbook(w->recoveryFile().path()).value()), lostWork);
        // Nothing else waits.
        QCOMPARE(w->offerRecovery([](const LeftoverRecovery &, int) { return RecoveryChoice::Restore; }).choice,
                 RecoveryChoice::NothingToRecover);

        // Save writes to the original path and the recovery file goes.
        QCOMPARE(w->saveWorkbookFile(wb.filePath()), QString());
        QVERIFY(!QFile::exists(w->recoveryFile().path()));
        QCOMPARE(textOf(loadWorkbook(original).value()), lostWork);
        QFile::remove(original);
    }

    void laterKeepsItAndDiscardDeletesIt()
    {
        QString leftover;
        {
            Workbook wb;
            wb.resetContents(sampleContents(), QString()); // untitled
            RecoveryFile recovery(wb, RecoveryFile::defaultFolder());
            edit::setTitle(wb, QStringLiteral("Untitled work"));
            QVERIFY(recovery.writeNow());
            leftover = recovery.path();
        }
        leaveStaleLock(leftover);
        auto w = std::make_unique<MainWindow>();
        QString belongsTo = QStringLiteral("not asked");
        QCOMPARE(w->offerRecovery([&](const LeftoverRecovery &offer, int) {
                     belongsTo = offer.workbookPath();
                     return RecoveryChoice::Later;
                 }).choice,
                 RecoveryChoice::Later);
        QCOMPARE(belongsTo, QString()); // untitled
        QVERIFY(QFile::exists(leftover));
        QVERIFY(!w->workbook().isModified()); // the window is as it was
        // Offered again (a later start), then discarded.
        QCOMPARE(w->offerRecovery([](const LeftoverRecovery &, int) { return RecoveryChoice::Discard; }).choice,
                 RecoveryChoice::Discard);
        QVERIFY(!QFile::exists(leftover));
        QVERIFY(!w->workbook().isModified());
    }

    void restoredUntitledWorkStaysUntitled()
    {
        QString leftover;
        {
            Workbook wb;
            wb.resetContents(sampleContents(), QString());
            RecoveryFile recovery(wb, RecoveryFile::defaultFolder());
            edit::setTitle(wb, QStringLiteral("Never saved"));
            QVERIFY(recovery.writeNow());
            leftover = recovery.path();
        }
        leaveStaleLock(leftover);
        auto w = std::make_unique<MainWindow>();
        QCOMPARE(w->offerRecovery([](const LeftoverRecovery &, int) { return RecoveryChoice::Restore; }).choice,
                 RecoveryChoice::Restore);
        QVERIFY(w->workbook().isModified());
        QCOMPARE(w->workbook().filePath(), QString());
        QCOMPARE(w->workbook().title(), QStringLiteral("Never saved"));
        QVERIFY(w->windowTitle().startsWith(QStringLiteral("Untitled")));
    }

    // The dialog itself: it names the workbook, the time and what the copy holds, and each
    // button gives its answer. Answered here by a timer that finds the dialog and clicks.
    void dialogSaysWhatWasKeptAndWhen()
    {
        const QString original = QDir(QDir::tempPath()).filePath(QStringLiteral("dialog-fund.tailwise"));
        QString leftoverPath;
        {
            Workbook wb;
            wb.resetContents(sampleContents(), original);
            RecoveryFile recovery(wb, RecoveryFile::defaultFolder());
            edit::setTitle(wb, QStringLiteral("Larchmere, edited"));
            QVERIFY(recovery.writeNow());
            leftoverPath = recovery.path();
        }
        leaveStaleLock(leftoverPath);
        const auto leftover = LeftoverRecovery::claimNewest(RecoveryFile::defaultFolder());
        QVERIFY(leftover);
        QCOMPARE(leftover->path(), leftoverPath);

        auto answerWith = [](const QString &button, QString *text, bool *restoreEnabled) {
            QTimer::singleShot(0, [=] {
                auto *box = qobject_cast<QMessageBox *>(QApplication::activeModalWidget());
                if (!box)
                    return;
                *text = box->text() + QLatin1Char('\n') + box->informativeText();
                for (QAbstractButton *b : box->buttons()) {
                    if (b->text() == QStringLiteral("Restore"))
                        *restoreEnabled = b->isEnabled();
                }
                for (QAbstractButton *b : box->buttons())
                    if (b->text() == button)
                        b->click();
            });
        };
        QString text;
        bool restoreEnabled = false;
        answerWith(QStringLiteral("Decide Later"), &text, &restoreEnabled);
        QCOMPARE(askAboutRecovery(nullptr, *leftover, 2), RecoveryChoice::Later);
        const QString when = QLocale().toString(leftover->savedAt().toLocalTime(), QLocale::LongFormat);
        for (const QString &part : {QStringLiteral("did not close normally"), QStringLiteral("dialog-fund.tailwise"), when,
                                    QStringLiteral("“Larchmere, edited”, has 13 holdings"),
                                    QStringLiteral("Save writes them to ") + QDir::toNativeSeparators(original),
                                    QStringLiteral("Other kept copies waiting for a later start: 2")})
            QVERIFY2(text.contains(part), qPrintable(QStringLiteral("\"%1\" not in: %2").arg(part, text)));
        QVERIFY(restoreEnabled);
        answerWith(QStringLiteral("Restore"), &text, &restoreEnabled);
        QCOMPARE(askAboutRecovery(nullptr, *leftover, 0), RecoveryChoice::Restore);
        answerWith(QStringLiteral("Discard"), &text, &restoreEnabled);
        QCOMPARE(askAboutRecovery(nullptr, *leftover, 0), RecoveryChoice::Discard);
        QVERIFY(QFile::exists(leftoverPath)); // the dialog only asks; acting is offerRecovery's

        // The original saved after the copy was kept: the dialog says so.
        {
            QFile f(original);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("{}");
            QVERIFY(f.setFileTime(leftover->savedAt().addSecs(30), QFileDevice::FileModificationTime));
        }
        answerWith(QStringLiteral("Decide Later"), &text, &restoreEnabled);
        askAboutRecovery(nullptr, *leftover, 0);
        QVERIFY2(text.contains(QStringLiteral("was saved after this copy was kept")), qPrintable(text));
        QFile::remove(original);
    }

    void liveSessionIsNotOffered()
    {
        // Another window, still running, with unsaved work in its recovery file.
        Workbook other;
        other.resetContents(sampleContents(), QString());
        RecoveryFile otherRecovery(other, RecoveryFile::defaultFolder());
        edit::setTitle(other, QStringLiteral("Still open elsewhere"));
        QVERIFY(otherRecovery.writeNow());

        auto w = std::make_unique<MainWindow>();
        bool asked = false;
        const auto outcome = w->offerRecovery([&](const LeftoverRecovery &, int) {
            asked = true;
            return RecoveryChoice::Restore;
        });
        QVERIFY(!asked);
        QCOMPARE(outcome.choice, RecoveryChoice::NothingToRecover);
        QVERIFY(QFile::exists(otherRecovery.path()));
        QVERIFY(!LeftoverRecovery::claimNewest(RecoveryFile::defaultFolder()));
        // Its lock is not taken for stale however long it has been held (stale time 0).
        QLockFile probe(otherRecovery.path() + QLatin1String(RecoveryFile::lockSuffix));
        probe.setStaleLockTime(1);
        QTest::qWait(20);
        QVERIFY(!probe.tryLock(0));
    }

    void unreadableLeftoverCannotBeRestored()
    {
        QDir().mkpath(RecoveryFile::defaultFolder());
        const QString broken = QDir(RecoveryFile::defaultFolder()).filePath(QStringLiteral("unsaved-broken.tailwise"));
        {
            QFile f(broken);
            QVERIFY(f.open(QIODevice::WriteOnly));
            f.write("{\"kind\": \"tailwise-workbook\", \"format\": 1, \"prices\": {"); // cut short
        }
        auto w = std::make_unique<MainWindow>();
        QString problem;
        const auto outcome = w->offerRecovery([&](const LeftoverRecovery &offer, int) {
            problem = offer.contents().ok() ? QString() : QString::fromStdString(offer.contents().error().message);
            return RecoveryChoice::Restore; // the dialog disables Restore; asked anyway, it refuses
        });
        QVERIFY2(problem.contains(QStringLiteral("unsaved-broken.tailwise")), qPrintable(problem));
        QVERIFY(outcome.failed);
        QVERIFY(QFile::exists(broken)); // never deleted without the user's word
        QVERIFY(!w->workbook().isModified());
    }

    void writeFailureIsReportedOnce()
    {
        // A folder that cannot be made (a file stands where it would be), even for root.
        QTemporaryDir dir;
        const QString blocker = dir.filePath(QStringLiteral("blocker"));
        {
            QFile f(blocker);
            QVERIFY(f.open(QIODevice::WriteOnly));
        }
        Workbook wb;
        wb.resetContents(sampleContents(), QString());
        RecoveryFile recovery(wb, blocker + QStringLiteral("/recovery"));
        QSignalSpy failed(&recovery, &RecoveryFile::writeFailed);
        edit::setTitle(wb, QStringLiteral("One"));
        QVERIFY(!recovery.writeNow());
        edit::setTitle(wb, QStringLiteral("Two"));
        QVERIFY(!recovery.writeNow());
        QVERIFY(!recovery.writeNow());
        QCOMPARE(failed.count(), 1);
        QVERIFY2(failed.at(0).at(0).toString().contains(QStringLiteral("blocker")), qPrintable(failed.at(0).at(0).toString()));
    }

    void windowShowsAWriteFailureOnTheStatusLine()
    {
        QTemporaryDir dir;
        const QString blocker = dir.filePath(QStringLiteral("blocker"));
        {
            QFile f(blocker);
            QVERIFY(f.open(QIODevice::WriteOnly));
        }
        // The window's folder is the test location; put a file where the folder would be.
        QDir().mkpath(QFileInfo(RecoveryFile::defaultFolder()).absolutePath());
        QVERIFY(QFile::copy(blocker, RecoveryFile::defaultFolder()));
        auto w = sampleWindow();
        w->recoveryFile().setIntervalMs(kShortIntervalMs);
        edit::setTitle(w->workbook(), QStringLiteral("Edited"));
        QTRY_VERIFY_WITH_TIMEOUT(w->statusBar()->currentMessage().contains(QStringLiteral("could not be kept for recovery")), 5000);
        QFile::remove(RecoveryFile::defaultFolder());
    }

    // A failed save keeps the unsaved work (and says why): a path that cannot be written even by
    // root (inside /proc), and a workbook whose folder does not exist on this machine.
    void failedSaveKeepsTheUnsavedWork()
    {
        auto w = sampleWindow();
        Workbook &wb = w->workbook();
        edit::setTitle(wb, QStringLiteral("Work in progress"));
        const QByteArray before = textOf(wb.contents());
        for (const QString &path : {QStringLiteral("/proc/self/no-place-for.tailwise"),
                                    QStringLiteral("/home/someone-else/Funds/2026/fund.tailwise")}) {
            const QString problem = w->saveWorkbookFile(path);
            QVERIFY2(problem.contains(path) && problem.contains(QStringLiteral("not saved")), qPrintable(problem));
            QVERIFY(wb.isModified());
            QVERIFY(wb.filePath().isEmpty());
            QCOMPARE(textOf(wb.contents()), before);
        }
    }

private:
    QTemporaryDir m_home;
};

QTEST_MAIN(TestRecovery)
#include "test_recovery.moc"

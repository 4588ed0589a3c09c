#include "recoveryfile.h"

#include "workbook.h"
#include "workbookfile.h"

#include <QDateTime>
#include <QDir>
#include <QFile>
#include <QJsonObject>
#include <QLockFile>
#include <QRandomGenerator>
#include <QStandardPaths>
#include <QTimer>
#include <QUndoStack>

namespace tailwise::ui {

QString RecoveryFile::defaultFolder()
{
    return QStandardPaths::writableLocation(QStandardPaths::AppLocalDataLocation) + QStringLiteral("/recovery");
}

RecoveryFile::RecoveryFile(Workbook &workbook, QString folder, QObject *parent)
    : QObject(parent), m_workbook(workbook), m_folder(std::move(folder)), m_timer(new QTimer(this))
{
    // A readable name (when the session started) and a random part, so that two windows started
    // in the same second never share a file.
    const QString stamp = QDateTime::currentDateTimeUtc().toString(QStringLiteral("yyyyMMdd-hhmmss"));
    const QString random = QString::number(QRandomGenerator::global()->generate(), 16).rightJustified(8, QLatin1Char('0'));
    m_path = QDir(m_folder).filePath(QStringLiteral("unsaved-%1-%2.%3").arg(stamp, random, QLatin1String(workbookSuffix)));

    m_timer->setSingleShot(true);
    m_timer->setInterval(defaultIntervalMs);
    connect(m_timer, &QTimer::timeout, this, [this] { writeNow(); });
    // Every edit moves the undo stack; opening, New and restoring reset the contents.
    const auto edits = connect(m_workbook.undoStack(), &QUndoStack::indexChanged, this, &RecoveryFile::changed);
    // The workbook may go first (both are children of the window, the workbook made first): its
    // undo stack, deleted after it, must not call back into a workbook that is no more.
    connect(&m_workbook, &QObject::destroyed, this, [this, edits] {
        disconnect(edits);
        m_timer->stop();
        m_workbookGone = true;
    });
    connect(&m_workbook, &Workbook::contentsReset, this, &RecoveryFile::changed);
    connect(&m_workbook, &Workbook::modifiedChanged, this, &RecoveryFile::modifiedChanged);
}

RecoveryFile::~RecoveryFile() = default; // m_lock's destructor releases the lock; the file stays

int RecoveryFile::intervalMs() const { return m_timer->interval(); }

void RecoveryFile::setIntervalMs(int ms) { m_timer->setInterval(ms); }

void RecoveryFile::changed()
{
    if (m_workbookGone || !m_workbook.isModified())
        return;
    m_pending = true;
    if (!m_timer->isActive())
        m_timer->start();
}

void RecoveryFile::modifiedChanged(bool modified)
{
    if (modified) {
        changed();
        return;
    }
    // What is on screen is what is in the workbook's file (or nothing worth keeping).
    m_timer->stop();
    m_pending = false;
    discard();
}

bool RecoveryFile::takeLock()
{
    if (m_lock && m_lock->isLocked())
        return true;
    if (!QDir().mkpath(m_folder))
        return false;
    m_lock = std::make_unique<QLockFile>(m_path + QLatin1String(lockSuffix));
    m_lock->setStaleLockTime(0);
    return m_lock->tryLock(0);
}

bool RecoveryFile::writeNow()
{
    m_timer->stop();
    if (m_workbookGone || !m_workbook.isModified())
        return true;
    QString problem;
    if (!takeLock()) {
        problem = tr("%1: the recovery folder cannot be written").arg(QDir::toNativeSeparators(m_folder));
    } else {
        QJsonObject note;
        note[QLatin1String(noteWorkbook)] = m_workbook.filePath();
        note[QLatin1String(noteSaved)] = QDateTime::currentDateTimeUtc().toString(Qt::ISODate);
        const Status saved = saveWorkbook(m_workbook.contents(), m_path, QJsonObject{{QLatin1String(noteKey), note}});
        if (!saved)
            problem = QString::fromStdString(saved.error().message);
    }
    if (!problem.isEmpty()) {
        if (!m_failing)
            emit writeFailed(tr("Unsaved changes could not be kept for recovery: %1").arg(problem));
        m_failing = true;
        m_timer->start(); // try again one interval later (a disk may have room again)
        return false;
    }
    m_failing = false;
    m_pending = false;
    m_written = true;
    emit written(m_path);
    return true;
}

void RecoveryFile::discard()
{
    m_timer->stop();
    if (m_written)
        QFile::remove(m_path);
    m_written = false;
    if (m_lock)
        m_lock->unlock(); // removes the lock file
    m_lock.reset();
}

} // namespace tailwise::ui

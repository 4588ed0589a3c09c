// RecoveryFile: this window's copy of unsaved work, so that a crash or a killed process loses at
// most a minute of it.
//
// While the workbook has unsaved changes, the whole workbook is written, in the workbook format
// (workbookfile.h) and atomically, to a file of its own in the recovery folder, one interval
// (60 s) after the first change not yet written; the timer is not restarted by further edits, so
// steady editing is still written once a minute. The file carries a note of where the work
// belongs (a top-level "recovery" key, which workbook readers ignore, so the file also opens
// with File ▸ Open):
//   "recovery": {"workbook": "/abs/path.tailwise" or "" (untitled), "saved": "2026-12-01T22:30:00Z"}
// The file is removed as soon as the workbook has no unsaved changes (saved, undone back to the
// saved state, replaced by New or Open after the user discarded the changes) and by discard() on a
// clean close. It stays when the process ends any other way; the next start finds it
// (leftoverrecovery.h) and offers it.
//
// A lock (QLockFile, "<file>.lock", held while the file exists) tells other running windows that
// this file belongs to a live session, so they never take it for the remains of a crash. Its
// stale time is 0: only a lock whose process is gone is stale, however long a window stays open.
//
// A write that fails (folder not writable, disk full) is reported once through writeFailed()
// until a write succeeds again: a status line, never a dialog at every interval.
#pragma once

#include <QObject>
#include <QString>

#include <memory>

class QLockFile;
class QTimer;

namespace tailwise::ui {

class Workbook;

class RecoveryFile : public QObject {
    Q_OBJECT
public:
    static constexpr int defaultIntervalMs = 60 * 1000;
    // The folder of recovery files: QStandardPaths::AppLocalDataLocation/recovery (tests redirect
    // it with QStandardPaths::setTestModeEnabled, or pass their own folder).
    static QString defaultFolder();
    // The note's key, and its fields, in a recovery file (shared with leftoverrecovery.cpp).
    static constexpr const char *noteKey = "recovery";
    static constexpr const char *noteWorkbook = "workbook";
    static constexpr const char *noteSaved = "saved";
    static constexpr const char *lockSuffix = ".lock";

    explicit RecoveryFile(Workbook &workbook, QString folder = defaultFolder(), QObject *parent = nullptr);
    // Keeps a written file (the work was neither saved nor discarded) and releases its lock, so
    // that the next start offers it.
    ~RecoveryFile() override;

    QString folder() const { return m_folder; }
    // This session's file (written or not): unsaved-<time>-<random>.tailwise in folder().
    QString path() const { return m_path; }
    bool isWritten() const { return m_written; }

    int intervalMs() const;
    void setIntervalMs(int ms);

    // Writes the unsaved work now (no-op, true, when there is none); false when it failed.
    bool writeNow();
    // Removes the file and its lock: the user closed the window with nothing left to keep.
    void discard();

signals:
    void written(const QString &path);
    // The first failure after a success (or after the start); `message` names the file and why.
    void writeFailed(const QString &message);

private:
    void changed();
    void modifiedChanged(bool modified);
    bool takeLock();

    Workbook &m_workbook;
    QString m_folder;
    QString m_path;
    QTimer *m_timer = nullptr;
    std::unique_ptr<QLockFile> m_lock;
    bool m_written = false;   // the file exists (this session wrote it)
    bool m_pending = false;   // changes since the last write
    bool m_failing = false;   // the last write failed (and was reported)
    bool m_workbookGone = false;
};

} // namespace tailwise::ui

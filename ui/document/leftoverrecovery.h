// LeftoverRecovery: a recovery file (recoveryfile.h) left behind by a session that did not close
// cleanly — the process crashed, was killed, or the machine stopped — found at the next start.
//
// A file counts as left over when its lock can be taken: no running process holds it (QLockFile,
// stale time 0, so a lock is stale only when its process is gone). The claim keeps the lock
// while the user decides, so a second window starting at the same moment does not offer the
// same work twice; a file whose lock a running window holds is never offered.
//
#pragma once

#include "workbookcontents.h"

#include "tailwise/result.h"

#include <QDateTime>
#include <QString>

#include <memory>

class QLockFile;

namespace tailwise::ui {

class RecoveryFile;
class Workbook;

class LeftoverRecovery {
public:
    // The newest left-over recovery file in `folder`, claimed by this process; nullptr when there
    // is none. `othersLeft` (optional) receives how many more are waiting.
    static std::unique_ptr<LeftoverRecovery> claimNewest(const QString &folder, int *othersLeft = nullptr);

    // Releases the claim and keeps the file: it is offered again at the next start.
    ~LeftoverRecovery();
    LeftoverRecovery(const LeftoverRecovery &) = delete;
    LeftoverRecovery &operator=(const LeftoverRecovery &) = delete;

    QString path() const { return m_path; }
    // Where the work belongs: the workbook's absolute path when it had one, empty when untitled.
    QString workbookPath() const { return m_workbookPath; }
    // When the work was written (from the file's note; its modification time when there is none).
    QDateTime savedAt() const { return m_savedAt; }
    // The work itself, or why the file cannot be read.
    const tailwise::Result<WorkbookContents> &contents() const { return m_contents; }

    // Deletes the file and releases the claim (the user discarded the work).
    void remove();
    // Puts the work into `workbook` as unsaved changes titled as workbookPath(), writes it at once
    // to this window's own recovery file, and only then deletes the left-over one (if that write
    // fails, the left-over file stays, so the work is never in no file at all). Refuses, and
    // changes nothing, when the file cannot be read.
    tailwise::Status restoreInto(Workbook &workbook, RecoveryFile &ownFile);

private:
    LeftoverRecovery(QString path, std::unique_ptr<QLockFile> lock);
    void release();

    QString m_path;
    std::unique_ptr<QLockFile> m_lock;
    QString m_workbookPath;
    QDateTime m_savedAt;
    tailwise::Result<WorkbookContents> m_contents;
};

} // namespace tailwise::ui

#include "leftoverrecovery.h"

#include "recoveryfile.h"
#include "workbook.h"
#include "workbookfile.h"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLockFile>

namespace tailwise::ui {

namespace {

// The lock of `path` when no running process holds it, else nullptr.
std::unique_ptr<QLockFile> claim(const QString &path)
{
    auto lock = std::make_unique<QLockFile>(path + QLatin1String(RecoveryFile::lockSuffix));
    lock->setStaleLockTime(0); // as the writer: stale only when its process is gone
    if (!lock->tryLock(0))
        return nullptr;
    return lock;
}

} // namespace

LeftoverRecovery::LeftoverRecovery(QString path, std::unique_ptr<QLockFile> lock)
    : m_path(std::move(path)), m_lock(std::move(lock)), m_contents(loadWorkbook(m_path))
{
    m_savedAt = QFileInfo(m_path).lastModified().toUTC();
    QFile file(m_path);
    if (!file.open(QIODevice::ReadOnly))
        return;
    const QJsonObject note = QJsonDocument::fromJson(file.readAll()).object().value(QLatin1String(RecoveryFile::noteKey)).toObject();
    m_workbookPath = note.value(QLatin1String(RecoveryFile::noteWorkbook)).toString();
    const QDateTime saved = QDateTime::fromString(note.value(QLatin1String(RecoveryFile::noteSaved)).toString(), Qt::ISODate);
    if (saved.isValid())
        m_savedAt = saved.toUTC();
}

LeftoverRecovery::~LeftoverRecovery() = default; // the lock's destructor releases the claim

std::unique_ptr<LeftoverRecovery> LeftoverRecovery::claimNewest(const QString &folder, int *othersLeft)
{
    if (othersLeft)
        *othersLeft = 0;
    const QFileInfoList files = QDir(folder).entryInfoList(
        {QStringLiteral("unsaved-*.") + QLatin1String(workbookSuffix)}, QDir::Files, QDir::Time);
    std::unique_ptr<LeftoverRecovery> newest;
    for (const QFileInfo &file : files) {
        auto lock = claim(file.absoluteFilePath());
        if (!lock)
            continue; // a running window's own file
        if (!newest) {
            newest.reset(new LeftoverRecovery(file.absoluteFilePath(), std::move(lock)));
        } else if (othersLeft) {
            ++*othersLeft; // counted, and released at once: it waits for a later start
        }
    }
    return newest;
}

void LeftoverRecovery::release()
{
    if (m_lock)
        m_lock->unlock();
    m_lock.reset();
}

void LeftoverRecovery::remove()
{
    QFile::remove(m_path);
    release();
}

Status LeftoverRecovery::restoreInto(Workbook &workbook, RecoveryFile &ownFile)
{
    if (!m_contents)
        return m_contents.error();
    workbook.restoreUnsaved(m_contents.value(), m_workbookPath);
    if (ownFile.writeNow())
        remove();
    return Done{};
}

} // namespace tailwise::ui

#include "recoveryoffer.h"

#include "document/leftoverrecovery.h"
#include "document/recoveryfile.h"
#include "document/workbook.h"

#include <QCoreApplication>
#include <QDir>
#include <QFileInfo>
#include <QLocale>
#include <QMessageBox>
#include <QPushButton>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("RecoveryOffer", text); }

QString workbookName(const LeftoverRecovery &leftover)
{
    return leftover.workbookPath().isEmpty() ? tr("an untitled workbook")
                                             : QFileInfo(leftover.workbookPath()).fileName();
}

// What the user should know about the original file before choosing: it may have been saved
// since (from another window, after this copy was kept), or its folder may not be on this machine.
QString whereItGoes(const LeftoverRecovery &leftover)
{
    const QString path = leftover.workbookPath();
    if (path.isEmpty())
        return {};
    const QFileInfo file(path);
    if (!file.absoluteDir().exists())
        return QLatin1Char(' ') + tr("Its folder is not there now: use Save As to choose another place.");
    if (file.exists() && file.lastModified().toUTC() > leftover.savedAt())
        return QLatin1Char(' ')
            + tr("Note: %1 was saved after this copy was kept (at %2); restoring brings back the older work.")
                  .arg(file.fileName(), QLocale().toString(file.lastModified(), QLocale::ShortFormat));
    return {};
}

} // namespace

RecoveryChoice askAboutRecovery(QWidget *parent, const LeftoverRecovery &leftover, int othersWaiting)
{
    QMessageBox box(parent);
    box.setIcon(QMessageBox::Question);
    box.setWindowTitle(tr("Recover Unsaved Work"));
    const QString when = QLocale().toString(leftover.savedAt().toLocalTime(), QLocale::LongFormat);
    box.setTextFormat(Qt::PlainText); // file names and titles are shown as they are
    box.setText(tr("Tailwise did not close normally. Unsaved changes to %1 were kept at %2.")
                    .arg(workbookName(leftover), when));
    QString details;
    if (leftover.contents()) {
        // What the copy holds, so that the user can tell one piece of work from another.
        const WorkbookContents &kept = leftover.contents().value();
        const int holdings = static_cast<int>(kept.holdings.size());
        const QString count = holdings == 1 ? tr("1 holding") : tr("%1 holdings").arg(QLocale().toString(holdings));
        details = kept.title.isEmpty() ? tr("The kept copy has %1.").arg(count)
                                       : tr("The kept copy, “%1”, has %2.").arg(kept.title, count);
        details += QLatin1Char(' ');
        details += leftover.workbookPath().isEmpty()
            ? tr("Restore opens them as a new, unsaved workbook.")
            : tr("Restore opens them as unsaved changes; Save writes them to %1.")
                  .arg(QDir::toNativeSeparators(leftover.workbookPath()));
        details += whereItGoes(leftover);
        details += QLatin1Char(' ') + tr("Discard deletes the kept copy. Decide Later keeps it and asks again at the next start.");
    } else {
        details = tr("The kept copy cannot be read: %1").arg(QString::fromStdString(leftover.contents().error().message));
    }
    if (othersWaiting > 0)
        details += QLatin1Char(' ') + tr("Other kept copies waiting for a later start: %1.").arg(othersWaiting);
    box.setInformativeText(details);
    QPushButton *restore = box.addButton(tr("Restore"), QMessageBox::AcceptRole);
    QPushButton *discard = box.addButton(tr("Discard"), QMessageBox::DestructiveRole);
    QPushButton *later = box.addButton(tr("Decide Later"), QMessageBox::RejectRole);
    restore->setEnabled(leftover.contents().ok());
    box.setDefaultButton(leftover.contents() ? restore : later);
    box.setEscapeButton(later);
    box.exec();
    if (box.clickedButton() == restore)
        return RecoveryChoice::Restore;
    if (box.clickedButton() == discard)
        return RecoveryChoice::Discard;
    return RecoveryChoice::Later;
}

RecoveryOutcome offerRecovery(Workbook &workbook, RecoveryFile &ownFile, const RecoveryQuestion &ask,
                              const std::function<bool()> &mayReplace)
{
    int others = 0;
    const auto leftover = LeftoverRecovery::claimNewest(ownFile.folder(), &others);
    if (!leftover)
        return {};
    RecoveryOutcome outcome;
    outcome.choice = ask(*leftover, others);
    switch (outcome.choice) {
    case RecoveryChoice::Restore: {
        if (workbook.isModified() && mayReplace && !mayReplace()) {
            outcome.choice = RecoveryChoice::Later;
            outcome.message = tr("The kept unsaved work stays for the next start.");
            break;
        }
        if (const Status restored = leftover->restoreInto(workbook, ownFile); !restored) {
            outcome.failed = true;
            outcome.message = QString::fromStdString(restored.error().message);
            break;
        }
        outcome.message = tr("Restored unsaved changes to %1; save them to keep them.").arg(workbookName(*leftover));
        break;
    }
    case RecoveryChoice::Discard:
        leftover->remove();
        outcome.message = tr("Discarded the kept unsaved changes to %1.").arg(workbookName(*leftover));
        break;
    case RecoveryChoice::Later:
        outcome.message = tr("The kept unsaved work stays for the next start.");
        break;
    case RecoveryChoice::NothingToRecover: break;
    }
    return outcome;
}

} // namespace tailwise::ui

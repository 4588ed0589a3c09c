// The offer, at start, to bring back work that a session which did not close cleanly left in its
// recovery file (leftoverrecovery.h): a question naming the workbook and when the work was
// kept — Restore, Discard or Decide Later — and what follows from the answer.
//
// The question is injectable (tests answer it without a dialog), and the window asks only when
// it is started for a person (main.cpp), never for --screenshot or in the tests' windows.
#pragma once

#include <QString>

#include <functional>

class QWidget;

namespace tailwise::ui {

class LeftoverRecovery;
class RecoveryFile;
class Workbook;

enum class RecoveryChoice {
    NothingToRecover, // no left-over file (nothing was asked)
    Restore,          // the work becomes the window's unsaved workbook; the left-over file goes
    Discard,          // the left-over file is deleted
    Later,            // the file stays and is offered again at the next start
};

using RecoveryQuestion = std::function<RecoveryChoice(const LeftoverRecovery &leftover, int othersWaiting)>;

// The dialog: when the work was kept, which workbook it belongs to, the three answers (Restore
// disabled, with the reason, when the file cannot be read).
RecoveryChoice askAboutRecovery(QWidget *parent, const LeftoverRecovery &leftover, int othersWaiting);

struct RecoveryOutcome {
    RecoveryChoice choice = RecoveryChoice::NothingToRecover;
    QString message; // for the status line (what was done), or the reason a restore failed
    bool failed = false;
};

// Claims the newest left-over file in ownFile.folder(), asks `ask`, and acts on the answer.
// `mayReplace` is asked before a restore replaces unsaved work already in the window (it may ask
// the user to save it); false turns the answer into Later.
RecoveryOutcome offerRecovery(Workbook &workbook, RecoveryFile &ownFile, const RecoveryQuestion &ask,
                              const std::function<bool()> &mayReplace);

} // namespace tailwise::ui

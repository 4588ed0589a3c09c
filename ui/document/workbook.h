// Workbook: the one document of the window. It owns the inputs (price history, holdings,
// assumptions, title), the undo stack and its results store (results(): every computed figure,
// resultsstore.h), and says precisely what changed through specific signals. Panels get it
// passed in; there is no global instance.
//
// Who changes what:
//   - user edits go through the free functions in commands.h, which push undo commands; the
//     commands call the apply*() mutators below (and nothing else should);
//   - opening a file or "New" calls resetContents(), which also clears the undo stack;
//   - the ResultsStore (resultsstore.h) listens to the signals and computes the figures.
#pragma once

#include "workbookcontents.h"

#include "tailwise/assumptions.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"

#include <QObject>
#include <QString>
#include <QStringList>

#include <optional>

class QUndoStack;

namespace tailwise::ui {

class ResultsStore;

class Workbook : public QObject {
    Q_OBJECT
public:
    explicit Workbook(QObject *parent = nullptr);
    ~Workbook() override;

    const WorkbookContents &contents() const { return m_contents; }
    const tailwise::PriceHistory &prices() const { return m_contents.prices; }
    const tailwise::Holdings &holdings() const { return m_contents.holdings; }
    const tailwise::Assumptions &assumptions() const { return m_contents.assumptions; }
    const std::vector<tailwise::StressScenario> &scenarios() const { return m_contents.scenarios; }
    QString title() const { return m_contents.title; }
    QString currency() const { return m_contents.currency; } // e.g. "EUR"; empty: not stated
    // The stored backtest settings, or the defaults when the workbook has none.
    BacktestSettings backtestSettings() const { return m_contents.backtest.value_or(BacktestSettings{}); }
    bool hasPrices() const { return m_contents.prices.dayCount() > 0; }

    QUndoStack *undoStack() const { return m_undo; }
    QString filePath() const { return m_filePath; }
    void setFilePath(const QString &path);
    // Unsaved changes: the undo stack is away from its clean state (or contents were reset
    // from something that is not a file).
    bool isModified() const;
    void markSaved(const QString &path);
    // The files this workbook's contents were imported from since it was opened or made (price
    // and holdings CSVs), and those plus its own file: an output of the window must replace none
    // of them (savefile.h, refusalToOverwriteInput). Cleared by resetContents().
    void noteImportedFrom(const QString &path);
    QStringList importedFiles() const { return m_importedFrom; }
    QStringList inputFiles() const;

    // Every figure computed from this workbook, with its state (resultsstore.h).
    ResultsStore &results() const { return *m_results; }
    // Incremented whenever an input of the figures (prices, holdings, assumptions) changes.
    quint64 inputGeneration() const { return m_generation; }

    // Replaces everything (open, new). Clears the undo stack. `fromFile` is empty for a new
    // document.
    void resetContents(WorkbookContents contents, const QString &fromFile);
    // Replaces everything with work that was never saved (a recovery file, recoveryfile.h): the
    // workbook is modified, and titled as `belongsTo` (empty: untitled) so that Save writes there.
    void restoreUnsaved(WorkbookContents contents, const QString &belongsTo);

    // --- Mutators for undo commands (commands.cpp) only. ---
    void applyHolding(int row, const tailwise::Holding &holding);
    void applyInsertHoldings(int row, const tailwise::Holdings &holdings);
    void applyRemoveHoldings(int row, int count);
    void applyHoldings(const tailwise::Holdings &holdings);
    void applyAssumptions(const tailwise::Assumptions &assumptions);
    void applyPrices(const tailwise::PriceHistory &prices);
    // The title only names the workbook, so it changes no input generation (nothing recomputes).
    void applyTitle(const QString &title);
    // The currency only labels figures, so it changes no input generation (nothing recomputes).
    void applyCurrency(const QString &currency);
    // Scenarios do not feed the risk figures, so they change no input generation.
    void applyScenarios(const std::vector<tailwise::StressScenario> &scenarios);
    void applyBacktestSettings(const std::optional<BacktestSettings> &settings);

signals:
    void pricesChanged();
    void holdingEdited(int row);
    void holdingsAboutToBeInserted(int first, int count);
    void holdingsInserted();
    void holdingsAboutToBeRemoved(int first, int count);
    void holdingsRemoved();
    void holdingsAboutToBeReset();
    void holdingsReset();
    void assumptionsChanged();
    void titleChanged();
    void currencyChanged(); // also after resetContents()
    void scenariosChanged();
    // The backtest's own settings changed (not an input of the headline figures, so no
    // inputsChanged: the backtest runner listens to both).
    void backtestSettingsChanged();
    void contentsReset();      // after resetContents(): everything changed
    void inputsChanged();      // after a change of prices, holdings or assumptions, and after resetContents()
    void filePathChanged();
    void modifiedChanged(bool modified);

private:
    void inputsTouched();
    void replaceContents(WorkbookContents contents, const QString &path, bool unsaved);

    WorkbookContents m_contents;
    QUndoStack *m_undo = nullptr;
    QString m_filePath;
    QStringList m_importedFrom;
    bool m_unsavedWithoutUndo = false; // contents that came from no file (restored unsaved work)
    ResultsStore *m_results = nullptr;
    quint64 m_generation = 0;
};

} // namespace tailwise::ui

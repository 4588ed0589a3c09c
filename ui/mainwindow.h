// MainWindow: composes the panels around one Workbook and runs the file commands. It owns no
// data logic: edits are the panels' (through commands.h), figures the results store's (document/resultsstore.h).
//
// Layout: the assumptions down the left; on the right the headline figures, the charts below
// them and the holdings table at the bottom (the two in a splitter); the cautions note along the
// bottom edge, above the status line with the progress of background computations.
#pragma once

#include "panels/recoveryoffer.h"

#include <QMainWindow>

class QLabel;
class QProgressBar;
class QSplitter;
class QToolButton;

class QTableView;

namespace tailwise::ui {

class Actions;
class AssumptionsPane;
class ChartExporter;
class ChartTabs;
class HeadlinePanel;
class HoldingsEditor;
class ResultsStore;
class RecoveryFile;
class Workbook;

class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget *parent = nullptr);
    ~MainWindow() override;

    Workbook &workbook() const { return *m_workbook; }
    // Every figure of the workbook (its results store).
    ResultsStore &results() const;
    Actions &actions() const { return *m_actions; }
    HoldingsEditor *holdingsEditor() const { return m_holdings; }
    AssumptionsPane *assumptionsPane() const { return m_assumptions; }
    HeadlinePanel *headline() const { return m_headline; }
    ChartTabs *chartTabs() const { return m_charts; }
    RecoveryFile &recoveryFile() const { return *m_recovery; }

    // Offers work left in a recovery file by a session that did not close cleanly (recoveryoffer.h);
    // `ask` answers instead of the dialog (tests). main.cpp calls it once the window is shown.
    RecoveryOutcome offerRecovery(const RecoveryQuestion &ask = {});
    ChartExporter *chartExporter() const { return m_chartExporter; }

    // The file commands without dialogs (the menu commands ask for the path, then call these).
    // Each returns an empty string on success, or the reason nothing changed.
    QString openWorkbookFile(const QString &path);
    QString saveWorkbookFile(const QString &path);
    // Refuses, and changes nothing, when the file has errors (the message names line and column)
    // or lacks an asset that is held (the message names them).
    QString importPriceHistoryFile(const QString &path);
    // Starts writing the workbook's PDF report to `path` (a job on the results store's runner); the status line says when it
    // is written, a message box why not.
    void exportReportFile(const QString &path);
    // Writes the table shown by `view` to `path` (.xlsx or .csv; export/tablefile.h); empty on
    // success, or the reason nothing was written.
    QString exportTableFile(const QTableView *view, const QString &path);

protected:
    void closeEvent(QCloseEvent *event) override;

private:
    void buildLayout();
    void connectActions();
    void updateTitle();
    void showComputing(bool computing);
    void cancelComputation();
    void showProblem(const QString &title, const QString &problem);
    // Asks what to do with unsaved changes; false when the user chose to stay.
    bool keepOrDiscardChanges();
    void newWorkbook();
    void openWithDialog();
    void openPath(const QString &path);
    bool save();
    bool saveAs();
    void importPricesWithDialog();
    void importHoldingsWithDialog();
    void exportHoldingsWithDialog();
    void exportReportWithDialog();
    // Every table of the window gets "Export Table…" in its context menu.
    void offerTableExports();
    void exportTableWithDialog(const QTableView *view);
    void showAbout();
    void addRecentFile(const QString &path);
    QString dialogFolder() const;
    void readSettings();
    void writeSettings() const;

    Workbook *m_workbook = nullptr;
    Actions *m_actions = nullptr;
    HoldingsEditor *m_holdings = nullptr;
    AssumptionsPane *m_assumptions = nullptr;
    HeadlinePanel *m_headline = nullptr;
    ChartTabs *m_charts = nullptr;
    ChartExporter *m_chartExporter = nullptr;
    QSplitter *m_sideSplitter = nullptr;  // assumptions | the rest
    QSplitter *m_workSplitter = nullptr;  // charts over holdings
    QWidget *m_progress = nullptr;
    QProgressBar *m_progressBar = nullptr;
    RecoveryFile *m_recovery = nullptr;
};

} // namespace tailwise::ui

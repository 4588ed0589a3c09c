#include "mainwindow.h"

#include "actions.h"
#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/savefile.h"
#include "document/recoveryfile.h"
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "export/chartexporter.h"
#include "export/reportexport.h"
#include "export/tablefile.h"
#include "panels/assumptionspane.h"
#include "panels/cautionsnote.h"
#include "text/cautions.h"
#include "text/names.h"
#include "panels/charttabs.h"
#include "panels/headlinepanel.h"
#include "panels/holdingseditor.h"

#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <QAction>
#include <QApplication>
#include <QCloseEvent>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QFrame>
#include <QHBoxLayout>
#include <QLocale>
#include <QMessageBox>
#include <QProgressBar>
#include <QScrollArea>
#include <QSettings>
#include <QSplitter>
#include <QStatusBar>
#include <QTableView>
#include <QToolButton>
#include <QUndoStack>
#include <QVBoxLayout>

namespace tailwise::ui {

namespace {
const char *kRecentKey = "recentFiles";
constexpr int kMaxRecent = 8;
constexpr int kStatusTimeoutMs = 10000;
constexpr int reportJobKey = partCount; // the runner's key of the report job (after the parts')
} // namespace

MainWindow::MainWindow(QWidget *parent) : QMainWindow(parent)
{
    m_workbook = new Workbook(this);
    m_actions = new Actions(m_workbook->undoStack(), this);
    m_actions->buildMenus(this);
    buildLayout();
    connectActions();

    connect(m_workbook, &Workbook::filePathChanged, this, &MainWindow::updateTitle);
    connect(m_workbook, &Workbook::modifiedChanged, this, &MainWindow::updateTitle);
    connect(&m_workbook->results(), &ResultsStore::headlineRunning, this, &MainWindow::showComputing);
    connect(&m_workbook->results(), &ResultsStore::progress, this, [this](Part part, double fraction) {
        if (part != Part::Headline)
            return;
        m_progressBar->setRange(0, 100);
        m_progressBar->setValue(static_cast<int>(fraction * 100.0));
    });
    connect(m_holdings, &HoldingsEditor::statusMessage, this,
            [this](const QString &text) { statusBar()->showMessage(text, kStatusTimeoutMs); });
    // Unsaved work is kept in a recovery file of this window's own (recoveryfile.h); a failure to
    // write it is said once on the status line.
    m_recovery = new RecoveryFile(*m_workbook, RecoveryFile::defaultFolder(), this);
    connect(m_recovery, &RecoveryFile::writeFailed, this,
            [this](const QString &text) { statusBar()->showMessage(text, 3 * kStatusTimeoutMs); });
    offerTableExports();
    readSettings();
    updateTitle();
}

void MainWindow::offerTableExports()
{
    for (QTableView *view : findChildren<QTableView *>()) {
        auto *action = new QAction(tr("Export Table…"), view);
        action->setToolTip(tr("Write this table to an .xlsx workbook or a CSV file, figures as numbers"));
        connect(action, &QAction::triggered, this, [this, view] { exportTableWithDialog(view); });
        view->addAction(action);
        view->setContextMenuPolicy(Qt::ActionsContextMenu);
    }
}

namespace {
QString tableName(const QTableView *view)
{
    return view->accessibleName().isEmpty() ? MainWindow::tr("Table") : view->accessibleName();
}
} // namespace

void MainWindow::exportTableWithDialog(const QTableView *view)
{
    const QString xlsxFilter = tr("Excel workbooks (*.xlsx)"), csvFilter = tr("CSV files (*.csv)");
    QString filter = xlsxFilter;
    QString path = QFileDialog::getSaveFileName(this, tr("Export Table"),
                                                QDir(dialogFolder()).filePath(tableName(view) + QStringLiteral(".xlsx")),
                                                xlsxFilter + QStringLiteral(";;") + csvFilter, &filter);
    if (path.isEmpty())
        return;
    if (QFileInfo(path).suffix().isEmpty())
        path += filter == csvFilter ? QStringLiteral(".csv") : QStringLiteral(".xlsx");
    if (const QString problem = exportTableFile(view, path); !problem.isEmpty())
        showProblem(tr("Could not export the table"), problem);
    else
        statusBar()->showMessage(tr("Exported the table to %1.").arg(QDir::toNativeSeparators(path)), kStatusTimeoutMs);
}

QString MainWindow::exportTableFile(const QTableView *view, const QString &path)
{
    if (!view->model())
        return tr("The table is empty.");
    if (const QString refusal = refusalToOverwriteInput(path, m_workbook->inputFiles()); !refusal.isEmpty())
        return refusal;
    if (const auto written = writeTableFile(*view->model(), tableName(view), path); !written)
        return QString::fromStdString(written.error().message);
    return {};
}

ResultsStore &MainWindow::results() const
{
    return m_workbook->results();
}

RecoveryOutcome MainWindow::offerRecovery(const RecoveryQuestion &ask)
{
    const RecoveryQuestion question = ask ? ask : [this](const LeftoverRecovery &leftover, int others) {
        return askAboutRecovery(this, leftover, others);
    };
    const RecoveryOutcome outcome = tailwise::ui::offerRecovery(*m_workbook, *m_recovery, question,
                                                                [this] { return keepOrDiscardChanges(); });
    if (outcome.failed && !ask)
        showProblem(tr("Could not restore the unsaved work"), outcome.message);
    else if (!outcome.message.isEmpty())
        statusBar()->showMessage(outcome.message, kStatusTimeoutMs);
    return outcome;
}

MainWindow::~MainWindow()
{
    // Closing an open cell editor while the window is torn down commits it; its messages must not
    // reach this half-destroyed window.
    disconnect(m_holdings, nullptr, this, nullptr);
}

void MainWindow::buildLayout()
{
    m_assumptions = new AssumptionsPane(*m_workbook);
    auto *scroll = new QScrollArea;
    scroll->setWidget(m_assumptions);
    scroll->setWidgetResizable(true);
    scroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff);
    scroll->setFrameShape(QFrame::NoFrame);
    scroll->setMinimumWidth(m_assumptions->sizeHint().width() + 16);

    m_headline = new HeadlinePanel(*m_workbook);
    m_charts = new ChartTabs(*m_workbook);
    m_charts->setChartActions(m_actions->get(Actions::ExportChart), m_actions->get(Actions::CopyChart));
    m_chartExporter = new ChartExporter(*m_workbook, this);
    connect(m_chartExporter, &ChartExporter::statusMessage, this,
            [this](const QString &text) { statusBar()->showMessage(text, kStatusTimeoutMs); });
    m_holdings = new HoldingsEditor(*m_workbook);
    m_holdings->setRowActions({m_actions->get(Actions::AddHolding), m_actions->get(Actions::DuplicateHolding),
                               m_actions->get(Actions::RemoveHolding), m_actions->get(Actions::ImportHoldings),
                               m_actions->get(Actions::ExportHoldings)});
    // Delete and Paste act on the table when it has focus.
    m_holdings->addAction(m_actions->get(Actions::RemoveHolding));
    m_holdings->addAction(m_actions->get(Actions::Paste));

    m_workSplitter = new QSplitter(Qt::Vertical);
    m_workSplitter->setObjectName(QStringLiteral("workSplitter"));
    m_workSplitter->addWidget(m_charts);
    m_workSplitter->addWidget(m_holdings);
    // Charts and holdings share the height about evenly; a portfolio of a dozen lines fits.
    m_workSplitter->setStretchFactor(0, 1);
    m_workSplitter->setStretchFactor(1, 1);
    m_workSplitter->setChildrenCollapsible(false);

    auto *right = new QWidget;
    auto *rightLayout = new QVBoxLayout(right);
    rightLayout->setContentsMargins(4, 0, 0, 0);
    rightLayout->addWidget(m_headline);
    auto *line = new QFrame;
    line->setFrameShape(QFrame::HLine);
    line->setFrameShadow(QFrame::Sunken);
    rightLayout->addWidget(line);
    rightLayout->addWidget(m_workSplitter, 1);

    m_sideSplitter = new QSplitter(Qt::Horizontal);
    m_sideSplitter->setObjectName(QStringLiteral("sideSplitter"));
    m_sideSplitter->addWidget(scroll);
    m_sideSplitter->addWidget(right);
    m_sideSplitter->setStretchFactor(1, 1);
    m_sideSplitter->setChildrenCollapsible(false);

    auto *central = new QWidget;
    auto *layout = new QVBoxLayout(central);
    layout->setContentsMargins(6, 6, 6, 0);
    layout->setSpacing(4);
    layout->addWidget(m_sideSplitter, 1);
    auto *cautions = new CautionsNote;
    cautions->setConfidence(m_workbook->assumptions().confidence);
    connect(m_workbook, &Workbook::assumptionsChanged, cautions,
            [this, cautions] { cautions->setConfidence(m_workbook->assumptions().confidence); });
    connect(m_workbook, &Workbook::contentsReset, cautions,
            [this, cautions] { cautions->setConfidence(m_workbook->assumptions().confidence); });
    layout->addWidget(cautions);
    setCentralWidget(central);

    m_progress = new QWidget;
    auto *progressLayout = new QHBoxLayout(m_progress);
    progressLayout->setContentsMargins(0, 0, 0, 0);
    progressLayout->addWidget(new QLabel(tr("Computing…")));
    m_progressBar = new QProgressBar;
    m_progressBar->setRange(0, 100);
    m_progressBar->setMaximumWidth(160);
    progressLayout->addWidget(m_progressBar);
    auto *cancel = new QToolButton;
    cancel->setText(tr("Stop"));
    cancel->setToolTip(tr("Stop this computation; the figures stay blank until an input changes."));
    connect(cancel, &QToolButton::clicked, this, &MainWindow::cancelComputation);
    progressLayout->addWidget(cancel);
    statusBar()->addPermanentWidget(m_progress);
    m_progress->hide();
}

void MainWindow::connectActions()
{
    const Actions &a = *m_actions;
    connect(a.get(Actions::New), &QAction::triggered, this, &MainWindow::newWorkbook);
    connect(a.get(Actions::Open), &QAction::triggered, this, &MainWindow::openWithDialog);
    connect(a.get(Actions::Save), &QAction::triggered, this, &MainWindow::save);
    connect(a.get(Actions::SaveAs), &QAction::triggered, this, &MainWindow::saveAs);
    connect(a.get(Actions::ImportPrices), &QAction::triggered, this, &MainWindow::importPricesWithDialog);
    connect(a.get(Actions::ImportHoldings), &QAction::triggered, this, &MainWindow::importHoldingsWithDialog);
    connect(a.get(Actions::ExportHoldings), &QAction::triggered, this, &MainWindow::exportHoldingsWithDialog);
    connect(a.get(Actions::ExportReport), &QAction::triggered, this, &MainWindow::exportReportWithDialog);
    connect(a.get(Actions::Quit), &QAction::triggered, this, &QWidget::close);
    connect(a.get(Actions::AddHolding), &QAction::triggered, m_holdings, &HoldingsEditor::addHolding);
    connect(a.get(Actions::RemoveHolding), &QAction::triggered, m_holdings, &HoldingsEditor::removeSelected);
    connect(a.get(Actions::DuplicateHolding), &QAction::triggered, m_holdings, &HoldingsEditor::duplicateSelected);
    connect(a.get(Actions::Paste), &QAction::triggered, m_holdings, &HoldingsEditor::pasteFromClipboard);
    connect(a.get(Actions::About), &QAction::triggered, this, &MainWindow::showAbout);
    // The chart in view and the loss tail's unit are the window's to say; the exporter reads no widget.
    auto unit = [this] { return m_charts->lossTailInPercent() ? LossTailUnit::PercentOfValue : LossTailUnit::Money; };
    connect(a.get(Actions::ExportChart), &QAction::triggered, this, [this, unit] {
        m_chartExporter->exportChart(m_charts->currentChartKind().value_or(ChartKind::LossTail), unit());
    });
    connect(a.get(Actions::CopyChart), &QAction::triggered, this, [this, unit] {
        m_chartExporter->copyChart(m_charts->currentChartKind().value_or(ChartKind::LossTail), unit());
    });
    connect(m_actions, &Actions::recentFileChosen, this, &MainWindow::openPath);
}

void MainWindow::updateTitle()
{
    const QString path = m_workbook->filePath();
    const QString name = path.isEmpty() ? tr("Untitled") : shortText(QFileInfo(path).fileName(), shortTitleChars);
    setWindowTitle(tr("%1[*] — Tailwise").arg(name));
    setWindowFilePath(path);
    setWindowModified(m_workbook->isModified());
}

void MainWindow::showComputing(bool computing)
{
    // A moving bar until the job reports how far it is (not every model does).
    m_progressBar->setRange(0, 0);
    m_progress->setVisible(computing);
}

void MainWindow::cancelComputation()
{
    // The figures on screen stay, marked as those of older inputs (the headline says so).
    m_workbook->results().cancel(Part::Headline);
    statusBar()->showMessage(tr("Computation stopped."), kStatusTimeoutMs);
}

void MainWindow::showProblem(const QString &title, const QString &problem)
{
    statusBar()->showMessage(problem, kStatusTimeoutMs);
    QMessageBox::warning(this, title, problem);
}

QString MainWindow::openWorkbookFile(const QString &path)
{
    auto loaded = loadWorkbook(path);
    if (!loaded)
        return QString::fromStdString(loaded.error().message);
    const Warnings notes = loaded.value().warnings; // e.g. assumptions the file lacks took defaults
    m_workbook->resetContents(std::move(loaded).value(), QFileInfo(path).absoluteFilePath());
    addRecentFile(QFileInfo(path).absoluteFilePath());
    QString opened = tr("Opened %1.").arg(QDir::toNativeSeparators(path));
    for (const std::string &note : notes)
        opened += QLatin1Char(' ') + QString::fromStdString(note);
    statusBar()->showMessage(opened, kStatusTimeoutMs);
    return {};
}

QString MainWindow::saveWorkbookFile(const QString &path)
{
    // Saving over the workbook's own file is what Save does; over a CSV it was imported from is not.
    if (const QString refusal = refusalToOverwriteInput(path, m_workbook->importedFiles()); !refusal.isEmpty())
        return refusal;
    const Status saved = saveWorkbook(m_workbook->contents(), path);
    if (!saved)
        return QString::fromStdString(saved.error().message);
    m_workbook->markSaved(QFileInfo(path).absoluteFilePath());
    addRecentFile(QFileInfo(path).absoluteFilePath());
    statusBar()->showMessage(tr("Saved %1.").arg(QDir::toNativeSeparators(path)), kStatusTimeoutMs);
    return {};
}

QString MainWindow::importPriceHistoryFile(const QString &path)
{
    auto read = readPriceCsv(path.toStdString());
    if (!read)
        return QString::fromStdString(read.error().message);
    const PriceHistory &prices = read.value();
    QStringList missing;
    for (const Holding &h : m_workbook->holdings())
        if (prices.assetIndex(h.asset) < 0)
            missing << QString::fromStdString(h.asset);
    if (!missing.isEmpty())
        return tr("%1 has no prices for these held assets: %2. Remove those holdings first, or import a history "
                  "that has them; nothing was changed.")
            .arg(QDir::toNativeSeparators(path), missing.join(QStringLiteral(", ")));
    edit::replacePrices(*m_workbook, prices, tr("Import price history %1").arg(QFileInfo(path).fileName()));
    m_workbook->noteImportedFrom(path);
    QString done = tr("Imported prices for %1 days from %2").arg(QLocale().toString(prices.dayCount()), QFileInfo(path).fileName());
    if (!prices.warnings.empty())
        done += tr(" — note: %1").arg(QString::fromStdString(prices.warnings.front()));
    statusBar()->showMessage(done, kStatusTimeoutMs);
    return {};
}

bool MainWindow::keepOrDiscardChanges()
{
    if (!m_workbook->isModified())
        return true;
    const auto answer = QMessageBox::question(
        this, tr("Unsaved changes"), tr("The workbook has changes that are not saved. Save them first?"),
        QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
    if (answer == QMessageBox::Save)
        return save();
    return answer == QMessageBox::Discard;
}

void MainWindow::newWorkbook()
{
    if (!keepOrDiscardChanges())
        return;
    m_workbook->resetContents(WorkbookContents{}, QString());
}

void MainWindow::openWithDialog()
{
    if (!keepOrDiscardChanges())
        return;
    const QString path = QFileDialog::getOpenFileName(this, tr("Open Workbook"), dialogFolder(),
                                                      tr("Tailwise workbooks (*.%1);;All files (*)").arg(workbookSuffix));
    if (path.isEmpty())
        return;
    if (const QString problem = openWorkbookFile(path); !problem.isEmpty())
        showProblem(tr("Could not open the workbook"), problem);
}

void MainWindow::openPath(const QString &path)
{
    if (!keepOrDiscardChanges())
        return;
    if (const QString problem = openWorkbookFile(path); !problem.isEmpty())
        showProblem(tr("Could not open the workbook"), problem);
}

bool MainWindow::save()
{
    if (m_workbook->filePath().isEmpty())
        return saveAs();
    const QString problem = saveWorkbookFile(m_workbook->filePath());
    if (!problem.isEmpty())
        showProblem(tr("Could not save the workbook"), problem);
    return problem.isEmpty();
}

bool MainWindow::saveAs()
{
    QString path = QFileDialog::getSaveFileName(this, tr("Save Workbook"), dialogFolder(),
                                                tr("Tailwise workbooks (*.%1)").arg(workbookSuffix));
    if (path.isEmpty())
        return false;
    if (QFileInfo(path).suffix().isEmpty())
        path += QLatin1Char('.') + QLatin1String(workbookSuffix);
    const QString problem = saveWorkbookFile(path);
    if (!problem.isEmpty())
        showProblem(tr("Could not save the workbook"), problem);
    return problem.isEmpty();
}

void MainWindow::importPricesWithDialog()
{
    const QString path = QFileDialog::getOpenFileName(this, tr("Import Price History"), dialogFolder(),
                                                      tr("CSV files (*.csv);;All files (*)"));
    if (path.isEmpty())
        return;
    if (const QString problem = importPriceHistoryFile(path); !problem.isEmpty())
        showProblem(tr("Could not import the price history"), problem);
}

void MainWindow::importHoldingsWithDialog()
{
    const QString path = QFileDialog::getOpenFileName(this, tr("Import Holdings"), dialogFolder(),
                                                      tr("CSV files (*.csv);;All files (*)"));
    if (path.isEmpty())
        return;
    if (const QString problem = m_holdings->importHoldingsFile(path); !problem.isEmpty())
        showProblem(tr("Could not import the holdings"), problem);
}

void MainWindow::exportHoldingsWithDialog()
{
    const QString path = QFileDialog::getSaveFileName(this, tr("Export Holdings"), dialogFolder(),
                                                      tr("CSV files (*.csv)"));
    if (path.isEmpty())
        return;
    if (const QString problem = m_holdings->exportHoldingsFile(path); !problem.isEmpty())
        showProblem(tr("Could not export the holdings"), problem);
    else
        statusBar()->showMessage(tr("Exported the holdings to %1.").arg(QDir::toNativeSeparators(path)), kStatusTimeoutMs);
}

void MainWindow::exportReportWithDialog()
{
    const QString path = m_workbook->filePath();
    const QString suggested = QDir(dialogFolder()).filePath(
        (path.isEmpty() ? tr("report") : QFileInfo(path).completeBaseName()) + QStringLiteral(".pdf"));
    QString chosen = QFileDialog::getSaveFileName(this, tr("Export Report"), suggested, tr("PDF files (*.pdf)"));
    if (chosen.isEmpty())
        return;
    if (QFileInfo(chosen).suffix().isEmpty())
        chosen += QStringLiteral(".pdf");
    exportReportFile(chosen);
}

void MainWindow::exportReportFile(const QString &path)
{
    if (const QString refusal = refusalToOverwriteInput(path, m_workbook->inputFiles()); !refusal.isEmpty())
        return showProblem(tr("Could not export the report"), refusal);
    const QString file = m_workbook->filePath();
    const QString name = file.isEmpty() ? tr("Untitled") : QFileInfo(file).fileName();
    QAction *action = m_actions->get(Actions::ExportReport);
    action->setEnabled(false); // one report at a time
    statusBar()->showMessage(tr("Writing the report…"));
    // The figures are computed on a pool thread from a copy of the inputs; the pages are then
    // drawn here, on the GUI thread (reportexport.h).
    auto contents = std::make_shared<WorkbookContents>(m_workbook->contents());
    m_workbook->results().runner().start<ReportData>(
        reportJobKey, JobRunner::Where::Background,
        [contents](const RunControl &) -> Result<ReportData> { return computeReportData(*contents); },
        [this, action, name, path](Result<ReportData> data) {
            action->setEnabled(true);
            const auto written = writeReport(data.value(), name, path);
            if (!written)
                return showProblem(tr("Could not export the report"), QString::fromStdString(written.error().message));
            statusBar()->showMessage(tr("Wrote the report to %1 (%2 pages).").arg(QDir::toNativeSeparators(path)).arg(written.value()),
                                     kStatusTimeoutMs);
        });
}

void MainWindow::showAbout()
{
    QMessageBox::about(this, tr("About Tailwise"),
                       tr("<h3>Tailwise %1</h3><p>A workbench for Value-at-Risk and Expected Shortfall of portfolios "
                          "from daily price histories.</p>")
                               .arg(QApplication::applicationVersion())
                           + cautionsFullText(m_workbook->assumptions().confidence));
}

void MainWindow::addRecentFile(const QString &path)
{
    QSettings settings;
    QStringList recent = settings.value(kRecentKey).toStringList();
    recent.removeAll(path);
    recent.prepend(path);
    while (recent.size() > kMaxRecent)
        recent.removeLast();
    settings.setValue(kRecentKey, recent);
    m_actions->setRecentFiles(recent);
}

QString MainWindow::dialogFolder() const
{
    const QString path = m_workbook->filePath();
    return path.isEmpty() ? QDir::homePath() : QFileInfo(path).absolutePath();
}

void MainWindow::readSettings()
{
    QSettings settings;
    if (!restoreGeometry(settings.value("window/geometry").toByteArray()))
        resize(1360, 860);
    m_sideSplitter->restoreState(settings.value("window/sideSplitter").toByteArray());
    if (!m_workSplitter->restoreState(settings.value("window/workSplitter").toByteArray()))
        m_workSplitter->setSizes({1000, 1000}); // halves, in proportion
    m_actions->setRecentFiles(settings.value(kRecentKey).toStringList());
}

void MainWindow::writeSettings() const
{
    QSettings settings;
    settings.setValue("window/geometry", saveGeometry());
    settings.setValue("window/sideSplitter", m_sideSplitter->saveState());
    settings.setValue("window/workSplitter", m_workSplitter->saveState());
}

void MainWindow::closeEvent(QCloseEvent *event)
{
    if (!keepOrDiscardChanges()) {
        event->ignore();
        return;
    }
    writeSettings();
    m_workbook->results().runner().stopAll();
    m_recovery->discard(); // saved or discarded by the user: nothing left to recover
    event->accept();
}

} // namespace tailwise::ui

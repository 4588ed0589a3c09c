#include "export/chartexporter.h"

#include "document/resultsstore.h"
#include "document/savefile.h"
#include "document/workbook.h"
#include "charts/tradeoffchartdata.h"
#include "export/captions.h"
#include "export/chartclipboard.h"
#include "export/chartexportdialog.h"

#include <QApplication>
#include <QClipboard>
#include <QFileDialog>
#include <QFileInfo>
#include <QMessageBox>

namespace tailwise::ui {

ChartExporter::ChartExporter(Workbook &workbook, QWidget *window)
    : QObject(window), m_workbook(workbook), m_window(window)
{
    m_last.print.sizeMm = sizePresetMm(SizePreset::HalfPage);
}

std::optional<WorkbookResults> ChartExporter::currentResults() const
{
    ResultsStore &store = m_workbook.results();
    const auto &report = store.report();
    if (!report)
        return std::nullopt;
    // An export needs the backtest and the comparison: ask for the ones not yet computed.
    store.request(Part::Backtest);
    store.request(Part::Comparison);
    std::optional<Result<BacktestResult>> backtest;
    const BacktestRun &run = store.backtest();
    const PartState backtestState = store.state(Part::Backtest);
    if (backtestState == PartState::Failed && run.problem)
        backtest = Result<BacktestResult>(*run.problem);
    else if (backtestState == PartState::Ready && !run.models.empty() && run.models.front().result)
        backtest = *run.models.front().result;
    std::optional<Result<std::vector<ModelRow>>> models;
    if (store.state(Part::Comparison) == PartState::Ready && store.comparison() && *store.comparison()
        && !store.comparison()->value().empty())
        models = *store.comparison();
    // The horizon-and-confidence grid: the store's, computed now through its runner when the
    // headline is current but the grid is not (the export cannot wait for it); else computed
    // from the report held, as the chart is drawn from it.
    std::optional<Result<RiskGrid>> grid;
    store.setGridConfidences(tradeoffGridConfidences(TradeoffOptions{}));
    const bool headlineCurrent = store.isReady(Part::Headline)
                                 && store.status(Part::Headline).generation == store.inputGeneration(Part::Headline);
    const auto gridCurrent = [&store] {
        return store.isReady(Part::Grid) && store.status(Part::Grid).generation == store.inputGeneration(Part::Grid);
    };
    if (headlineCurrent && !gridCurrent())
        store.computeNow(Part::Grid);
    if (headlineCurrent && gridCurrent() && store.grid().grid)
        grid = *store.grid().grid;
    WorkbookResults results = assembleWorkbookResults(m_workbook.title(), *report, m_workbook.backtestSettings(), backtest,
                                                      models, m_workbook.currency(), std::move(grid));
    if (!models)
        results.modelsProblem = tr("the model comparison is being computed; export again in a moment.");
    if (!results.backtestChart && !backtest)
        results.backtestProblem = tr("the backtest is still running; export again when the Backtest tab shows it.");
    return results;
}

QString ChartExporter::writeFile(const QString &path, const ChartExportSettings &settings) const
{
    const auto results = currentResults();
    if (!results)
        return tr("There are no figures to draw yet.");
    const auto written = writeChart(path, settings, *results);
    return written ? QString() : QString::fromStdString(written.error().message);
}

void ChartExporter::exportChart(ChartKind kind, LossTailUnit unit)
{
    const auto results = currentResults();
    if (!results) {
        QMessageBox::information(m_window, tr("Export Chart"), tr("There are no figures to draw yet."));
        return;
    }
    // The loss tail goes out in the unit it is shown in.
    m_last.print.lossTailUnit = unit;
    // The workbook's currency when it states one; otherwise what was typed last time.
    if (!m_workbook.currency().isEmpty())
        m_last.print.currency = m_workbook.currency();
    ChartExportDialog dialog(*results, kind, m_last, m_window);
    connect(&dialog, &ChartExportDialog::copyRequested, this,
            [this, &results](const ChartExportSettings &s) { copy(s, *results); });
    if (dialog.exec() != QDialog::Accepted)
        return;
    ChartExportSettings s = dialog.settings();
    const QString suffix = exportFormatName(s.format);
    const QString suggested = chartKindName(s.kind) + QLatin1Char('.') + suffix;
    QString path = QFileDialog::getSaveFileName(m_window, tr("Export Chart"), suggested,
                                                tr("%1 files (*.%2)").arg(suffix.toUpper(), suffix));
    if (path.isEmpty())
        return;
    if (QFileInfo(path).suffix().isEmpty())
        path += QLatin1Char('.') + suffix;
    m_last = s;
    if (const QString refusal = refusalToOverwriteInput(path, m_workbook.inputFiles()); !refusal.isEmpty()) {
        QMessageBox::warning(m_window, tr("Could not export the chart"), refusal);
        return;
    }
    if (const auto written = writeChart(path, s, *results); !written) {
        QMessageBox::warning(m_window, tr("Could not export the chart"), QString::fromStdString(written.error().message));
        return;
    }
    emit statusMessage(tr("Chart written to %1").arg(QFileInfo(path).fileName()));
}

void ChartExporter::copyChart(ChartKind kind, LossTailUnit unit)
{
    const auto results = currentResults();
    if (!results)
        return;
    ChartExportSettings s = m_last;
    s.kind = kind;
    s.print.lossTailUnit = unit;
    // Without the dialog the caption is the generated one: the clipboard carries the whole picture.
    s.print.caption = captionFor(s.kind, *results);
    copy(s, *results);
}

void ChartExporter::copy(const ChartExportSettings &settings, const WorkbookResults &results)
{
    if (const QString reason = chartUnavailableReason(settings.kind, results); !reason.isEmpty()) {
        QMessageBox::information(m_window, tr("Copy Chart"), reason);
        return;
    }
    QApplication::clipboard()->setMimeData(chartMimeData(settings, results));
    emit statusMessage(tr("%1 copied to the clipboard").arg(chartKindTitle(settings.kind)));
}

} // namespace tailwise::ui

// The window as a new user meets it, on the invented sample workbook (samples/larchmere.tailwise):
// every tab in turn (each part of the results store computed when its tab is first shown, and
// its figures equal to core's), the other models' curves, an exported chart, a PDF report, an
// edit and its undo. With TAILWISE_TEST_PICTURES=<folder> it saves a picture of each step (run
// it under xvfb-run with QT_QPA_PLATFORM=xcb to see the real window).
#include "windowfixture.h"

#include "charts/losstailchart.h"
#include "charts/tradeoffchart.h"
#include "charts/tradeoffchartdata.h"
#include "document/gridaxes.h"
#include "document/commands.h"
#include "document/resultsstore.h"
#include "export/chartexporter.h"
#include "panels/charttabs.h"
#include "panels/whatifpanel.h"

#include "tailwise/comparison.h"
#include "tailwise/modelgrid.h"
#include "tailwise/risk.h"

#include <QCheckBox>
#include <QFileInfo>
#include <QLabel>
#include <QPushButton>
#include <QStatusBar>
#include <QTabWidget>
#include <QTemporaryDir>
#include <QTest>
#include <QUndoStack>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

void picture(QWidget *w, const QString &name)
{
    const QByteArray dir = qgetenv("TAILWISE_TEST_PICTURES");
    if (dir.isEmpty())
        return;
    QCoreApplication::processEvents();
    w->grab().save(QString::fromLocal8Bit(dir) + QLatin1Char('/') + name + QStringLiteral(".png"));
}

} // namespace

class TestWindowTour : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() { test::isolateSettings(); }

    void everyTabExportReportAndUndo()
    {
        MainWindow window;
        QCOMPARE(window.openWorkbookFile(test::samplePath("larchmere.tailwise")), QString());
        window.resize(1400, 900);
        window.show();
        QVERIFY(QTest::qWaitForWindowExposed(&window));
        Workbook &wb = window.workbook();
        ResultsStore &store = wb.results();
        QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Headline), 30000);
        const auto core = computeRisk(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY(core.ok());
        QCOMPARE(store.report()->figures.var, core.value().figures.var);
        // Nothing beyond the headline is computed before it is looked at.
        QVERIFY(!store.isReady(Part::Backtest) && !store.isRunning(Part::Backtest));
        QVERIFY(!store.isReady(Part::Comparison) && !store.isRunning(Part::Comparison));
        picture(&window, QStringLiteral("tour-0-loss-tail"));

        ChartTabs *charts = window.chartTabs();
        QTabWidget *tabs = charts->tabs();
        const Part partOfTab[] = {Part::Headline, Part::Grid, Part::Headline, Part::Comparison,
                                  Part::WhatIf,   Part::Stress,   Part::Backtest};
        QCOMPARE(tabs->count(), 7);
        for (int i = 1; i < tabs->count(); ++i) {
            tabs->setCurrentIndex(i);
            if (tabs->currentWidget() == charts->whatIfPanel())
                charts->whatIfPanel()->setTrades({Trade{"LARK_ENERGY", 500.0}});
            QTRY_VERIFY2_WITH_TIMEOUT(store.isReady(partOfTab[i]), qPrintable(tabs->tabText(i)), 60000);
            picture(&window, QStringLiteral("tour-%1").arg(i));
        }
        const auto rows = compareModels(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY(rows.ok());
        QCOMPARE(store.comparison()->value().front().figures->var, rows.value().front().figures->var);
        QVERIFY(charts->whatIfPanel()->result().has_value());

        // The other models' curves on the loss tail, computed off the GUI thread.
        tabs->setCurrentIndex(0);
        charts->modelOverlayOption()->setChecked(true);
        QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Overlays), 30000);
        QVERIFY(!charts->lossTailChart()->data().overlays.isEmpty());
        picture(&window, QStringLiteral("tour-8-overlays"));

        // An exported chart and the report, from what the store holds.
        QTemporaryDir dir;
        ChartExportSettings settings;
        settings.kind = ChartKind::Backtest;
        settings.print.sizeMm = sizePresetMm(SizePreset::HalfPage);
        const QString png = dir.filePath(QStringLiteral("backtest.png"));
        QCOMPARE(window.chartExporter()->writeFile(png, settings), QString());
        QVERIFY(QFileInfo(png).size() > 0);
        const QString pdf = dir.filePath(QStringLiteral("report.pdf"));
        window.exportReportFile(pdf);
        QTRY_VERIFY_WITH_TIMEOUT(window.statusBar()->currentMessage().startsWith(QStringLiteral("Wrote the report")), 60000);
        QVERIFY(QFileInfo(pdf).size() > 0);

        // The horizon tab draws the store's grid, computed off the GUI thread: core's modelRiskGrid
        // of the headline's report; with the tab in view, an edit brings a new grid.
        QVERIFY(charts->tradeoffChart()->data().valid);
        QCOMPARE(charts->tradeoffChart()->data().currentVar, store.report()->figures.var);
        {
            tabs->setCurrentWidget(charts->tradeoffChart());
            Holding h = wb.holdings().front();
            h.quantity *= 1.5;
            edit::setHolding(wb, 0, h, QStringLiteral("More"));
            QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Grid)
                                         && store.status(Part::Grid).generation == store.inputGeneration(Part::Grid),
                                     30000);
            QCOMPARE(charts->tradeoffChart()->data().currentVar, store.report()->figures.var);
            const auto grid = modelRiskGrid(*store.report(), gridHorizons(*store.report()), tradeoffGridConfidences());
            QVERIFY(grid.ok());
            QCOMPARE(store.grid().grid->value().var, grid.value().var);
            picture(&window, QStringLiteral("tour-1-after-edit"));
            wb.undoStack()->undo();
            QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Grid)
                                         && store.status(Part::Grid).generation == store.inputGeneration(Part::Grid),
                                     30000);
        }

        // An edit and its undo: the headline follows both.
        const double before = store.report()->figures.var;
        Holding h = wb.holdings().front();
        h.quantity *= 2.0;
        edit::setHolding(wb, 0, h, QStringLiteral("Double"));
        QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Headline) && store.report()->figures.var != before, 30000);
        wb.undoStack()->undo();
        QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Headline) && store.report()->figures.var == before, 30000);
        picture(&window, QStringLiteral("tour-9-after-undo"));
    }

    // The horizon tab under Monte Carlo: the grid's run shows under the tabs with a Stop button;
    // a stop keeps the drawn figures, marked out of date, and "Compute again" brings the new ones.
    void horizonTabStopAndComputeAgain()
    {
        MainWindow window;
        QCOMPARE(window.openWorkbookFile(test::samplePath("larchmere.tailwise")), QString());
        window.resize(1400, 900);
        window.show();
        QVERIFY(QTest::qWaitForWindowExposed(&window));
        Workbook &wb = window.workbook();
        ResultsStore &store = wb.results();
        ChartTabs *charts = window.chartTabs();
        charts->tabs()->setCurrentWidget(charts->tradeoffChart());
        QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Grid), 30000);
        const double drawn = charts->tradeoffChart()->data().currentVar;
        auto *row = charts->findChild<QWidget *>(QStringLiteral("gridRun"));
        QVERIFY(row);
        QPushButton *stop = nullptr, *again = nullptr;
        for (QPushButton *b : row->findChildren<QPushButton *>())
            (b->text() == QStringLiteral("Stop") ? stop : again) = b;
        QVERIFY(stop && again);

        Assumptions a = wb.assumptions();
        a.model = RiskModel::MonteCarlo;
        edit::setAssumptions(wb, a, QStringLiteral("Monte Carlo"));
        QTRY_VERIFY_WITH_TIMEOUT(store.isRunning(Part::Grid), 10000);
        QVERIFY(row->isVisible() && stop->isVisible());
        picture(&window, QStringLiteral("tour-grid-running"));
        stop->click();
        QCOMPARE(store.state(Part::Grid), PartState::OutOfDate);
        QVERIFY(row->isVisible() && again->isVisible() && !stop->isVisible());
        QCOMPARE(charts->tradeoffChart()->data().currentVar, drawn); // the last figures stay drawn
        QTest::qWait(300);
        QCOMPARE(store.state(Part::Grid), PartState::OutOfDate); // stopped stays stopped
        picture(&window, QStringLiteral("tour-grid-stopped"));
        again->click();
        QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Grid)
                                     && store.status(Part::Grid).generation == store.inputGeneration(Part::Grid),
                                 60000);
        QVERIFY(!row->isVisible());
        QCOMPARE(charts->tradeoffChart()->data().currentVar, store.report()->figures.var);
        QCOMPARE(store.grid().report->model.used, RiskModel::MonteCarlo);
    }
};

QTEST_MAIN(TestWindowTour)
#include "test_windowtour.moc"

// The results store (ui/document/resultsstore.h) and its job runner (jobrunner.h) on the invented
// sample fund: which parts an input change marks out of date (and that renaming or a currency
// marks none), that a stale job's result is dropped, that a stopped job leaves the previous
// figures whole and marked out of date, and that a part nobody looks at costs nothing per edit.
// The figures are compared with core's own functions called directly (tests/core checks those
// against published values); the rest is the window's bookkeeping, checked as such.
#include "chartfixture.h"

#include "charts/tradeoffchartdata.h"
#include "document/gridaxes.h"

#include "document/backtestrequest.h"
#include "document/commands.h"
#include "document/jobrunner.h"
#include "document/resultsstore.h"
#include "document/workbook.h"

#include "tailwise/comparison.h"
#include "tailwise/modelgrid.h"
#include "tailwise/risk.h"

#include <QSignalSpy>
#include <QTest>

#include <algorithm>
#include <atomic>
#include <thread>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

WorkbookContents sampleContents()
{
    WorkbookContents c;
    c.title = QStringLiteral("Sample");
    c.prices = chartfixture::samplePrices();
    c.holdings = chartfixture::sampleHoldings();
    c.assumptions.horizonDays = 10;
    c.assumptions.window = 500;
    c.scenarios = {{"Equity drawdown -20%", {{"LARK_ENERGY", -0.2}}}};
    return c;
}

constexpr Part everyPart[] = {Part::Headline, Part::Overlays, Part::Comparison, Part::Backtest,
                              Part::Stress,   Part::WhatIf,   Part::Grid};

const char *partName(Part p)
{
    switch (p) {
    case Part::Headline: return "headline";
    case Part::Overlays: return "overlays";
    case Part::Comparison: return "comparison";
    case Part::Backtest: return "backtest";
    case Part::Stress: return "stress";
    case Part::WhatIf: return "what-if";
    case Part::Grid: return "grid";
    }
    return "?";
}

// A workbook with every part computed for its current inputs.
void computeAll(ResultsStore &store)
{
    store.setWhatIfTrades({Trade{"LARK_ENERGY", 100.0}});
    store.setGridConfidences(tradeoffGridConfidences());
    for (const Part p : everyPart)
        store.computeNow(p);
}

// The parts that are not current any more.
QList<Part> outOfDate(const ResultsStore &store)
{
    QList<Part> parts;
    for (const Part p : everyPart)
        if (store.state(p) != PartState::Ready)
            parts << p;
    return parts;
}

QString names(const QList<Part> &parts)
{
    QStringList out;
    for (const Part p : parts)
        out << QLatin1String(partName(p));
    return out.join(QLatin1Char(','));
}

} // namespace

class TestResultsStore : public QObject {
    Q_OBJECT
private slots:
    void everyPartComputesCoresFigures()
    {
        Workbook wb;
        wb.resetContents(sampleContents(), {});
        ResultsStore &store = wb.results();
        computeAll(store);
        QVERIFY2(outOfDate(store).isEmpty(), qPrintable(names(outOfDate(store))));
        for (const Part p : everyPart)
            QCOMPARE(store.status(p).generation, store.inputGeneration(p));
        const auto core = computeRisk(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY(core.ok() && store.report());
        QCOMPARE(store.report()->figures.var, core.value().figures.var);
        const auto rows = compareModels(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY(rows.ok() && store.comparison() && store.comparison()->ok());
        QCOMPARE(store.comparison()->value().size(), rows.value().size());
        QCOMPARE(store.comparison()->value().front().figures->var, rows.value().front().figures->var);
        QCOMPARE(store.comparisonValue(), core.value().portfolioValue);
        const BacktestSettings s = wb.backtestSettings();
        const auto backtest = runBacktest(backtestRequestFor(wb.contents(), s, s.models.front()));
        QVERIFY(backtest.ok());
        QCOMPARE(store.backtest().models.front().result->value().exceptions, backtest.value().exceptions);
        QVERIFY(store.stress() && store.stress()->ok());
        QCOMPARE(static_cast<int>(store.stress()->value().size()), 1 + ResultsStore::stressWorstDays);
        QVERIFY(store.whatIf() && store.whatIf()->ok());
        QCOMPARE(store.whatIf()->value().figures.varBefore, core.value().figures.var);
        QCOMPARE(store.overlays().size(), std::size_t(2)); // Student-t and Cornish–Fisher beside the normal
    }

    // Each input marks exactly the parts computed from it.
    void anInputMarksExactlyItsParts_data()
    {
        QTest::addColumn<QString>("edit");
        QTest::addColumn<QString>("expected");
        QTest::newRow("rename") << "title" << "";
        QTest::newRow("currency") << "currency" << "";
        QTest::newRow("backtest test size") << "testSize" << "";
        QTest::newRow("scenarios") << "scenarios" << "stress";
        QTest::newRow("backtest window") << "window" << "backtest";
        QTest::newRow("what-if proposal") << "trades" << "what-if";
        QTest::newRow("grid confidences") << "gridConfidences" << "grid";
        QTest::newRow("holding") << "holding" << "headline,overlays,comparison,backtest,stress,what-if,grid";
        QTest::newRow("assumptions") << "confidence" << "headline,overlays,comparison,backtest,stress,what-if,grid";
    }
    void anInputMarksExactlyItsParts()
    {
        QFETCH(QString, edit);
        QFETCH(QString, expected);
        Workbook wb;
        wb.resetContents(sampleContents(), {});
        ResultsStore &store = wb.results();
        computeAll(store);
        QSignalSpy headline(&store, &ResultsStore::headlineChanged);
        if (edit == QLatin1String("title")) {
            edit::setTitle(wb, QStringLiteral("Renamed"));
        } else if (edit == QLatin1String("currency")) {
            QVERIFY(edit::setCurrency(wb, QStringLiteral("EUR")).ok());
        } else if (edit == QLatin1String("testSize") || edit == QLatin1String("window")) {
            BacktestSettings s = wb.backtestSettings();
            (edit == QLatin1String("window") ? s.window = 300 : s.testSize = 0.1);
            edit::setBacktestSettings(wb, s, QStringLiteral("edit"), edit::MergeKey::None);
        } else if (edit == QLatin1String("scenarios")) {
            auto scenarios = wb.scenarios();
            scenarios.push_back({"Bonds -5%", {{"ASHGROVE_BOND_FUND", -0.05}}});
            edit::setScenarios(wb, scenarios, QStringLiteral("Add"));
        } else if (edit == QLatin1String("gridConfidences")) {
            store.setGridConfidences({0.95, 0.99});
        } else if (edit == QLatin1String("trades")) {
            store.setWhatIfTrades({Trade{"LARK_ENERGY", 200.0}});
        } else if (edit == QLatin1String("holding")) {
            Holding h = wb.holdings().front();
            h.quantity *= 2.0;
            edit::setHolding(wb, 0, h, QStringLiteral("Double"));
        } else {
            Assumptions a = wb.assumptions();
            a.confidence = 0.975;
            edit::setAssumptions(wb, a, QStringLiteral("97.5%"));
        }
        QCOMPARE(names(outOfDate(store)), expected);
        if (expected.isEmpty()) {
            // Nothing recomputes, even after the event loop has run.
            QCoreApplication::processEvents();
            QCOMPARE(names(outOfDate(store)), expected);
            QVERIFY(headline.isEmpty() || edit != QLatin1String("title"));
        }
        // The figures held stay until new ones arrive.
        QVERIFY(store.report().has_value());
    }

    // A result computed from inputs that have changed since never reaches the store.
    void aStaleResultIsDropped()
    {
        Workbook wb;
        wb.resetContents(sampleContents(), {});
        ResultsStore &store = wb.results();
        store.computeNow(Part::Comparison);
        const auto before = store.comparison()->value().front().figures->var;
        const quint64 held = store.status(Part::Comparison).generation;
        QSignalSpy changed(&store, &ResultsStore::comparisonChanged);
        store.request(Part::Comparison); // current: nothing to do
        QVERIFY(!store.isRunning(Part::Comparison));
        Holding h = wb.holdings().front();
        h.quantity *= 3.0;
        edit::setHolding(wb, 0, h, QStringLiteral("Triple"));
        store.request(Part::Comparison);
        QVERIFY(store.isRunning(Part::Comparison));
        h.quantity *= 2.0;
        edit::setHolding(wb, 0, h, QStringLiteral("Double")); // the running job is now stale
        store.runner().waitForDone();
        QCoreApplication::processEvents(); // whatever the stale job posted arrives now
        QVERIFY(changed.isEmpty());
        QCOMPARE(store.state(Part::Comparison), PartState::OutOfDate); // not watched: waits for a request
        QCOMPARE(store.status(Part::Comparison).generation, held);
        QCOMPARE(store.comparison()->value().front().figures->var, before);
    }

    // A stopped run leaves the last complete figures, marked out of date, never a mix.
    void aStoppedRunKeepsThePreviousFiguresWhole()
    {
        Workbook wb;
        WorkbookContents c = sampleContents();
        c.backtest = BacktestSettings{250, 0.05, {RiskModel::Normal, RiskModel::Historical, RiskModel::StudentT}};
        wb.resetContents(c, {});
        ResultsStore &store = wb.results();
        store.computeNow(Part::Backtest);
        QCOMPARE(store.state(Part::Backtest), PartState::Ready);
        const quint64 complete = store.backtest().generation;
        for (const auto &m : store.backtest().models)
            QCOMPARE(m.result->value().window, 250);

        BacktestSettings s = wb.backtestSettings();
        s.window = 300;
        edit::setBacktestSettings(wb, s, QStringLiteral("W 300"), edit::MergeKey::None);
        store.request(Part::Backtest);
        QVERIFY(store.isRunning(Part::Backtest));
        store.cancel(Part::Backtest); // stopped while it runs
        QVERIFY(!store.isRunning(Part::Backtest));
        QCOMPARE(store.state(Part::Backtest), PartState::OutOfDate);
        store.runner().waitForDone();
        QCoreApplication::processEvents();
        QCOMPARE(store.state(Part::Backtest), PartState::OutOfDate);
        QCOMPARE(store.backtest().generation, complete);
        for (const auto &m : store.backtest().models) {
            QVERIFY(m.result.has_value());
            QCOMPARE(m.result->value().window, 250); // all of the previous run, none of the stopped one
        }
        // Asked again, it computes the current settings.
        store.computeNow(Part::Backtest);
        QCOMPARE(store.state(Part::Backtest), PartState::Ready);
        for (const auto &m : store.backtest().models)
            QCOMPARE(m.result->value().window, 300);
    }

    // Parts nobody looks at wait for their first need; watched parts follow every edit.
    void unwatchedPartsCostNothingPerEdit()
    {
        Workbook wb;
        wb.resetContents(sampleContents(), {});
        ResultsStore &store = wb.results();
        QSignalSpy backtest(&store, &ResultsStore::backtestChanged);
        QSignalSpy comparison(&store, &ResultsStore::comparisonChanged);
        for (int i = 0; i < 5; ++i) {
            Holding h = wb.holdings().front();
            h.quantity += 1.0;
            edit::setHolding(wb, 0, h, QStringLiteral("+1"));
            QTest::qWait(200); // longer than the backtest's coalescing delay
            QVERIFY(!store.isRunning(Part::Backtest));
            QVERIFY(!store.runner().isRunning(static_cast<int>(Part::Backtest)));
        }
        QVERIFY(backtest.isEmpty());
        QVERIFY(comparison.isEmpty());
        QCOMPARE(store.state(Part::Headline), PartState::Ready); // the headline is always watched
        // Watched, the backtest follows an edit in the background.
        store.setDelay(Part::Backtest, 0);
        store.setWatched(Part::Backtest, true);
        QVERIFY(store.isRunning(Part::Backtest));
        QTRY_COMPARE_WITH_TIMEOUT(store.state(Part::Backtest), PartState::Ready, 30000);
    }

    // The grid part's cells are core's modelRiskGrid of the headline's report, exactly, under
    // every model (core's tests check modelRiskGrid against published values); the tab's pictures
    // built from it are those built on the spot.
    void gridIsCoresModelRiskGrid_data()
    {
        QTest::addColumn<int>("model");
        QTest::newRow("normal") << static_cast<int>(RiskModel::Normal);
        QTest::newRow("student-t") << static_cast<int>(RiskModel::StudentT);
        QTest::newRow("cornish-fisher") << static_cast<int>(RiskModel::CornishFisher);
        QTest::newRow("historical") << static_cast<int>(RiskModel::Historical);
        QTest::newRow("monte-carlo") << static_cast<int>(RiskModel::MonteCarlo);
    }
    void gridIsCoresModelRiskGrid()
    {
        QFETCH(int, model);
        Workbook wb;
        WorkbookContents c = sampleContents();
        c.assumptions.model = static_cast<RiskModel>(model);
        c.assumptions.simulations = 20000;
        wb.resetContents(c, {});
        ResultsStore &store = wb.results();
        store.setGridConfidences(tradeoffGridConfidences());
        store.computeNow(Part::Grid); // computes the headline first
        QCOMPARE(store.state(Part::Headline), PartState::Ready);
        QCOMPARE(store.state(Part::Grid), PartState::Ready);
        QCOMPARE(store.status(Part::Grid).generation, store.inputGeneration(Part::Grid));
        const GridRun &run = store.grid();
        QVERIFY(run.report && run.grid && run.grid->ok());
        const auto core = modelRiskGrid(*store.report(), gridHorizons(*store.report()), tradeoffGridConfidences());
        QVERIFY(core.ok());
        const RiskGrid &g = run.grid->value();
        QCOMPARE(g.horizons, core.value().horizons);
        QCOMPARE(g.confidences, core.value().confidences);
        QCOMPARE(g.var, core.value().var); // exactly: the same function of the same report
        QCOMPARE(g.es, core.value().es);
        // The headline is the grid's cell at its own horizon and confidence.
        const auto h = std::find(g.horizons.begin(), g.horizons.end(), wb.assumptions().horizonDays);
        QVERIFY(h != g.horizons.end());
        const TradeoffChartData fromStore = buildTradeoffChartData(*run.report, *run.grid);
        const TradeoffChartData onTheSpot = buildTradeoffChartData(*store.report());
        QVERIFY(fromStore.valid);
        QCOMPARE(fromStore.map.var, onTheSpot.map.var);
        QCOMPARE(fromStore.byHorizon.var, onTheSpot.byHorizon.var);
        QCOMPARE(fromStore.byConfidence.var, onTheSpot.byConfidence.var);
        QCOMPARE(fromStore.contours.size(), onTheSpot.contours.size());
        // A grid of other columns than the pictures ask for draws nothing rather than wrong cells.
        store.setGridConfidences({0.95, 0.99});
        store.computeNow(Part::Grid);
        QVERIFY(!buildTradeoffChartData(*store.grid().report, *store.grid().grid).valid);
    }

    // Watched, the grid runs in the background after the headline; an edit meanwhile drops it;
    // a stop keeps the last figures whole, marked out of date; nobody watching, it costs nothing.
    void gridRunsInTheBackground()
    {
        Workbook wb;
        wb.resetContents(sampleContents(), {});
        ResultsStore &store = wb.results();
        store.setGridConfidences(tradeoffGridConfidences());
        QSignalSpy changed(&store, &ResultsStore::gridChanged);
        // Not watched: edits leave it alone.
        Holding h = wb.holdings().front();
        h.quantity += 1.0;
        edit::setHolding(wb, 0, h, QStringLiteral("+1"));
        QCoreApplication::processEvents();
        QVERIFY(!store.isRunning(Part::Grid));
        QVERIFY(!store.runner().isRunning(static_cast<int>(Part::Grid)));
        QVERIFY(!store.grid().grid);

        store.setWatched(Part::Grid, true);
        QVERIFY(store.isRunning(Part::Grid));
        QTRY_COMPARE_WITH_TIMEOUT(store.state(Part::Grid), PartState::Ready, 30000);
        const quint64 first = store.status(Part::Grid).generation;
        const double firstVar = store.grid().grid->value().var.back();
        QCOMPARE(store.grid().report->figures.var, store.report()->figures.var);

        // An edit while it runs: the running job's result is dropped, the new inputs' one arrives.
        h.quantity *= 2.0;
        edit::setHolding(wb, 0, h, QStringLiteral("Double"));
        QTRY_VERIFY_WITH_TIMEOUT(store.isRunning(Part::Grid), 5000);
        h.quantity *= 2.0;
        edit::setHolding(wb, 0, h, QStringLiteral("Double again"));
        QCOMPARE(store.status(Part::Grid).generation, first); // nothing of the middle edit yet
        QTRY_COMPARE_WITH_TIMEOUT(store.state(Part::Grid), PartState::Ready, 30000);
        QCOMPARE(store.status(Part::Grid).generation, store.inputGeneration(Part::Grid));
        const auto core = modelRiskGrid(wb.results().report().value(), gridHorizons(*store.report()), tradeoffGridConfidences());
        QCOMPARE(store.grid().grid->value().var, core.value().var);
        QVERIFY(store.grid().grid->value().var.back() != firstVar);

        // Stopped while it runs: the figures held are the last complete ones, out of date.
        const quint64 held = store.status(Part::Grid).generation;
        const std::vector<double> heldVar = store.grid().grid->value().var;
        store.setWatched(Part::Grid, false);
        h.quantity *= 0.5;
        edit::setHolding(wb, 0, h, QStringLiteral("Half"));
        store.request(Part::Grid);
        QTRY_VERIFY_WITH_TIMEOUT(store.isRunning(Part::Grid), 5000);
        store.cancel(Part::Grid);
        QCOMPARE(store.state(Part::Grid), PartState::OutOfDate);
        store.runner().waitForDone();
        QCoreApplication::processEvents();
        QCOMPARE(store.state(Part::Grid), PartState::OutOfDate);
        QCOMPARE(store.status(Part::Grid).generation, held);
        QCOMPARE(store.grid().grid->value().var, heldVar);
        QVERIFY(!changed.isEmpty());
    }

    // The runner: a superseded job's result is never delivered; progress comes in whole percents.
    void runnerDropsSupersededJobsAndThrottlesProgress()
    {
        JobRunner runner;
        std::atomic<bool> release{false};
        QList<int> delivered;
        QList<double> progress;
        runner.start<int>(
            1, JobRunner::Where::Background,
            [&release](const RunControl &control) -> Result<int> {
                while (!release.load() && !control.stop.stop_requested())
                    std::this_thread::sleep_for(std::chrono::milliseconds(1));
                return 1;
            },
            [&delivered](Result<int> r) { delivered << r.value(); });
        runner.start<int>(
            1, JobRunner::Where::Background,
            [](const RunControl &control) -> Result<int> {
                for (int i = 0; i <= 10000; ++i)
                    control.progress(i / 10000.0);
                return 2;
            },
            [&delivered](Result<int> r) { delivered << r.value(); },
            [&progress](double f) { progress << f; });
        release = true;
        runner.waitForDone();
        QCoreApplication::processEvents();
        QCOMPARE(delivered, QList<int>{2});
        QVERIFY(progress.size() <= 101);
        for (qsizetype i = 1; i < progress.size(); ++i)
            QVERIFY(progress[i] > progress[i - 1]);
        QVERIFY(!runner.isRunning(1));
        // Inline: delivered before start() returns.
        runner.start<int>(2, JobRunner::Where::Inline, [](const RunControl &) -> Result<int> { return 3; },
                          [&delivered](Result<int> r) { delivered << r.value(); });
        QCOMPARE(delivered.back(), 3);
    }
};

QTEST_MAIN(TestResultsStore)
#include "test_resultsstore.moc"

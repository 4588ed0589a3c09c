// The window beyond the normal model: the model comparison table, what-if trades, stress
// scenarios (in the workbook and its file), the model settings and Monte Carlo in the background.
// Each figure the window shows is checked against core called directly on the same inputs (the
// window must show core's numbers, not its own), and the stress P&L also against a hand sum
// Σ quantity × last price × shock (stress.h's definition).
#include "windowfixture.h"

#include "charts/losstailchart.h"
#include "document/commands.h"
#include "document/workbookfile.h"
#include "models/modelcomparisonmodel.h"
#include "panels/charttabs.h"
#include "text/numbers.h"
#include "panels/modelcomparisonview.h"
#include "panels/stresspanel.h"
#include "document/resultsstore.h"
#include "panels/whatifpanel.h"

#include "tailwise/comparison.h"
#include "tailwise/stress.h"
#include "tailwise/whatif.h"

#include <QAbstractItemModelTester>
#include <QCheckBox>
#include <QComboBox>
#include <QFile>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLabel>
#include <QLineEdit>
#include <QListWidget>
#include <QSignalSpy>
#include <QSpinBox>
#include <QTableWidget>
#include <QTemporaryDir>
#include <QUndoStack>

#include <cmath>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

// Relative closeness for figures that went through the same core call (should be identical).
void expectSame(double actual, double expected, const char *what)
{
    const double tol = 1e-9 * std::max(1.0, std::abs(expected));
    if (std::abs(actual - expected) > tol)
        QFAIL(qPrintable(QStringLiteral("%1: actual %2, expected %3, tolerance %4")
                             .arg(QLatin1String(what))
                             .arg(actual, 0, 'g', 17)
                             .arg(expected, 0, 'g', 17)
                             .arg(tol)));
}

// Saves a picture of a widget when TAILWISE_TEST_PICTURES names a folder (to look at the panels).
void picture(QWidget *w, const char *name)
{
    const QByteArray dir = qgetenv("TAILWISE_TEST_PICTURES");
    if (!dir.isEmpty())
        w->grab().save(QString::fromLocal8Bit(dir) + QLatin1Char('/') + QLatin1String(name) + QStringLiteral(".png"));
}

} // namespace

class TestModelPanels : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() { test::isolateSettings(); }

    void comparisonTableEqualsCore()
    {
        auto window = test::sampleWindow();
        window->resize(1360, 860);
        window->show();
        ModelComparisonView *view = window->chartTabs()->modelComparison();
        QAbstractItemModelTester tester(view->model(), QAbstractItemModelTester::FailureReportingMode::QtTest);
        window->chartTabs()->tabs()->setCurrentWidget(view);
        view->computeNow();
        picture(window.get(), "models-side-by-side");
        const Workbook &wb = window->workbook();
        const auto core = compareModels(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY2(core.ok(), core.ok() ? "" : core.error().message.c_str());
        const auto &rows = core.value();
        ModelComparisonModel *m = view->model();
        QCOMPARE(m->rowCount(), 5);
        QCOMPARE(static_cast<int>(rows.size()), 5);
        const double value = wb.results().report()->portfolioValue;
        const double normalVar = rows[0].figures->var;
        const double normalEs = rows[0].figures->es;
        for (int r = 0; r < 5; ++r) {
            const ModelRow &row = rows[static_cast<std::size_t>(r)];
            QVERIFY2(row.figures.has_value(), row.error.c_str());
            auto cell = [&](int c) { return m->data(m->index(r, c), ModelComparisonModel::ValueRole).toDouble(); };
            expectSame(cell(ModelComparisonModel::VarColumn), row.figures->var, "VaR");
            expectSame(cell(ModelComparisonModel::EsColumn), row.figures->es, "ES");
            expectSame(cell(ModelComparisonModel::VarPercentColumn), row.figures->var / value, "VaR share");
            expectSame(cell(ModelComparisonModel::EsPercentColumn), row.figures->es / value, "ES share");
            expectSame(cell(ModelComparisonModel::VarVsNormalColumn), row.figures->var - normalVar, "VaR vs normal");
            expectSame(cell(ModelComparisonModel::EsVsNormalColumn), row.figures->es - normalEs, "ES vs normal");
            QVERIFY(!m->data(m->index(r, ModelComparisonModel::VarColumn)).toString().isEmpty());
        }
        // The normal row is the headline's figure (same assumptions, normal model).
        expectSame(rows[0].figures->var, wb.results().report()->figures.var, "normal row vs headline");
        // Monte Carlo's row carries its standard error in the notes.
        QVERIFY(m->data(m->index(4, ModelComparisonModel::NoteColumn)).toString().contains(QStringLiteral("±")));
    }

    void comparisonRunsInTheBackground()
    {
        auto window = test::sampleWindow();
        window->show();
        ModelComparisonView *view = window->chartTabs()->modelComparison();
        window->chartTabs()->tabs()->setCurrentWidget(view);
        QTRY_VERIFY_WITH_TIMEOUT(!view->isComputing() && view->model()->rowCount() == 5, 60000);
    }

    void tradeAppliesAsOneUndoStep()
    {
        auto window = test::sampleWindow();
        Workbook &wb = window->workbook();
        // Close WOLDS_UTILITIES first, so the proposal includes an asset that is not held.
        const int woldsRow = 9;
        QCOMPARE(wb.holdings()[woldsRow].asset, std::string("WOLDS_UTILITIES"));
        edit::removeHoldings(wb, {woldsRow});
        window->results().computeNow(Part::Headline);
        const Holdings start = wb.holdings();

        WhatIfPanel *panel = window->chartTabs()->whatIfPanel();
        const std::vector<Trade> trades{{"ORRIN_BANK", -4000.0}, {"WOLDS_UTILITIES", 3000.0}};
        panel->setTrades(trades);
        panel->computeNow();
        QVERIFY2(panel->result().has_value(), qPrintable(panel->problem()));
        const auto core = whatIf(wb.prices(), wb.holdings(), wb.assumptions(), trades);
        QVERIFY(core.ok());
        expectSame(panel->result()->figures.varBefore, core.value().figures.varBefore, "VaR before");
        expectSame(panel->result()->figures.varAfter, core.value().figures.varAfter, "VaR after");
        expectSame(panel->result()->figures.marginalEstimate, core.value().figures.marginalEstimate, "marginal");
        expectSame(panel->result()->figures.varBefore, wb.results().report()->figures.var, "VaR before vs headline");
        // The ghost curve (the portfolio now) is drawn in the panel's loss tail.
        QVERIFY(!panel->chart()->data().overlays.isEmpty());
        QVERIFY(panel->chart()->data().overlays.front().ghost);
        // Contributions before and after, one row per asset of the common list.
        QCOMPARE(panel->contributionsTable()->rowCount(), static_cast<int>(core.value().before.holdings.size()));
        window->resize(1360, 860);
        window->show();
        window->chartTabs()->tabs()->setCurrentWidget(panel);
        picture(window.get(), "try-a-trade");

        const int before = wb.undoStack()->count();
        QVERIFY(panel->apply());
        QCOMPARE(wb.undoStack()->count(), before + 1);
        window->results().computeNow(Part::Headline);
        const auto expectedHoldings = applyTrades(start, trades, wb.prices());
        QVERIFY(expectedHoldings.ok());
        const auto expected = computeRisk(wb.prices(), expectedHoldings.value(), wb.assumptions());
        QVERIFY(expected.ok());
        QVERIFY(wb.results().report().has_value());
        expectSame(wb.results().report()->figures.var, expected.value().figures.var, "headline VaR after apply");
        expectSame(wb.results().report()->figures.var, core.value().figures.varAfter, "headline VaR vs what-if after");
        auto *varLabel = window->findChild<QLabel *>(QStringLiteral("varMoney"));
        QVERIFY(varLabel);
        QCOMPARE(varLabel->text(), moneyText(expected.value().figures.var));
        QVERIFY(panel->trades().empty()); // the proposal is used up

        wb.undoStack()->undo();
        QCOMPARE(wb.holdings().size(), start.size());
        for (std::size_t i = 0; i < start.size(); ++i) {
            QCOMPARE(wb.holdings()[i].asset, start[i].asset);
            QCOMPARE(wb.holdings()[i].quantity, start[i].quantity);
        }
    }

    void discardChangesNothing()
    {
        auto window = test::sampleWindow();
        Workbook &wb = window->workbook();
        WhatIfPanel *panel = window->chartTabs()->whatIfPanel();
        const int count = wb.undoStack()->count();
        panel->setTrades({{"LARK_ENERGY", 100.0}});
        panel->computeNow();
        panel->discard();
        QVERIFY(panel->trades().empty());
        QVERIFY(!panel->result().has_value());
        QCOMPARE(wb.undoStack()->count(), count);
    }

    void stressPnlEqualsCore()
    {
        auto window = test::sampleWindow();
        Workbook &wb = window->workbook();
        const std::vector<StressScenario> scenarios{
            {"Equity drawdown -20%", {{"LARK_ENERGY", -0.2}, {"ORRIN_BANK", -0.2}, {"TALLIS_SOFTWARE", -0.2}}},
            {"Rates up: bonds -5%", {{"ASHGROVE_BOND_FUND", -0.05}}},
        };
        edit::setScenarios(wb, scenarios, QStringLiteral("Add scenarios"));
        // Hidden, the stress tab costs nothing: its part waits, out of date, until it is needed.
        QVERIFY(!wb.results().isReady(Part::Stress));
        wb.results().computeNow(Part::Stress);
        StressPanel *panel = window->chartTabs()->stressPanel();
        const auto core = runStress(wb.prices(), wb.holdings(), wb.assumptions(), scenarios, StressPanel::worstDayCount);
        QVERIFY(core.ok());
        const auto &shown = panel->outcomes();
        QCOMPARE(shown.size(), core.value().size());
        QCOMPARE(static_cast<int>(shown.size()), 2 + StressPanel::worstDayCount);
        for (std::size_t i = 0; i < shown.size(); ++i) {
            QCOMPARE(shown[i].name, core.value()[i].name);
            expectSame(shown[i].pnl, core.value()[i].pnl, "stress P&L");
            QCOMPARE(shown[i].date.has_value(), core.value()[i].date.has_value());
        }
        // stress.h: P&L = Σ e_i s_i with e_i = quantity × last close (no price overrides here).
        auto lastClose = [&](const char *asset) {
            return wb.prices().prices(wb.prices().dayCount() - 1, wb.prices().assetIndex(asset));
        };
        auto quantity = [&](const char *asset) {
            for (const Holding &h : wb.holdings())
                if (h.asset == asset)
                    return h.quantity;
            return 0.0;
        };
        const double hand = -0.2 * (quantity("LARK_ENERGY") * lastClose("LARK_ENERGY") + quantity("ORRIN_BANK") * lastClose("ORRIN_BANK")
                                     + quantity("TALLIS_SOFTWARE") * lastClose("TALLIS_SOFTWARE"));
        QVERIFY2(std::abs(shown[0].pnl - hand) <= 1e-6 * std::abs(hand),
                 qPrintable(QStringLiteral("actual %1, hand sum %2").arg(shown[0].pnl, 0, 'f', 4).arg(hand, 0, 'f', 4)));
        // The worst days come worst first, each with its date shown in the table.
        QVERIFY(shown[2].pnl <= shown[3].pnl);
        QTableWidget *table = panel->outcomesTable();
        QCOMPARE(table->rowCount(), static_cast<int>(shown.size()));
        QCOMPARE(table->item(2, 1)->text(), dateText(*shown[2].date));
        window->resize(1360, 860);
        window->show();
        window->chartTabs()->tabs()->setCurrentWidget(panel);
        picture(window.get(), "stress");

        // Editing a scenario is an undo step; undo brings the list back.
        const int count = wb.undoStack()->count();
        auto edited = wb.scenarios();
        edited.pop_back();
        edit::setScenarios(wb, edited, QStringLiteral("Remove scenario"));
        QCOMPARE(panel->scenarioList()->count(), 1);
        QCOMPARE(wb.undoStack()->count(), count + 1);
        wb.undoStack()->undo();
        QCOMPARE(panel->scenarioList()->count(), 2);
        // In view, the stress part is recomputed in the background after each change.
        QTRY_VERIFY_WITH_TIMEOUT(wb.results().isReady(Part::Stress), 30000);
        QCOMPARE(static_cast<int>(panel->outcomes().size()), 2 + StressPanel::worstDayCount);
    }

    void scenariosRoundTripThroughTheFile()
    {
        auto loaded = loadWorkbook(test::samplePath("larchmere.tailwise"));
        QVERIFY(loaded.ok());
        WorkbookContents contents = std::move(loaded).value();
        contents.scenarios = {
            {"Equity drawdown -20%", {{"LARK_ENERGY", -0.2}, {"FENWAY_RAIL", -0.123456789012345}}},
            {"Gold up", {{"HAVEN_GOLD_TRUST", 0.1}}},
            {"Nothing moves", {}},
        };
        QTemporaryDir dir;
        const QString path = dir.filePath(QStringLiteral("stress.tailwise"));
        const Status saved = saveWorkbook(contents, path);
        QVERIFY2(saved.ok(), saved.ok() ? "" : saved.error().message.c_str());
        const auto back = loadWorkbook(path);
        QVERIFY2(back.ok(), back.ok() ? "" : back.error().message.c_str());
        QCOMPARE(back.value().scenarios.size(), contents.scenarios.size());
        for (std::size_t i = 0; i < contents.scenarios.size(); ++i) {
            QCOMPARE(back.value().scenarios[i].name, contents.scenarios[i].name);
            QVERIFY(back.value().scenarios[i].shocks == contents.scenarios[i].shocks); // exact doubles
        }
    }

    void fileWithoutScenariosStillOpens_data()
    {
        QTest::addColumn<QByteArray>("edit");
        QTest::addColumn<QString>("expected");
        QTest::newRow("unknown asset") << QByteArray(R"([{"name": "x", "shocks": [{"asset": "NOPE", "shock": -0.1}]}])")
                                       << QStringLiteral("scenarios[0].shocks[0].asset");
        QTest::newRow("shock -1") << QByteArray(R"([{"name": "x", "shocks": [{"asset": "LARK_ENERGY", "shock": -1}]}])")
                                  << QStringLiteral("scenarios[0].shocks[0].shock");
        QTest::newRow("twice") << QByteArray(R"([{"name": "x", "shocks": []}, {"name": "x", "shocks": []}])")
                               << QStringLiteral("scenarios[1].name");
        QTest::newRow("empty name") << QByteArray(R"([{"name": "", "shocks": []}])") << QStringLiteral("scenarios[0].name");
        QTest::newRow("not a list") << QByteArray(R"("none")") << QStringLiteral("scenarios");
    }
    void fileWithoutScenariosStillOpens()
    {
        QFETCH(QByteArray, edit);
        QFETCH(QString, expected);
        QFile file(test::samplePath("larchmere.tailwise"));
        QVERIFY(file.open(QIODevice::ReadOnly));
        QByteArray json = file.readAll();
        // The sample as committed may or may not hold scenarios: take them out, then put a bad list in.
        QJsonObject root = QJsonDocument::fromJson(json).object();
        root.remove(QStringLiteral("scenarios"));
        const auto plain = parseWorkbookJson(QJsonDocument(root).toJson(), QStringLiteral("old.tailwise"));
        QVERIFY(plain.ok());
        QVERIFY(plain.value().scenarios.empty());
        QByteArray bad = QJsonDocument(root).toJson(QJsonDocument::Compact);
        bad.chop(1);
        bad += ",\"scenarios\":" + edit + "}";
        const auto refused = parseWorkbookJson(bad, QStringLiteral("bad.tailwise"));
        QVERIFY(!refused.ok());
        const QString message = QString::fromStdString(refused.error().message);
        QVERIFY2(message.startsWith(QStringLiteral("bad.tailwise: ") + expected + QStringLiteral(": ")), qPrintable(message));
    }

    void modelSettingsEditTheAssumptions()
    {
        auto window = test::sampleWindow();
        Workbook &wb = window->workbook();
        Assumptions a = wb.assumptions();
        a.model = RiskModel::MonteCarlo;
        edit::setAssumptions(wb, a, QStringLiteral("Monte Carlo"));
        auto *sims = window->findChild<QSpinBox *>(QStringLiteral("simulations"));
        auto *seed = window->findChild<QLineEdit *>(QStringLiteral("seed"));
        auto *dofKind = window->findChild<QComboBox *>(QStringLiteral("dofKind"));
        QVERIFY(sims && seed && dofKind);
        sims->setValue(20000);
        QCOMPARE(wb.assumptions().simulations, 20000);
        seed->setText(QStringLiteral("18446744073709551615"));
        emit seed->editingFinished();
        QCOMPARE(wb.assumptions().seed, std::uint64_t(18446744073709551615ULL));
        dofKind->setCurrentIndex(dofKind->findText(QStringLiteral("Student-t draws, ν given")));
        QCOMPARE(wb.assumptions().dof.kind, DegreesOfFreedom::Kind::Given);
        a = wb.assumptions();
        a.model = RiskModel::Historical;
        edit::setAssumptions(wb, a, QStringLiteral("Historical"));
        auto *hs = window->findChild<QComboBox *>(QStringLiteral("historicalHorizon"));
        QVERIFY(hs);
        hs->setCurrentIndex(hs->findData(int(HistoricalHorizon::Overlapping)));
        QCOMPARE(wb.assumptions().historicalHorizon, HistoricalHorizon::Overlapping);
        window->results().computeNow(Part::Headline);
        const auto expected = computeRisk(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY(expected.ok() && wb.results().report());
        expectSame(wb.results().report()->figures.var, expected.value().figures.var, "historical overlapping VaR");
    }

    // The multi-day scaling (multidayscaling.h) is a choice of the pane for Student-t and
    // Cornish–Fisher only; changing it is an undoable edit that recomputes the headline at once to
    // core's figure under that choice, and the pane and the notes say what it used.
    void scalingChoiceRecomputesLive()
    {
        auto window = test::sampleWindow();
        window->show();
        Workbook &wb = window->workbook();
        auto *scaling = window->findChild<QComboBox *>(QStringLiteral("scaling"));
        auto *note = window->findChild<QLabel *>(QStringLiteral("modelNote"));
        auto *notes = window->findChild<QLabel *>(QStringLiteral("headlineNotes"));
        QVERIFY(scaling && note && notes);
        QVERIFY(!scaling->isVisibleTo(window.get())); // normal: no such choice
        for (RiskModel model : {RiskModel::StudentT, RiskModel::CornishFisher}) {
            Assumptions a = wb.assumptions();
            a.model = model;
            a.horizonDays = 10;
            a.scaling = MultiDayScaling::SquareRoot;
            edit::setAssumptions(wb, a, QStringLiteral("model"));
            window->results().computeNow(Part::Headline);
            QVERIFY(scaling->isVisibleTo(window.get()));
            QCOMPARE(scaling->currentData().toInt(), int(MultiDayScaling::SquareRoot));
            QVERIFY2(note->text().contains(QStringLiteral("× √10")), qPrintable(note->text()));
            const double rootVar = wb.results().report()->figures.var;

            const int count = wb.undoStack()->count();
            scaling->setCurrentIndex(scaling->findData(int(MultiDayScaling::Aggregate)));
            QCOMPARE(wb.assumptions().scaling, MultiDayScaling::Aggregate);
            QCOMPARE(wb.undoStack()->count(), count + 1);
            QTRY_VERIFY(wb.results().isReady(Part::Headline));
            const auto expected = computeRisk(wb.prices(), wb.holdings(), wb.assumptions());
            QVERIFY(expected.ok() && wb.results().report());
            expectSame(wb.results().report()->figures.var, expected.value().figures.var, "aggregate VaR");
            expectSame(wb.results().report()->figures.es, expected.value().figures.es, "aggregate ES");
            // The sum of ten days has thinner tails than one day: a smaller 99% VaR on the sample.
            QVERIFY(expected.value().figures.var < rootVar);
            QVERIFY2(note->text().contains(QStringLiteral("10-day sum")), qPrintable(note->text()));
            // The loss tail in view follows: its VaR line is the new headline's.
            QTRY_COMPARE(window->chartTabs()->lossTailChart()->data().tailBoundary, -expected.value().figures.var);
            picture(window.get(), model == RiskModel::StudentT ? "scaling-student-t" : "scaling-cornish-fisher");

            wb.undoStack()->undo();
            QCOMPARE(wb.assumptions().scaling, MultiDayScaling::SquareRoot);
            QCOMPARE(scaling->currentData().toInt(), int(MultiDayScaling::SquareRoot));
            window->results().computeNow(Part::Headline);
            QCOMPARE(wb.results().report()->figures.var, rootVar);
        }

        // Student-t with ν ≤ 4: ν is kept under aggregate scaling, and the notes say so.
        Assumptions a = wb.assumptions();
        a.model = RiskModel::StudentT;
        a.dof = DegreesOfFreedom::given(3.5);
        a.scaling = MultiDayScaling::Aggregate;
        edit::setAssumptions(wb, a, QStringLiteral("ν 3.5"));
        window->results().computeNow(Part::Headline);
        QVERIFY2(notes->text().contains(QStringLiteral("aggregate scaling keeps 3.5")), qPrintable(notes->text()));
        QVERIFY2(note->text().contains(QStringLiteral("ν is kept")), qPrintable(note->text()));
    }

    void monteCarloShowsProgressAndStops()
    {
        auto window = test::sampleWindow();
        Workbook &wb = window->workbook();
        QSignalSpy progress(&wb.results(), &ResultsStore::progress);
        Assumptions a = wb.assumptions();
        a.model = RiskModel::MonteCarlo;
        a.simulations = 10000000; // long enough to be stopped half-way
        edit::setAssumptions(wb, a, QStringLiteral("Monte Carlo"));
        QTRY_VERIFY_WITH_TIMEOUT(wb.results().isRunning(Part::Headline), 5000);
        QTRY_VERIFY_WITH_TIMEOUT(!progress.isEmpty(), 30000);
        QCOMPARE(progress.first().first().value<Part>(), Part::Headline);
        const double first = progress.first().at(1).toDouble();
        QVERIFY(first >= 0.0 && first < 1.0);
        wb.results().cancel(Part::Headline);
        QVERIFY(!wb.results().runner().isRunning(static_cast<int>(Part::Headline)));
        QCOMPARE(wb.results().state(Part::Headline), PartState::OutOfDate);
        const quint64 generation = wb.inputGeneration();
        QTest::qWait(200);
        QCOMPARE(wb.inputGeneration(), generation);

        // A short run in the background gives core's figures.
        a.simulations = 20000;
        edit::setAssumptions(wb, a, QStringLiteral("fewer draws"));
        QTRY_VERIFY_WITH_TIMEOUT(wb.results().isReady(Part::Headline), 60000);
        const auto expected = computeRisk(wb.prices(), wb.holdings(), wb.assumptions());
        QVERIFY(expected.ok());
        expectSame(wb.results().report()->figures.var, expected.value().figures.var, "Monte Carlo VaR, same seed");
    }

    void overlayDrawsOtherModels()
    {
        auto window = test::sampleWindow();
        ChartTabs *tabs = window->chartTabs();
        tabs->modelOverlayOption()->setChecked(true);
        // The other models' curves come from the results store, computed off the GUI thread.
        ResultsStore &results = window->workbook().results();
        QVERIFY(results.isRunning(Part::Overlays));
        QTRY_VERIFY_WITH_TIMEOUT(results.isReady(Part::Overlays), 30000);
        const auto &d = tabs->lossTailChart()->data();
        QCOMPARE(d.overlays.size(), 2); // Student-t and Cornish–Fisher beside the normal curve
        for (const auto &o : d.overlays) {
            QCOMPARE(o.density.size(), d.x.size());
            for (double y : o.density)
                QVERIFY(std::isfinite(y) && y >= 0.0);
        }
        window->resize(1360, 860);
        window->show();
        picture(window.get(), "overlay");
    }
};

QTEST_MAIN(TestModelPanels)
#include "test_modelpanels.moc"

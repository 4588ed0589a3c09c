// The backtest in the window: the chart's data (ui/charts/backtestchartdata.h), the background
// results store (ui/document/resultsstore.h), the view (ui/panels/backtestview.h) and the backtest
// settings in the workbook file. Every figure checked here is core's (runBacktest, verdictAt),
// which tests/core and tests/cli check against the NumPy fixture of the real data set and the
// published tables (REFERENCE-VALUES.md); these tests check that the window shows exactly those.
#include "chartfixture.h"

#include "charts/backtestchart.h"
#include "charts/backtestchartdata.h"
#include "document/commands.h"
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "document/backtestrequest.h"
#include "document/resultsstore.h"
#include "mainwindow.h"
#include "panels/backtestview.h"
#include "panels/charttabs.h"

#include "tailwise/backtest.h"

#include <QCheckBox>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QJsonDocument>
#include <QJsonObject>
#include <QSignalSpy>
#include <QSpinBox>
#include <QTabWidget>
#include <QTableWidget>
#include <QPushButton>
#include <QTest>
#include <QUndoStack>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

QString samplePath() { return QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise"); }

WorkbookContents sampleContents()
{
    WorkbookContents c;
    c.title = QStringLiteral("Sample");
    c.prices = chartfixture::samplePrices();
    c.holdings = chartfixture::sampleHoldings();
    c.assumptions.horizonDays = 10;
    c.assumptions.window = 500;
    return c;
}

BacktestResult coreBacktest(const Workbook &wb, const BacktestSettings &s, RiskModel model)
{
    auto r = runBacktest(backtestRequestFor(wb.contents(), s, model));
    if (!r)
        qFatal("runBacktest: %s", r.error().message.c_str());
    return r.value();
}

} // namespace

class TestBacktestView : public QObject {
    Q_OBJECT
private slots:
    void chartDataExceptionsEqualCore();
    void chartDataOfNoDays();
    void requestUsesTheSettingsAndOneDay();
    void viewShowsZoneAndVerdictForTheSample();
    void comparisonRowsEqualCore();
    void testSizeChangesTheVerdictWithoutRerunning();
    void changingTheWindowRerunsAndDropsTheStaleResult();
    void cancelShowsNothingAndRunAgainWorks();
    void tooLongWindowSaysSo();
    void workbookRoundTripsTheBacktestSettings();
    void workbookRefusesBadBacktestSettings();
    void sampleWorkbookHasBacktestSettings();
    void settingsEditIsOneUndoStep();
    void picture();
    void windowHasTheBacktestTab();
};

void TestBacktestView::chartDataExceptionsEqualCore()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    const BacktestResult r = coreBacktest(wb, BacktestSettings{}, RiskModel::Normal);
    const BacktestChartData d = buildBacktestChartData(r, QStringLiteral("Normal"));

    QCOMPARE(d.keys.size(), qsizetype(r.days.size()));
    QCOMPARE(d.skippedDays, 0);
    const std::vector<Date> dates = exceptionDates(r);
    QVERIFY2(!dates.empty(), "the sample should have exceptions at 99% over its tested days");
    QCOMPARE(d.exceptionKeys.size(), qsizetype(dates.size()));
    QCOMPARE(d.exceptionKeys.size(), qsizetype(r.exceptions));
    for (std::size_t i = 0; i < dates.size(); ++i)
        QCOMPARE(d.exceptionKeys[qsizetype(i)], backtestDateKey(dates[i]));
    for (std::size_t i = 0; i < r.days.size(); ++i) {
        QCOMPARE(d.pnl[qsizetype(i)], r.days[i].pnl);
        QCOMPARE(d.negVar[qsizetype(i)], -r.days[i].var);
    }
    for (qsizetype k = 0; k < d.exceptionDays.size(); ++k) {
        const BacktestDay &day = r.days[std::size_t(d.exceptionDays[k])];
        QVERIFY(day.exception);
        QCOMPARE(d.exceptionPnl[k], day.pnl);
        QVERIFY(-day.pnl > day.var); // the definition (backtest.h), as core decided it
    }
    // The range holds every point, and 1970-01-01 is key 0 (QCPAxisTickerDateTime's epoch).
    QCOMPARE(backtestDateKey(dateFromCivil(1970, 1, 2)), 86400.0);
    for (qsizetype i = 0; i < d.keys.size(); ++i) {
        QVERIFY(d.keys[i] > d.xMin && d.keys[i] < d.xMax);
        QVERIFY(d.pnl[i] >= d.yMin && d.pnl[i] <= d.yMax);
        QVERIFY(d.negVar[i] >= d.yMin && d.negVar[i] <= d.yMax);
    }
    QVERIFY(d.varLegend.contains(QStringLiteral("99")));
    QVERIFY(d.exceptionLegend.contains(QString::number(r.exceptions)));
}

void TestBacktestView::chartDataOfNoDays()
{
    const BacktestChartData d = buildBacktestChartData(BacktestResult{});
    QVERIFY(d.keys.isEmpty());
    QVERIFY(!d.note.isEmpty());
    QVERIFY(std::isfinite(d.yMin) && std::isfinite(d.yMax) && d.yMin < d.yMax);
    BacktestChart chart;
    chart.setData(d); // draws nothing, and does not fail
}

void TestBacktestView::requestUsesTheSettingsAndOneDay()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestSettings s;
    s.window = 321;
    const BacktestRequest q = backtestRequestFor(wb.contents(), s, RiskModel::Historical);
    QCOMPARE(q.assumptions.window, std::optional<int>(321));
    QCOMPARE(q.assumptions.model, RiskModel::Historical);
    QCOMPARE(q.assumptions.horizonDays, 1); // the workbook's horizon is 10: a backtest is of one-day VaR
    QCOMPARE(q.assumptions.confidence, wb.assumptions().confidence);
    QCOMPARE(q.holdings.size(), wb.holdings().size());
}

void TestBacktestView::viewShowsZoneAndVerdictForTheSample()
{
    auto loaded = loadWorkbook(samplePath());
    QVERIFY2(loaded.ok(), loaded.ok() ? "" : loaded.error().message.c_str());
    Workbook wb;
    wb.resetContents(loaded.value(), samplePath());
    BacktestView view(wb);
    wb.results().computeNow(Part::Backtest);
    QCOMPARE(wb.results().state(Part::Backtest), PartState::Ready);

    const BacktestSettings s = wb.backtestSettings();
    const BacktestResult r = coreBacktest(wb, s, s.models.front());
    const BacktestVerdict v = verdictAt(r, s.testSize);
    const QString zone = view.zoneText();
    const QString zoneWord = r.zone.zone == Zone::Green ? QStringLiteral("Green")
                             : r.zone.zone == Zone::Yellow ? QStringLiteral("Yellow") : QStringLiteral("Red");
    QVERIFY2(zone.contains(zoneWord + QStringLiteral(" zone")), qPrintable(zone));
    QVERIFY2(zone.contains(QStringLiteral("%1 exceptions in %2 days").arg(QLocale().toString(r.exceptions), QLocale().toString(r.observations))),
             qPrintable(zone));
    const QString verdict = view.verdictText();
    QVERIFY2(verdict.contains(v.passed ? QStringLiteral("<b>Passed</b>") : QStringLiteral("<b>Not passed</b>")), qPrintable(verdict));
    QVERIFY2(verdict.contains(QStringLiteral("5%")), qPrintable(verdict)); // the default test size
    QVERIFY(view.messageText().isEmpty());

    QCOMPARE(view.exceptionsTable()->rowCount(), r.exceptions);
    QCOMPARE(view.chart()->data().exceptionKeys.size(), qsizetype(r.exceptions));
    const std::vector<Date> dates = exceptionDates(r);
    const QString first = QLocale().toString(QDate(1970, 1, 1).addDays(dates.front().serial), QLocale::ShortFormat);
    QCOMPARE(view.exceptionsTable()->item(0, 0)->text(), first);
}

void TestBacktestView::comparisonRowsEqualCore()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestView view(wb);
    view.compareField()->setChecked(true); // an edit: all models from now on
    QCOMPARE(wb.backtestSettings().models.size(), backtestModels().size());
    wb.results().computeNow(Part::Backtest);
    QTableWidget *t = view.comparisonTable();
    QVERIFY(t->parentWidget()->isVisibleTo(&view));
    QCOMPARE(t->rowCount(), int(backtestModels().size()));
    const BacktestSettings s = wb.backtestSettings();
    for (int i = 0; i < t->rowCount(); ++i) {
        const RiskModel m = s.models[std::size_t(i)];
        const BacktestResult r = coreBacktest(wb, s, m);
        QCOMPARE(t->item(i, 0)->text(), BacktestView::modelTitle(m));
        QCOMPARE(t->item(i, 1)->text(), QLocale().toString(r.exceptions));
        QVERIFY2(!t->item(i, 5)->text().isEmpty(), "a zone for every model");
    }
    view.compareField()->setChecked(false);
    wb.results().computeNow(Part::Backtest);
    QVERIFY(!t->parentWidget()->isVisibleTo(&view));
}

void TestBacktestView::testSizeChangesTheVerdictWithoutRerunning()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestView view(wb);
    wb.results().computeNow(Part::Backtest);
    const quint64 generation = wb.results().backtest().generation;
    view.testSizeField()->setValue(10.0);
    QCOMPARE(wb.backtestSettings().testSize, 0.10);
    QCOMPARE(wb.results().backtest().generation, generation); // the same results, read at 10 %
    QCOMPARE(wb.results().state(Part::Backtest), PartState::Ready);
    QVERIFY2(view.verdictText().contains(QStringLiteral("10%")), qPrintable(view.verdictText()));
}

void TestBacktestView::changingTheWindowRerunsAndDropsTheStaleResult()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestView view(wb);
    wb.results().setDelay(Part::Backtest, 0);
    wb.results().computeNow(Part::Backtest);
    QCOMPARE(wb.results().backtest().models.front().result->value().window, 250);

    // Every result the view is told about from here on.
    QList<int> windowsSeen;
    // (figures are shown as current only while the part runs or is ready; when it goes out of
    // date it keeps the last complete run, marked so, which the view does not show)
    connect(&wb.results(), &ResultsStore::backtestChanged, this, [&] {
        const PartState state = wb.results().state(Part::Backtest);
        if (state != PartState::Running && state != PartState::Ready)
            return;
        for (const auto &m : wb.results().backtest().models)
            if (m.result && m.result->ok())
                windowsSeen << m.result->value().window;
    });
    // A background job for W = 260, then at once (before its result can be delivered) W = 300:
    // whatever the first job posts arrives after the change and must be dropped.
    wb.results().setWatched(Part::Backtest, true); // as when its tab is in view
    view.windowField()->setValue(260);
    QTRY_COMPARE_WITH_TIMEOUT(wb.results().state(Part::Backtest), PartState::Running, 5000);
    view.windowField()->setValue(300);
    QCOMPARE(wb.backtestSettings().window, 300);
    QVERIFY(wb.results().state(Part::Backtest) != PartState::Ready);
    QTRY_COMPARE_WITH_TIMEOUT(wb.results().state(Part::Backtest), PartState::Ready, 30000);
    QVERIFY(!windowsSeen.isEmpty());
    for (int w : windowsSeen)
        QCOMPARE(w, 300);
    const BacktestResult shown = wb.results().backtest().models.front().result->value();
    const BacktestResult want = coreBacktest(wb, wb.backtestSettings(), RiskModel::Normal);
    QCOMPARE(shown.observations, want.observations);
    QCOMPARE(shown.exceptions, want.exceptions);
    QCOMPARE(view.exceptionsTable()->rowCount(), want.exceptions);

    // An input change (a holding) reruns too.
    Holding h = wb.holdings().front();
    h.quantity *= 2.0;
    edit::setHolding(wb, 0, h, QStringLiteral("Double"));
    QCOMPARE(wb.results().state(Part::Backtest), PartState::OutOfDate);
    QVERIFY(!view.messageText().isEmpty()); // the old figures are no longer shown as current
    QTRY_COMPARE_WITH_TIMEOUT(wb.results().state(Part::Backtest), PartState::Ready, 30000);
}

void TestBacktestView::cancelShowsNothingAndRunAgainWorks()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestView view(wb);
    wb.results().setDelay(Part::Backtest, 0);
    view.compareField()->setChecked(true);
    wb.results().request(Part::Backtest);
    QCOMPARE(wb.results().state(Part::Backtest), PartState::Running);
    view.stopButton()->click();
    QCOMPARE(wb.results().state(Part::Backtest), PartState::OutOfDate);
    QTest::qWait(300); // anything the stopped job still posts is dropped
    QCOMPARE(wb.results().state(Part::Backtest), PartState::OutOfDate);
    for (const auto &m : wb.results().backtest().models)
        QVERIFY(!m.result); // no complete run before this one: nothing, never a part of the stopped one
    QVERIFY2(view.messageText().contains(QStringLiteral("stopped")), qPrintable(view.messageText()));
    wb.results().request(Part::Backtest); // "Run again"
    QTRY_COMPARE_WITH_TIMEOUT(wb.results().state(Part::Backtest), PartState::Ready, 30000);
    QVERIFY(view.messageText().isEmpty());
}

void TestBacktestView::tooLongWindowSaysSo()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestView view(wb);
    view.windowField()->setValue(5000); // the sample has 779 returns
    wb.results().computeNow(Part::Backtest);
    QVERIFY2(view.messageText().contains(QStringLiteral("could not run")), qPrintable(view.messageText()));
    QVERIFY2(view.messageText().contains(QStringLiteral("window")), qPrintable(view.messageText()));
}

void TestBacktestView::workbookRoundTripsTheBacktestSettings()
{
    WorkbookContents c = sampleContents();
    QVERIFY(!c.backtest);
    {
        auto json = workbookJson(c);
        QVERIFY(json.ok());
        QVERIFY(!QJsonDocument::fromJson(json.value()).object().contains(QStringLiteral("backtest")));
        auto back = parseWorkbookJson(json.value(), QStringLiteral("t.tailwise"));
        QVERIFY(back.ok());
        QVERIFY(!back.value().backtest); // absent stays absent
    }
    c.backtest = BacktestSettings{321, 0.1 + 0.2 - 0.29, {RiskModel::Historical, RiskModel::Normal, RiskModel::StudentT}};
    auto json = workbookJson(c);
    QVERIFY2(json.ok(), json.ok() ? "" : json.error().message.c_str());
    const QJsonObject o = QJsonDocument::fromJson(json.value()).object();
    QCOMPARE(o.value(QStringLiteral("format")).toInt(), 1);
    auto back = parseWorkbookJson(json.value(), QStringLiteral("t.tailwise"));
    QVERIFY2(back.ok(), back.ok() ? "" : back.error().message.c_str());
    QVERIFY(back.value().backtest);
    QCOMPARE(back.value().backtest->window, 321);
    QCOMPARE(back.value().backtest->testSize, c.backtest->testSize); // exact: shortest round-trip text
    QVERIFY(back.value().backtest->models == c.backtest->models);
}

void TestBacktestView::workbookRefusesBadBacktestSettings()
{
    WorkbookContents c = sampleContents();
    c.backtest = BacktestSettings{};
    const QByteArray good = workbookJson(c).value();
    struct Case {
        const char *key;
        QJsonValue value;
        const char *says;
    };
    const QList<Case> cases = {
        {"window", 1, "t.tailwise: backtest.window: expected a window of at least 2 returns, found 1"},
        {"window", QStringLiteral("all"), "t.tailwise: backtest.window: expected a whole number"},
        {"test-size", 0.0, "t.tailwise: backtest.test-size: expected a test size between 0 and 1"},
        {"test-size", 1.5, "t.tailwise: backtest.test-size: expected a test size between 0 and 1"},
        {"models", QJsonArray{}, "t.tailwise: backtest.models: expected at least one model"},
        {"models", QJsonArray{QStringLiteral("normal"), QStringLiteral("monte-carlo")},
         "t.tailwise: backtest.models[1]: expected a model the backtest runs"},
        {"models", QJsonArray{QStringLiteral("normal"), QStringLiteral("normal")},
         "t.tailwise: backtest.models[1]: the model \"normal\" appears twice"},
    };
    for (const Case &k : cases) {
        QJsonObject root = QJsonDocument::fromJson(good).object();
        QJsonObject b = root.value(QStringLiteral("backtest")).toObject();
        b[QLatin1String(k.key)] = k.value;
        root[QStringLiteral("backtest")] = b;
        const auto r = parseWorkbookJson(QJsonDocument(root).toJson(), QStringLiteral("t.tailwise"));
        QVERIFY2(!r.ok(), k.says);
        QVERIFY2(QString::fromStdString(r.error().message).startsWith(QLatin1String(k.says)), r.error().message.c_str());
    }
    QJsonObject root = QJsonDocument::fromJson(good).object();
    root[QStringLiteral("backtest")] = 3;
    const auto r = parseWorkbookJson(QJsonDocument(root).toJson(), QStringLiteral("t.tailwise"));
    QVERIFY(!r.ok());
    QVERIFY2(r.error().message.find("backtest: expected an object") != std::string::npos, r.error().message.c_str());
}

void TestBacktestView::sampleWorkbookHasBacktestSettings()
{
    const auto wb = loadWorkbook(samplePath());
    QVERIFY2(wb.ok(), wb.ok() ? "" : wb.error().message.c_str());
    if (!wb.value().backtest)
        QFAIL("samples/larchmere.tailwise has no backtest settings (see samples/README.md)");
    QCOMPARE(wb.value().backtest->window, 250);
    QCOMPARE(wb.value().backtest->testSize, 0.05);
    QVERIFY(wb.value().backtest->models == backtestModels()); // the four compared, normal drawn
}

void TestBacktestView::settingsEditIsOneUndoStep()
{
    Workbook wb;
    wb.resetContents(sampleContents(), {});
    BacktestView view(wb);
    view.windowField()->setValue(260);
    view.windowField()->setValue(270);
    view.windowField()->setValue(280); // spin-box steps merge
    QCOMPARE(wb.undoStack()->count(), 1);
    QCOMPARE(wb.backtestSettings().window, 280);
    QVERIFY(wb.isModified());
    wb.undoStack()->undo();
    QVERIFY(!wb.contents().backtest); // back to none stored
    QCOMPARE(view.windowField()->value(), 250);
    view.modelField()->setCurrentIndex(view.modelField()->findText(QStringLiteral("Historical")));
    QCOMPARE(wb.backtestSettings().models, std::vector<RiskModel>{RiskModel::Historical});
    QCOMPARE(wb.undoStack()->count(), 1);
}

void TestBacktestView::picture()
{
    // A look at the view on the sample; TAILWISE_BACKTEST_PICTURE names a PNG to write.
    auto loaded = loadWorkbook(samplePath());
    QVERIFY(loaded.ok());
    Workbook wb;
    wb.resetContents(loaded.value(), samplePath());
    BacktestView view(wb);
    view.resize(1240, 640);
    wb.results().computeNow(Part::Backtest);
    view.show();
    QVERIFY(QTest::qWaitForWindowExposed(&view));
    QTest::qWait(50);
    const QPixmap pixmap = view.grab();
    QVERIFY(!pixmap.isNull());
    if (const QByteArray path = qgetenv("TAILWISE_BACKTEST_PICTURE"); !path.isEmpty())
        QVERIFY(pixmap.save(QString::fromLocal8Bit(path), "PNG"));
}

void TestBacktestView::windowHasTheBacktestTab()
{
    // The window's chart tabs hold the view; TAILWISE_BACKTEST_WINDOW_PICTURE names a PNG of the
    // whole window with the Backtest tab open.
    MainWindow window;
    QVERIFY(window.openWorkbookFile(samplePath()).isEmpty());
    window.resize(1280, 900);
    window.show();
    QVERIFY(QTest::qWaitForWindowExposed(&window));
    window.results().computeNow(Part::Headline);
    QTabWidget *tabs = window.chartTabs()->tabs();
    BacktestView *view = window.chartTabs()->backtestView();
    QVERIFY(view);
    const int index = tabs->indexOf(view);
    QVERIFY(index >= 0);
    QCOMPARE(tabs->tabText(index), QStringLiteral("Backtest"));
    tabs->setCurrentIndex(index);
    window.workbook().results().computeNow(Part::Backtest);
    QVERIFY2(view->zoneText().contains(QStringLiteral(" zone")), qPrintable(view->messageText()));
    QTest::qWait(50);
    if (const QByteArray path = qgetenv("TAILWISE_BACKTEST_WINDOW_PICTURE"); !path.isEmpty())
        QVERIFY(window.grab().save(QString::fromLocal8Bit(path), "PNG"));
}

QTEST_MAIN(TestBacktestView)
#include "test_backtestview.moc"

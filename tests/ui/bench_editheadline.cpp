// Benchmark: one holdings edit → new headline, for 500 and 1,000 holdings (normal model, 500-day
// window), and what an edit costs the whole process (every thread) with the backtest tab in view
// and hidden, on the sample workbook. Prints figures; it never fails on timing. The figure to aim
// at is one frame (16 ms). The large books are invented here (seeded geometric random walks).
#include "document/commands.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "mainwindow.h"
#include "models/holdingsmodel.h"
#include "panels/backtestview.h"
#include "panels/charttabs.h"
#include "panels/holdingseditor.h"

#include "tailwise/date.h"
#include "tailwise/risk.h"

#include <QLabel>
#include <QTest>

#include <QTabWidget>

#include <cmath>
#include <cstdio>
#include <ctime>
#include <random>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

WorkbookContents inventedBook(int assets, int days)
{
    WorkbookContents c;
    c.title = QStringLiteral("Benchmark book");
    std::mt19937_64 rng(500);
    std::normal_distribution<double> step(0.0, 0.012);
    c.prices.prices.resize(days, assets);
    for (int a = 0; a < assets; ++a) {
        c.prices.assets.push_back("ASSET_" + std::to_string(a));
        double p = 50.0 + a % 50;
        for (int d = 0; d < days; ++d) {
            p *= std::exp(step(rng));
            c.prices.prices(d, a) = p;
        }
    }
    for (int d = 0; d < days; ++d)
        c.prices.dates.push_back(Date{dateFromCivil(2023, 1, 2).serial + d});
    for (int a = 0; a < assets; ++a)
        c.holdings.push_back(Holding{c.prices.assets[static_cast<std::size_t>(a)], 100.0 + a, std::nullopt, std::nullopt});
    c.assumptions.window = days - 1;
    return c;
}

} // namespace

class BenchEditHeadline : public QObject {
    Q_OBJECT
private slots:
    void editToHeadline_data()
    {
        QTest::addColumn<int>("holdings");
        QTest::newRow("500 holdings") << 500;
        QTest::newRow("1,000 holdings") << 1000;
    }
    void editToHeadline()
    {
        QFETCH(int, holdings);
        QCoreApplication::setOrganizationName(QStringLiteral("TailwiseTests"));
        MainWindow window;
        window.workbook().resetContents(inventedBook(holdings, 501), QString());
        window.results().computeNow(Part::Headline);
        QVERIFY(window.workbook().results().report());
        HoldingsModel *model = window.holdingsEditor()->model();
        auto *headline = window.findChild<QLabel *>(QStringLiteral("varMoney"));
        double quantity = 1000.0;
        QString shown;
        const int row = holdings / 2;
        QBENCHMARK {
            quantity += 1.0;
            model->setData(model->index(row, HoldingsModel::QuantityColumn), quantity);
            window.results().computeNow(Part::Headline); // what the zero-delay timer runs on the next turn
            shown = headline->text();
        }
        QVERIFY(!shown.isEmpty());
        QCOMPARE(window.workbook().holdings()[static_cast<std::size_t>(row)].quantity, quantity);
    }

    // Process CPU time (all threads) per edit on the sample workbook, the window shown, once with
    // the backtest tab in view (its part recomputes after every edit, as it did before whatever
    // the tab) and once with the loss tail in view (the hidden backtest waits for its first need).
    void cpuPerEditBacktestShownAndHidden()
    {
        QCoreApplication::setOrganizationName(QStringLiteral("TailwiseTests"));
        auto loaded = loadWorkbook(QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise"));
        QVERIFY(loaded.ok());
        for (const bool shown : {true, false}) {
            MainWindow window;
            window.workbook().resetContents(loaded.value(), QString());
            window.resize(1400, 900);
            window.show();
            QTabWidget *tabs = window.chartTabs()->tabs();
            tabs->setCurrentWidget(shown ? static_cast<QWidget *>(window.chartTabs()->backtestView()) : tabs->widget(0));
            ResultsStore &store = window.results();
            QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Headline), 30000);
            if (shown)
                QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Backtest), 60000);
            constexpr int edits = 10;
            int backtestRuns = 0;
            connect(&store, &ResultsStore::statusChanged, this, [&](Part part) {
                if (part == Part::Backtest && store.isRunning(Part::Backtest))
                    ++backtestRuns;
            });
            const std::clock_t start = std::clock();
            for (int i = 0; i < edits; ++i) {
                Holding h = window.workbook().holdings().front();
                h.quantity += 1.0;
                edit::setHolding(window.workbook(), 0, h, QStringLiteral("+1"));
                QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Headline), 30000);
                if (shown)
                    QTRY_VERIFY_WITH_TIMEOUT(store.isReady(Part::Backtest), 60000);
                else
                    QTest::qWait(300); // past the backtest's coalescing delay
            }
            const double cpuMs = 1000.0 * double(std::clock() - start) / CLOCKS_PER_SEC;
            std::printf("backtest tab %s: %.1f ms CPU per edit (all threads), %d backtest runs in %d edits\n",
                        shown ? "in view" : "hidden ", cpuMs / edits, backtestRuns, edits);
            if (!shown)
                QCOMPARE(backtestRuns, 0);
        }
    }

    // The same inputs through core alone: the share of the figure above that is the computation.
    void coreComputeRisk500Holdings()
    {
        const WorkbookContents c = inventedBook(500, 501);
        double var = 0.0;
        QBENCHMARK {
            auto r = computeRisk(c.prices, c.holdings, c.assumptions);
            QVERIFY(r.ok());
            var = r.value().figures.var;
        }
        QVERIFY(var > 0.0);
    }

    // The window's part without core: results arrive, the headline, table and charts redraw.
    void resultsToScreen500Holdings()
    {
        MainWindow window;
        window.workbook().resetContents(inventedBook(500, 501), QString());
        window.results().computeNow(Part::Headline);
        QVERIFY(window.results().report());
        QBENCHMARK {
            emit window.results().headlineChanged(); // what a new headline result makes every view do
        }
    }
};

QTEST_MAIN(BenchEditHeadline)
#include "bench_editheadline.moc"

// Benchmark: one holdings edit → new headline, for 500 holdings (normal model, 500-day window).
// Prints the time per edit; it never fails on timing. The figure to aim at is one frame (16 ms).
// The price history is invented here (seeded geometric random walks), not real data.
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "mainwindow.h"
#include "models/holdingsmodel.h"
#include "panels/holdingseditor.h"

#include "tailwise/date.h"
#include "tailwise/risk.h"

#include <QLabel>
#include <QTest>

#include <cmath>
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
    void editToHeadline500Holdings()
    {
        QCoreApplication::setOrganizationName(QStringLiteral("TailwiseTests"));
        MainWindow window;
        window.workbook().resetContents(inventedBook(500, 501), QString());
        window.results().computeNow(Part::Headline);
        QVERIFY(window.workbook().results().report());
        HoldingsModel *model = window.holdingsEditor()->model();
        auto *headline = window.findChild<QLabel *>(QStringLiteral("varMoney"));
        double quantity = 1000.0;
        QString shown;
        QBENCHMARK {
            quantity += 1.0;
            model->setData(model->index(250, HoldingsModel::QuantityColumn), quantity);
            window.results().computeNow(Part::Headline); // what the zero-delay timer runs on the next turn
            shown = headline->text();
        }
        QVERIFY(!shown.isEmpty());
        QCOMPARE(window.workbook().holdings()[250].quantity, quantity);
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

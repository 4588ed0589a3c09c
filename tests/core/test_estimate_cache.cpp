// The estimate cache must be invisible in the figures: a cached computation gives exactly what a
// fresh one gives, for edits that keep the estimate (quantities, confidence, horizon) and for
// edits that change it (window, estimator, assets, a new price-history revision). Checked on the
// real data set tests/data/eu-stock-indices-1991-1998.csv (provenance in tests/data/README.md).
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"

#include <QTest>

using namespace tailwise;

namespace {

const std::string dataDir = TAILWISE_TEST_DATA_DIR;

// Exact equality: the cache must not change a single bit of any figure.
void requireSameFigures(const RiskReport &cached, const RiskReport &fresh)
{
    QCOMPARE(cached.figures.var, fresh.figures.var);
    QCOMPARE(cached.figures.es, fresh.figures.es);
    QCOMPARE(cached.horizon.sd, fresh.horizon.sd);
    QCOMPARE(cached.horizon.mean, fresh.horizon.mean);
    QCOMPARE(cached.undiversifiedVar, fresh.undiversifiedVar);
    QCOMPARE(cached.windowReturns, fresh.windowReturns);
    QCOMPARE(cached.holdings.size(), fresh.holdings.size());
    for (std::size_t i = 0; i < fresh.holdings.size(); ++i)
        QCOMPARE(cached.holdings[i].componentVar, fresh.holdings[i].componentVar);
    QCOMPARE(cached.warnings, fresh.warnings);
}

} // namespace

class TestEstimateCache : public QObject {
    Q_OBJECT
private slots:
    void editsGiveTheFreshFigures()
    {
        auto prices = readPriceCsv(dataDir + "/eu-stock-indices-1991-1998.csv");
        QVERIFY(prices.ok());
        Holdings holdings{{"DAX", 100, {}, {}}, {"SMI", -50, {}, {}}, {"CAC", 80, {}, {}}};
        Assumptions a;
        a.window = 250;
        EstimateCache cache;

        auto check = [&](std::uint64_t revision) {
            auto cached = computeRisk(prices.value(), holdings, a, RunControl{}, cache, revision);
            auto fresh = computeRisk(prices.value(), holdings, a);
            QVERIFY2(cached.ok() && fresh.ok(), "both computations succeed");
            requireSameFigures(cached.value(), fresh.value());
        };
        check(1);
        holdings[1].quantity = -80; // same assets: the estimate is reused
        check(1);
        a.confidence = 0.975;
        a.horizonDays = 10;
        check(1);
        a.window = 500; // a new estimate
        check(1);
        a.estimator = CovarianceEstimator::Ewma;
        check(1);
        a.mean = MeanModel::Sample;
        check(1);
        holdings.push_back({"FTSE", 40, {}, {}}); // a new asset set
        check(1);
        std::swap(holdings[0], holdings[3]); // the same assets in another order
        check(1);
    }

    void aNewRevisionIsNeverServedFromTheCache()
    {
        auto prices = readPriceCsv(dataDir + "/eu-stock-indices-1991-1998.csv");
        QVERIFY(prices.ok());
        const Holdings holdings{{"DAX", 100, {}, {}}, {"FTSE", 40, {}, {}}};
        Assumptions a;
        a.window = 250;
        EstimateCache cache;
        auto before = computeRisk(prices.value(), holdings, a, RunControl{}, cache, 7);
        QVERIFY(before.ok());
        // Same shape, different prices: only the revision tells the cache.
        PriceHistory changed = prices.value();
        changed.prices.col(0) *= 1.0 + 1e-3 * 0.5;
        changed.prices(changed.prices.rows() - 2, 0) *= 1.05;
        auto after = computeRisk(changed, holdings, a, RunControl{}, cache, 8);
        auto fresh = computeRisk(changed, holdings, a);
        QVERIFY(after.ok() && fresh.ok());
        requireSameFigures(after.value(), fresh.value());
        QVERIFY2(after.value().horizon.sd != before.value().horizon.sd, "the changed history changes the figure");
    }
};

QTEST_GUILESS_MAIN(TestEstimateCache)
#include "test_estimate_cache.moc"

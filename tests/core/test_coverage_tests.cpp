// Coverage tests of VaR exceptions (coveragetests.h) against published values.
// Sources: ../shared/REFERENCE-VALUES.md §6 (Kupiec 1995), §7 (Christoffersen 1998, invented
// sequences A and B with SciPy 1.10 results), §8 (Basel Committee 1996, Table 2).
#include "closeness.h"

#include "tailwise/coveragetests.h"

#include <QtTest>

#include <algorithm>
#include <cmath>
#include <memory>
#include <string>
#include <vector>

using namespace tailwise;

namespace {

std::vector<bool> hitsFrom(const char *text)
{
    std::vector<bool> hits;
    for (const char *c = text; *c; ++c)
        hits.push_back(*c == '1');
    return hits;
}

// The LR rule of REFERENCE-VALUES.md §6: {x : LR_pof(x) < 3.841459} at 5% test size.
std::pair<int, int> nonRejectionRegion(int observations, double p)
{
    int low = -1, high = -1;
    for (int x = 0; x <= observations; ++x) {
        if (kupiecPof(x, observations, p).lr < 3.841459) {
            if (low < 0)
                low = x;
            high = x;
        }
    }
    return {low, high};
}

} // namespace

class TestCoverageTests : public QObject {
    Q_OBJECT
private slots:
    void kupiecRegions_data();
    void kupiecRegions();
    void kupiecRegionPublishedCellDiffers();
    void kupiecWorkedValues_data();
    void kupiecWorkedValues();
    void kupiecLimits();
    void christoffersenSequenceA();
    void christoffersenSequenceB();
    void christoffersenDegenerate();
    void baselTable_data();
    void baselTable();
    void zoneOnFewDays();
};

void TestCoverageTests::kupiecRegions_data()
{
    QTest::addColumn<int>("observations");
    QTest::addColumn<double>("p");
    QTest::addColumn<int>("low");
    QTest::addColumn<int>("high");
    // Kupiec (1995) non-rejection regions, reproduced in Jorion (mem), as recomputed by the LR rule
    // with SciPy in REFERENCE-VALUES.md §6 (the p=0.01, T=255 cell is tested separately below).
    QTest::newRow("Kupiec 1995 p=0.01 T=510") << 510 << 0.01 << 2 << 10;
    QTest::newRow("Kupiec 1995 p=0.01 T=1000") << 1000 << 0.01 << 5 << 16;
    QTest::newRow("Kupiec 1995 p=0.025 T=255") << 255 << 0.025 << 3 << 11;
    QTest::newRow("Kupiec 1995 p=0.025 T=510") << 510 << 0.025 << 7 << 20;
    QTest::newRow("Kupiec 1995 p=0.025 T=1000") << 1000 << 0.025 << 16 << 35;
    QTest::newRow("Kupiec 1995 p=0.05 T=255") << 255 << 0.05 << 7 << 20;
    QTest::newRow("Kupiec 1995 p=0.05 T=510") << 510 << 0.05 << 17 << 35;
    QTest::newRow("Kupiec 1995 p=0.05 T=1000") << 1000 << 0.05 << 38 << 64;
    QTest::newRow("Kupiec 1995 p=0.075 T=255") << 255 << 0.075 << 12 << 27;
    QTest::newRow("Kupiec 1995 p=0.075 T=510") << 510 << 0.075 << 28 << 50;
    QTest::newRow("Kupiec 1995 p=0.075 T=1000") << 1000 << 0.075 << 60 << 91;
    QTest::newRow("Kupiec 1995 p=0.1 T=255") << 255 << 0.1 << 17 << 35;
    QTest::newRow("Kupiec 1995 p=0.1 T=510") << 510 << 0.1 << 39 << 64;
    QTest::newRow("Kupiec 1995 p=0.1 T=1000") << 1000 << 0.1 << 82 << 119;
    // T = 250: computed only (REFERENCE-VALUES.md §6, SciPy column in brackets).
    QTest::newRow("SciPy LR rule p=0.01 T=250") << 250 << 0.01 << 1 << 6;
    QTest::newRow("SciPy LR rule p=0.025 T=250") << 250 << 0.025 << 3 << 11;
    QTest::newRow("SciPy LR rule p=0.05 T=250") << 250 << 0.05 << 7 << 19;
    QTest::newRow("SciPy LR rule p=0.075 T=250") << 250 << 0.075 << 12 << 27;
    QTest::newRow("SciPy LR rule p=0.1 T=250") << 250 << 0.1 << 17 << 34;
}

void TestCoverageTests::kupiecRegions()
{
    QFETCH(int, observations);
    QFETCH(double, p);
    QFETCH(int, low);
    QFETCH(int, high);
    const auto [l, h] = nonRejectionRegion(observations, p);
    QCOMPARE(l, low);
    QCOMPARE(h, high);
}

void TestCoverageTests::kupiecRegionPublishedCellDiffers()
{
    // REFERENCE-VALUES.md §6, Discrepancies: the remembered published cell for p=0.01, T=255 is
    // "N < 7" (0..6), but the LR rule rejects x = 0 (LR = 5.12567 > 3.841, SciPy). The tool follows
    // the LR rule, i.e. the region is 1..6; the published upper end agrees.
    const auto [l, h] = nonRejectionRegion(255, 0.01);
    QCOMPARE(l, 1);
    QCOMPARE(h, 6);
    TW_CLOSE_REL(kupiecPof(0, 255, 0.01).lr, 5.12567, 1e-5); // SciPy, REFERENCE-VALUES.md §6
    QVERIFY(kupiecPof(0, 255, 0.01).lr > 3.841459);
}

void TestCoverageTests::kupiecWorkedValues_data()
{
    QTest::addColumn<int>("x");
    QTest::addColumn<double>("lr");
    QTest::addColumn<double>("pValue");
    // Kupiec (1995) worked LR values, T = 250, p = 0.01; SciPy 1.10 check values from
    // REFERENCE-VALUES.md §6 (LR and chi2.sf(LR, 1)).
    QTest::newRow("Kupiec 1995 x=0") << 0 << 5.025167927 << 0.02498150305;
    QTest::newRow("Kupiec 1995 x=2") << 2 << 0.1084352162 << 0.741932701;
    QTest::newRow("Kupiec 1995 x=5") << 5 << 1.956809788 << 0.1618549172;
    QTest::newRow("Kupiec 1995 x=8") << 8 << 7.733550724 << 0.005420405194;
    QTest::newRow("Kupiec 1995 x=12") << 12 << 19.01618566 << 1.296143302e-05;
}

void TestCoverageTests::kupiecWorkedValues()
{
    QFETCH(int, x);
    QFETCH(double, lr);
    QFETCH(double, pValue);
    const LikelihoodRatio r = kupiecPof(x, 250, 0.01);
    TW_CLOSE_REL(r.lr, lr, 1e-8);
    TW_CLOSE_REL(r.pValue, pValue, 1e-8);
}

void TestCoverageTests::kupiecLimits()
{
    // x = 0 gives LR = −2T ln(1−p) (REFERENCE-VALUES.md §6, the 0·ln 0 = 0 convention).
    TW_CLOSE_REL(kupiecPof(0, 250, 0.01).lr, -2.0 * 250.0 * std::log(0.99), 1e-12);
    // x = T: LR = −2T ln p (same convention, the (1−p̂) term vanishes) — algebra of the definition.
    TW_CLOSE_REL(kupiecPof(10, 10, 0.01).lr, -2.0 * 10.0 * std::log(0.01), 1e-12);
    // x = pT exactly: the fitted and null likelihoods coincide, LR = 0 and p-value 1.
    const LikelihoodRatio exact = kupiecPof(5, 500, 0.01);
    QVERIFY2(exact.lr >= 0.0 && exact.lr < 1e-12, QByteArray::number(exact.lr).constData());
    TW_CLOSE_REL(exact.pValue, 1.0, 1e-6);
    // A tiny p-value stays accurate through the complement form: chi2.sf(LR, 1) of x = 60 in 250
    // at p = 0.01 must be positive and far below 1e-20 (common practice: no 1 − cdf cancellation).
    const LikelihoodRatio extreme = kupiecPof(60, 250, 0.01);
    QVERIFY(extreme.pValue > 0.0 && extreme.pValue < 1e-20);
}

void TestCoverageTests::christoffersenSequenceA()
{
    // Christoffersen (1998); invented sequence A of REFERENCE-VALUES.md §7, p = 0.05, SciPy 1.10.
    const std::vector<bool> seq = hitsFrom("0000000100000000011000000000001000000100");
    QCOMPARE(static_cast<int>(seq.size()), 40);
    std::unique_ptr<bool[]> hits(new bool[seq.size()]);
    std::copy(seq.begin(), seq.end(), hits.get());
    const ChristoffersenResult r = christoffersen({hits.get(), seq.size()}, 0.05);
    QCOMPARE(r.transitions.n00, 30);
    QCOMPARE(r.transitions.n01, 4);
    QCOMPARE(r.transitions.n10, 4);
    QCOMPARE(r.transitions.n11, 1);
    TW_CLOSE_REL(r.pi0, 0.117647, 1e-5);
    TW_CLOSE_REL(r.pi1, 0.2, 1e-12);
    TW_CLOSE_REL(r.pi, 0.128205, 1e-5);
    TW_CLOSE_REL(r.pof.lr, 3.406240442, 1e-8);             // Kupiec 1995, all T days
    TW_CLOSE_REL(r.pof.pValue, 0.0649503, 1e-5);
    TW_CLOSE_REL(r.independence.lr, 0.2365714793, 1e-8);   // Christoffersen 1998
    TW_CLOSE_REL(r.independence.pValue, 0.626693, 1e-5);
    TW_CLOSE_REL(r.conditionalCoverage.lr, 3.642811921, 1e-8); // common practice LR_pof + LR_ind
    TW_CLOSE_REL(r.conditionalCoverage.pValue, 0.161798, 1e-5);
    TW_CLOSE_REL(r.pofConditioned.lr, 3.57435, 1e-5);      // Christoffersen 1998, conditioned on day 1
    TW_CLOSE_REL(r.conditionalCoverageConditioned.lr, 3.810924633, 1e-8);
    TW_CLOSE_REL(r.conditionalCoverageConditioned.pValue, 0.148754, 1e-5);
}

void TestCoverageTests::christoffersenSequenceB()
{
    // Christoffersen (1998); invented sequence B of REFERENCE-VALUES.md §7 (n11 = 0 exercises
    // 0·ln 0 = 0), p = 0.05, SciPy 1.10.
    const std::vector<bool> seq = hitsFrom("00001000000000100000");
    std::unique_ptr<bool[]> hits(new bool[seq.size()]);
    std::copy(seq.begin(), seq.end(), hits.get());
    const ChristoffersenResult r = christoffersen({hits.get(), seq.size()}, 0.05);
    QCOMPARE(r.transitions.n00, 15);
    QCOMPARE(r.transitions.n01, 2);
    QCOMPARE(r.transitions.n10, 2);
    QCOMPARE(r.transitions.n11, 0);
    TW_CLOSE_REL(r.pi0, 0.117647, 1e-5);
    QCOMPARE(r.pi1, 0.0);
    TW_CLOSE_REL(r.pi, 0.105263, 1e-5);
    TW_CLOSE_REL(r.pof.lr, 0.8261687565, 1e-8);
    TW_CLOSE_REL(r.pof.pValue, 0.363383, 1e-5);
    TW_CLOSE_REL(r.independence.lr, 0.4716798456, 1e-8);
    TW_CLOSE_REL(r.independence.pValue, 0.492215, 1e-5);
    TW_CLOSE_REL(r.conditionalCoverage.lr, 1.297848602, 1e-8);
    TW_CLOSE_REL(r.conditionalCoverage.pValue, 0.522608, 1e-5);
    TW_CLOSE_REL(r.pofConditioned.lr, 0.940062, 1e-5);
    TW_CLOSE_REL(r.conditionalCoverageConditioned.lr, 1.411742161, 1e-8);
    TW_CLOSE_REL(r.conditionalCoverageConditioned.pValue, 0.493678, 1e-5);
}

void TestCoverageTests::christoffersenDegenerate()
{
    // No exception at all: π = π0 = 0 and the independence statistic is zero (0·ln 0 = 0).
    bool none[30] = {};
    const ChristoffersenResult r = christoffersen({none, 30}, 0.01);
    QCOMPARE(r.transitions.n00, 29);
    QCOMPARE(r.independence.lr, 0.0);
    QCOMPARE(r.independence.pValue, 1.0);
    QVERIFY(std::isfinite(r.conditionalCoverage.lr) && std::isfinite(r.conditionalCoverage.pValue));
    // Every day an exception: only n11; still finite, LR_ind = 0.
    bool all[12];
    std::fill(std::begin(all), std::end(all), true);
    const ChristoffersenResult s = christoffersen({all, 12}, 0.01);
    QCOMPARE(s.transitions.n11, 11);
    QCOMPARE(s.independence.lr, 0.0);
    QVERIFY(std::isfinite(s.conditionalCoverage.lr) && std::isfinite(s.conditionalCoverage.pValue));
    // One day: no transitions.
    bool one[1] = {true};
    const ChristoffersenResult t = christoffersen({one, 1}, 0.01);
    QCOMPARE(t.transitions.total(), 0);
    QCOMPARE(t.independence.lr, 0.0);
}

void TestCoverageTests::baselTable_data()
{
    QTest::addColumn<int>("k");
    QTest::addColumn<QString>("zone");
    QTest::addColumn<double>("cumulative");
    // Basel Committee (1996), Table 2, 250 observations at 99% (mem); cumulative probabilities
    // P(X ≤ k), X ~ Binomial(250, 0.01), from SciPy 1.10 binom.cdf (REFERENCE-VALUES.md §8).
    QTest::newRow("Basel 1996 k=0") << 0 << "green" << 0.08105851616;
    QTest::newRow("Basel 1996 k=1") << 1 << "green" << 0.2857517388;
    QTest::newRow("Basel 1996 k=2") << 2 << "green" << 0.5431689733;
    QTest::newRow("Basel 1996 k=3") << 3 << "green" << 0.7581166978;
    QTest::newRow("Basel 1996 k=4") << 4 << "green" << 0.8921876269;
    QTest::newRow("Basel 1996 k=5") << 5 << "yellow" << 0.9588168159;
    QTest::newRow("Basel 1996 k=6") << 6 << "yellow" << 0.9862985521;
    QTest::newRow("Basel 1996 k=7") << 7 << "yellow" << 0.9959746613;
    QTest::newRow("Basel 1996 k=8") << 8 << "yellow" << 0.9989434675;
    QTest::newRow("Basel 1996 k=9") << 9 << "yellow" << 0.9997498099;
    QTest::newRow("Basel 1996 k=10") << 10 << "red" << 0.9999461014;
    // "10 or more": further counts stay red (Basel Committee 1996, Table 2).
    QTest::newRow("Basel 1996 k=11") << 11 << "red" << -1.0;
    QTest::newRow("Basel 1996 k=25") << 25 << "red" << -1.0;
}

void TestCoverageTests::baselTable()
{
    QFETCH(int, k);
    QFETCH(QString, zone);
    QFETCH(double, cumulative);
    const ZoneResult z = trafficLightZone(k, 250, 0.01);
    QCOMPARE(QString::fromUtf8(toName(z.zone).data(), static_cast<qsizetype>(toName(z.zone).size())), zone);
    if (cumulative >= 0.0)
        TW_CLOSE_REL(z.cumulativeProbability, cumulative, 1e-9);
    if (k == 9) // P(X ≥ 10) = binom.sf(9, 250, 0.01) = 0.000250190 (REFERENCE-VALUES.md §8, SciPy)
        TW_CLOSE_REL(z.upperTail, 0.000250190, 1e-5);
}

void TestCoverageTests::zoneOnFewDays()
{
    // Convention of coveragetests.h: no exception is green even where (1−p)^T ≥ 95%
    // (T = 2, p = 0.01: (0.99)^2 = 0.9801 by the binomial definition of Basel Committee 1996).
    const ZoneResult none = trafficLightZone(0, 2, 0.01);
    TW_CLOSE_REL(none.cumulativeProbability, 0.9801, 1e-12);
    QCOMPARE(none.zone, Zone::Green);
    // One exception in 3 days at 1%: P(X > 1) = 3p²(1−p) + p³ = 0.000298 (binomial algebra),
    // between 0.0001 and 0.05, so yellow.
    const ZoneResult one = trafficLightZone(1, 3, 0.01);
    TW_CLOSE_REL(one.upperTail, 0.000298, 1e-9);
    QCOMPARE(one.zone, Zone::Yellow);
}

QTEST_APPLESS_MAIN(TestCoverageTests)
#include "test_coverage_tests.moc"

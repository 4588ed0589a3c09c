// The numbers behind the charts (ChartData), checked without drawing.
#include "chartfixture.h"

#include "charts/contours.h"
#include "charts/contributionschartdata.h"
#include "charts/losstailchartdata.h"
#include "charts/tradeoffchartdata.h"

#include "tailwise/modelgrid.h"
#include "tailwise/grid.h"

#include <QtTest>

#include <cmath>

using namespace tailwise;
using namespace tailwise::ui;
using chartfixture::positionReport;
using chartfixture::sampleReport;

namespace {

// Fails with the actual value, the expected value and the tolerance.
#define CHECK_CLOSE(actual, expected, tol)                                                                      \
    do {                                                                                                        \
        const double a_ = (actual), e_ = (expected), t_ = (tol);                                                \
        QVERIFY2(std::abs(a_ - e_) <= t_, qPrintable(QStringLiteral("%1 = %2, expected %3 ± %4")                \
                                                         .arg(QStringLiteral(#actual)).arg(a_, 0, 'g', 17)      \
                                                         .arg(e_, 0, 'g', 17).arg(t_, 0, 'g', 3)));             \
    } while (false)

double trapezoid(const QVector<double> &x, const QVector<double> &y)
{
    double s = 0.0;
    for (int i = 1; i < x.size(); ++i)
        s += 0.5 * (y[i] + y[i - 1]) * (x[i] - x[i - 1]);
    return s;
}

} // namespace

class TestChartData : public QObject {
    Q_OBJECT
private slots:
    // The texts checked below are written in US English number format.
    void initTestCase() { QLocale::setDefault(QLocale(QLocale::English, QLocale::UnitedStates)); }
    void lossTailBoundaryIsMinusVar_data();
    void lossTailBoundaryIsMinusVar();
    void lossTailBoundaryMovesWithConfidence();
    void lossTailPercentOfValue();
    void lossTailCurveAgainstScipy();
    void lossTailShadedMassIsTailProbability();
    void lossTailHistogramIsADensity();
    void lossTailHoverReadsModelCdf();
    void lossTailZeroSpreadHasNoCurveAndNoNaN();

    void contoursOfCircleLieOnLevelSet();
    void contoursThroughSaddlesAndGaps();

    void tradeoffEqualsNormalRiskGrid();
    void tradeoffFollowsTheChosenModel();
    void tradeoffContoursLieOnVarLevels();
    void turningHorizonFormula();
    void tradeoffRidgeWithExpectedGain();
    void tradeoffPickOnMap();
    void roundLevelsAreRound();

    void contributionsSortedAndHedgesFlagged();
    void contributionsPooledKeepTheSum();
};

void TestChartData::lossTailBoundaryIsMinusVar_data()
{
    QTest::addColumn<double>("confidence");
    QTest::addColumn<int>("horizon");
    QTest::newRow("95%, 1 day") << 0.95 << 1;
    QTest::newRow("99%, 10 days") << 0.99 << 10;
    QTest::newRow("99.9%, 63 days") << 0.999 << 63;
}

void TestChartData::lossTailBoundaryIsMinusVar()
{
    QFETCH(double, confidence);
    QFETCH(int, horizon);
    Assumptions a;
    a.confidence = confidence;
    a.horizonDays = horizon;
    const RiskReport r = sampleReport(a);
    const LossTailChartData d = buildLossTailChartData(r);
    QVERIFY(d.hasCurve);
    // Exactly −VaR: the boundary is the headline figure itself (issue 3).
    QVERIFY2(d.tailBoundary == -r.figures.var,
             qPrintable(QStringLiteral("boundary %1, −VaR %2").arg(d.tailBoundary, 0, 'g', 17).arg(-r.figures.var, 0, 'g', 17)));
    QVERIFY(!d.tailX.isEmpty());
    QVERIFY(d.tailX.last() == -r.figures.var);
    QVERIFY(std::all_of(d.tailX.cbegin(), d.tailX.cend(), [&](double x) { return x <= -r.figures.var; }));
    QVERIFY(d.esMarker == -r.figures.es);
    QVERIFY(d.esMarker < d.tailBoundary);
    QVERIFY(d.xMin < d.esMarker && d.tailBoundary < d.xMax);
}

void TestChartData::lossTailBoundaryMovesWithConfidence()
{
    Assumptions a;
    a.confidence = 0.95;
    const RiskReport r95 = sampleReport(a);
    a.confidence = 0.99;
    const RiskReport r99 = sampleReport(a);
    const double b95 = buildLossTailChartData(r95).tailBoundary;
    const double b99 = buildLossTailChartData(r99).tailBoundary;
    QVERIFY(b95 == -r95.figures.var);
    QVERIFY(b99 == -r99.figures.var);
    QVERIFY2(b99 < b95, qPrintable(QStringLiteral("99%: %1, 95%: %2").arg(b99).arg(b95)));
    // Zero mean: the boundary scales with z (A&S Table 26.5: 2.32635 / 1.64485).
    CHECK_CLOSE(b99 / b95, 2.326347874 / 1.644853627, 1e-8);
}

void TestChartData::lossTailPercentOfValue()
{
    const RiskReport r = sampleReport();
    LossTailOptions o;
    o.unit = LossTailUnit::PercentOfValue;
    const LossTailChartData d = buildLossTailChartData(r, o);
    QVERIFY(d.unit == LossTailUnit::PercentOfValue);
    QVERIFY(r.varFraction.has_value());
    CHECK_CLOSE(d.tailBoundary, -*r.varFraction * 100.0, 1e-12);
    CHECK_CLOSE(d.tailBoundary * d.moneyPerUnit, -r.figures.var, 1e-9 * r.figures.var);
    // The density per % integrates to 1 over the axis as well.
    CHECK_CLOSE(trapezoid(d.x, d.density), 1.0, 1e-4);
}

void TestChartData::lossTailCurveAgainstScipy()
{
    // SciPy 1.10.1: norm.pdf(-1500, loc=200, scale=1000) = 9.404907737688694e-05,
    //               norm.cdf(-1500, loc=200, scale=1000) = 0.04456546275854304.
    const HorizonMoments m{200.0, 1000.0};
    CHECK_CLOSE(normalPnlDensity(m, -1500.0), 9.404907737688694e-05, 1e-17);
    CHECK_CLOSE(normalPnlProbabilityBelow(m, -1500.0), 0.04456546275854304, 1e-15);
    // And the chart samples exactly that curve.
    const RiskReport r = sampleReport();
    const LossTailChartData d = buildLossTailChartData(r);
    for (qsizetype i : {qsizetype(0), d.x.size() / 3, d.x.size() - 1})
        QVERIFY(d.density[i] == normalPnlDensity(r.horizon, d.x[i]));
    CHECK_CLOSE(trapezoid(d.x, d.density), 1.0, 1e-4); // x covers μ ± 4.5σ at least
}

void TestChartData::lossTailShadedMassIsTailProbability()
{
    // Under the normal model the shaded area is P(P&L < −VaR) = 1 − C (definition of VaR).
    for (double c : {0.95, 0.99}) {
        Assumptions a;
        a.confidence = c;
        a.mean = MeanModel::Sample;
        const LossTailChartData d = buildLossTailChartData(sampleReport(a), {LossTailUnit::Money, false, 4001, 0, 4.5});
        CHECK_CLOSE(trapezoid(d.tailX, d.tailDensity), 1.0 - c, 2e-4 * (1.0 - c) + 2e-6);
        CHECK_CLOSE(d.tailProbability, 1.0 - c, 1e-15);
    }
}

void TestChartData::lossTailHistogramIsADensity()
{
    Assumptions a;
    a.horizonDays = 10;
    const RiskReport r = sampleReport(a);
    const LossTailChartData d = buildLossTailChartData(r);
    QVERIFY(d.hasHistogram);
    QCOMPARE(d.historyCount, r.windowReturns);
    double mass = 0.0;
    for (double b : d.binDensity)
        mass += b * d.binWidth;
    CHECK_CLOSE(mass, 1.0, 1e-12);
    // Bins cover p_t √H exactly: the lowest and highest scaled daily P&L are the outer edges.
    const Eigen::VectorXd pnl = r.windowReturnsMatrix * r.exposures * std::sqrt(10.0);
    CHECK_CLOSE(d.binCenters.front() - 0.5 * d.binWidth, pnl.minCoeff(), 1e-6 * std::abs(pnl.minCoeff()));
    CHECK_CLOSE(d.binCenters.back() + 0.5 * d.binWidth, pnl.maxCoeff(), 1e-6 * std::abs(pnl.maxCoeff()));
    QVERIFY(d.histogramLegend.contains(QStringLiteral("√10")));
    // Without the option there is no histogram.
    LossTailOptions o;
    o.showHistory = false;
    QVERIFY(!buildLossTailChartData(r, o).hasHistogram);
}

void TestChartData::lossTailHoverReadsModelCdf()
{
    const RiskReport r = sampleReport();
    const LossTailChartData d = buildLossTailChartData(r);
    // At −VaR the model's probability of a lower P&L is 1 − C = 1% (definition of VaR).
    CHECK_CLOSE(*lossTailProbabilityBelow(d, d.tailBoundary), 0.01, 1e-12);
    const QString text = lossTailHoverText(d, d.tailBoundary);
    QVERIFY2(text.contains(QStringLiteral("1.00%")), qPrintable(text));
    QVERIFY2(!text.contains(QStringLiteral("nan"), Qt::CaseInsensitive), qPrintable(text));
}

void TestChartData::lossTailZeroSpreadHasNoCurveAndNoNaN()
{
    const RiskReport r = positionReport(1'000'000.0, 0.0, 0.05);
    QCOMPARE(r.horizon.sd, 0.0);
    const LossTailChartData d = buildLossTailChartData(r);
    QVERIFY(!d.hasCurve);
    QVERIFY(!d.note.isEmpty());
    QVERIFY(d.x.isEmpty() && d.tailX.isEmpty());
    for (double v : {d.tailBoundary, d.esMarker, d.xMin, d.xMax, d.densityMax, d.densityDisplayPer, d.model.mean, d.model.sd})
        QVERIFY(std::isfinite(v));
    QVERIFY(d.xMin < d.xMax);
    QVERIFY(!lossTailProbabilityBelow(d, 0.0));
    QVERIFY(lossTailHoverText(d, 0.0).isEmpty());
    QVERIFY(!d.varLabel.contains(QStringLiteral("nan"), Qt::CaseInsensitive));
}

void TestChartData::contoursOfCircleLieOnLevelSet()
{
    // f(x, y) = x² + y²: the level set f = L is the circle of radius √L.
    std::vector<double> xs, ys, values;
    for (int i = 0; i <= 80; ++i)
        xs.push_back(-2.0 + 0.05 * i);
    ys = xs;
    for (double x : xs)
        for (double y : ys)
            values.push_back(x * x + y * y);
    for (double level : {0.5, 1.0, 2.25}) {
        const auto lines = contourLines(xs, ys, values, level);
        QCOMPARE(lines.size(), std::size_t{1});
        const ContourLine &line = lines.front();
        QVERIFY(line.size() > 40);
        // Closed: the walk returns to its start.
        QVERIFY(line.front().x == line.back().x && line.front().y == line.back().y);
        double length = 0.0;
        for (std::size_t k = 0; k < line.size(); ++k) {
            // Linear interpolation on a 0.05 grid: radius within 2e-3 of √L.
            CHECK_CLOSE(std::hypot(line[k].x, line[k].y), std::sqrt(level), 2e-3);
            if (k > 0)
                length += std::hypot(line[k].x - line[k - 1].x, line[k].y - line[k - 1].y);
        }
        CHECK_CLOSE(length, 2.0 * M_PI * std::sqrt(level), 5e-3 * 2.0 * M_PI * std::sqrt(level));
    }
}

void TestChartData::contoursThroughSaddlesAndGaps()
{
    // f(x, y) = x y has a saddle at 0; the level 0.3 is two hyperbola branches, each open.
    std::vector<double> xs, ys, values;
    for (int i = 0; i <= 40; ++i)
        xs.push_back(-1.0 + 0.05 * i);
    ys = xs;
    for (double x : xs)
        for (double y : ys)
            values.push_back(x * y);
    auto lines = contourLines(xs, ys, values, 0.3);
    QCOMPARE(lines.size(), std::size_t{2});
    for (const ContourLine &line : lines)
        for (const ContourPoint &p : line)
            CHECK_CLOSE(p.x * p.y, 0.3, 2e-3);
    // A NaN corner removes its cells and breaks the line; no NaN comes out.
    values[20 * ys.size() + 20] = std::nan("");
    lines = contourLines(xs, ys, values, 0.0);
    for (const ContourLine &line : lines)
        for (const ContourPoint &p : line)
            QVERIFY(std::isfinite(p.x) && std::isfinite(p.y));
    QVERIFY(contourLines(xs, ys, values, 5.0).empty()); // above the whole field
}

void TestChartData::tradeoffEqualsNormalRiskGrid()
{
    Assumptions a;
    a.mean = MeanModel::Sample;
    a.horizonDays = 10;
    const RiskReport r = sampleReport(a);
    const TradeoffChartData d = buildTradeoffChartData(r);
    QVERIFY(d.valid);
    const RiskGrid map = normalRiskGrid(r.oneDay, d.map.horizons, d.map.confidences);
    QCOMPARE(d.map.horizons.size(), std::size_t(252));
    QCOMPARE(d.map.horizons.front(), 1);
    QCOMPARE(d.map.horizons.back(), 252);
    QCOMPARE(d.map.confidences.front(), 0.90);
    QCOMPARE(d.map.confidences.back(), 0.999);
    QVERIFY(d.map.var == map.var);
    QVERIFY(d.byHorizon.var == normalRiskGrid(r.oneDay, d.byHorizon.horizons, {0.95, 0.975, 0.99, 0.995, 0.999}).var);
    QVERIFY(d.byConfidence.var == normalRiskGrid(r.oneDay, {10}, d.byConfidence.confidences).var);
    // Every cell is core's normal VaR at that whole-day horizon (parametric.h), to the bit.
    for (std::size_t h : {std::size_t{0}, std::size_t{9}, std::size_t{251}})
        for (std::size_t c : {std::size_t{0}, d.map.confidences.size() / 2, d.map.confidences.size() - 1}) {
            const double days = d.map.horizons[h];
            QVERIFY(d.map.varAt(h, c) == normalVarEs({days * r.oneDay.mean, std::sqrt(days) * r.oneDay.sd}, d.map.confidences[c]).var);
        }
    // The line at 99% passes through the report's own figure at the current horizon.
    CHECK_CLOSE(d.byHorizon.varAt(9, 2), r.figures.var, 1e-9 * r.figures.var);
    // Map rows are even on the tail scale −log10(1 − C).
    for (std::size_t k = 1; k + 1 < d.mapTail.size(); ++k)
        CHECK_CLOSE(d.mapTail[k + 1] - d.mapTail[k], d.mapTail[1] - d.mapTail[0], 1e-9);
    CHECK_CLOSE(d.mapTail.front(), 1.0, 1e-12);
    CHECK_CLOSE(d.mapTail.back(), 3.0, 1e-12);
}

// Under every model the horizon-and-confidence view is core's modelRiskGrid (grid.h), and the
// current setting's marker lies on its curve: the line at 99% passes through the headline.
void TestChartData::tradeoffFollowsTheChosenModel()
{
    for (RiskModel m : {RiskModel::StudentT, RiskModel::CornishFisher, RiskModel::Historical, RiskModel::MonteCarlo}) {
        Assumptions a;
        a.model = m;
        a.horizonDays = 10;
        a.simulations = 5000;
        const RiskReport r = sampleReport(a);
        QCOMPARE(r.model.used, m);
        const TradeoffChartData d = buildTradeoffChartData(r);
        QVERIFY(d.valid);
        QVERIFY(d.note.contains(m == RiskModel::Historical ? QStringLiteral("historical") : QStringLiteral("model")));
        const auto map = modelRiskGrid(r, d.map.horizons, d.map.confidences);
        QVERIFY(map.ok());
        QVERIFY(d.map.var == map.value().var);
        QVERIFY(std::abs(d.byHorizon.varAt(9, 2) - r.figures.var) <= 1e-9 * r.figures.var);
        QVERIFY(d.ridge.empty()); // the turning horizon is the normal model's
    }
}

void TestChartData::tradeoffContoursLieOnVarLevels()
{
    const RiskReport r = sampleReport();
    const TradeoffChartData d = buildTradeoffChartData(r);
    QVERIFY(d.contours.size() >= 4);
    double previous = -1e300;
    for (const ContourLevel &level : d.contours) {
        QVERIFY(level.level > previous);
        previous = level.level;
        QVERIFY(level.level >= d.varMin && level.level <= d.varMax);
        for (const ContourLine &line : level.lines)
            for (const ContourPoint &p : line) {
                // VaR of the (fractional) horizon and confidence at the contour point, by core's
                // normalVarEs: within 0.5% of the level (linear interpolation between cells).
                const double c = tailScaleToConfidence(p.y);
                const double v = normalVarEs({p.x * r.oneDay.mean, std::sqrt(p.x) * r.oneDay.sd}, c).var;
                CHECK_CLOSE(v, level.level, 5e-3 * level.level);
            }
    }
}

void TestChartData::turningHorizonFormula()
{
    // H* = (z σ / (2 μ))²; SciPy 1.10.1: (norm.ppf(0.99)*10/2)**2 = 135.29736077635852.
    const auto h = normalVarTurningHorizon({1.0, 10.0}, 0.99);
    QVERIFY(h.has_value());
    CHECK_CLOSE(*h, 135.29736077635852, 1e-9);
    // It is the maximum of VaR(H) = z √H σ − H μ over whole days (grid.h).
    const RiskGrid g = normalRiskGrid({1.0, 10.0}, {134, 135, 136, 137}, {0.99});
    QVERIFY(g.varAt(1, 0) > g.varAt(0, 0));
    QVERIFY(g.varAt(1, 0) > g.varAt(3, 0));
    // No expected gain, or no spread: VaR never turns.
    QVERIFY(!normalVarTurningHorizon({0.0, 10.0}, 0.99));
    QVERIFY(!normalVarTurningHorizon({-1.0, 10.0}, 0.99));
    QVERIFY(!normalVarTurningHorizon({1.0, 0.0}, 0.99));
}

void TestChartData::tradeoffRidgeWithExpectedGain()
{
    // 20% volatility, 30% drift a year: H* at 99% = (2.32635 · 0.2/√252 / (2 · 0.3/252))² ≈ 152 days.
    const RiskReport r = positionReport(1'000'000.0, 0.20, 0.30);
    const TradeoffChartData d = buildTradeoffChartData(r);
    QVERIFY(!d.ridge.empty());
    QVERIFY(!d.ridgeLabel.isEmpty());
    const auto h99 = normalVarTurningHorizon(r.oneDay, 0.99);
    QVERIFY(h99 && *h99 > 100 && *h99 < 200);
    // The map shows it: along the 90% row (H* ≈ 46 days) VaR rises to H* and falls after it.
    const auto hLow = normalVarTurningHorizon(r.oneDay, d.map.confidences[0]);
    QVERIFY(hLow && *hLow > 1 && *hLow < 252);
    const std::size_t peak = static_cast<std::size_t>(std::lround(*hLow)) - 1;
    QVERIFY(d.map.varAt(peak, 0) > d.map.varAt(0, 0));
    QVERIFY(d.map.varAt(peak, 0) > d.map.varAt(251, 0));
    // At 99.9% H* ≈ 267 days lies beyond the year: the ridge leaves the map there.
    QVERIFY(d.ridge.size() < d.map.confidences.size());
    // Line turns are marked where they fall inside the year, at core's VaR there.
    QVERIFY(!d.lineTurns.empty());
    for (const TurningPoint &t : d.lineTurns)
        CHECK_CLOSE(t.var, normalVarEs({t.horizonDays * r.oneDay.mean, std::sqrt(t.horizonDays) * r.oneDay.sd}, t.confidence).var, 1e-6);
    // With zero mean there is no ridge.
    Assumptions zero;
    QVERIFY(buildTradeoffChartData(sampleReport(zero)).ridge.empty());
}

void TestChartData::tradeoffPickOnMap()
{
    auto p = pickOnMap(10.4, 2.0, 252);
    QCOMPARE(p.horizonDays, 10);
    CHECK_CLOSE(p.confidence, 0.99, 1e-12);
    p = pickOnMap(-5.0, 0.2, 252); // outside: clamped to 1 day and 90%
    QCOMPARE(p.horizonDays, 1);
    CHECK_CLOSE(p.confidence, 0.90, 1e-12);
    p = pickOnMap(400.0, 4.0, 252);
    QCOMPARE(p.horizonDays, 252);
    CHECK_CLOSE(p.confidence, 0.999, 1e-12);
    p = pickOnMap(63.0, confidenceToTailScale(0.975), 252);
    CHECK_CLOSE(p.confidence, 0.975, 1e-12);
}

void TestChartData::roundLevelsAreRound()
{
    // The step is the round number (1, 2, 2.5, 5 × 10^k) at or above span/target.
    const auto levels = roundLevels(12'345.0, 98'765.0, 7);
    QCOMPARE(levels, (std::vector<double>{20'000.0, 40'000.0, 60'000.0, 80'000.0}));
    QCOMPARE(roundLevels(0.0, 10.0, 4), (std::vector<double>{2.5, 5.0, 7.5}));
    QVERIFY(roundLevels(1.0, 1.0, 7).empty());
}

void TestChartData::contributionsSortedAndHedgesFlagged()
{
    const RiskReport r = sampleReport();
    const ContributionsChartData d = buildContributionsChartData(r);
    QCOMPARE(d.bars.size(), r.holdings.size());
    double sum = 0.0;
    for (std::size_t k = 0; k < d.bars.size(); ++k) {
        if (k > 0)
            QVERIFY2(d.bars[k - 1].componentVar >= d.bars[k].componentVar, qPrintable(d.bars[k].asset));
        QCOMPARE(d.bars[k].hedge, d.bars[k].componentVar < 0.0);
        sum += d.bars[k].componentVar;
    }
    // Euler: the components sum to VaR (contributions.h).
    CHECK_CLOSE(sum, r.figures.var, 1e-8 * r.figures.var);
    // The sample's short index future is a hedge.
    QVERIFY(d.hasHedges);
    QCOMPARE(d.bars.back().asset, QStringLiteral("BROAD_MARKET_FUTURE"));
    QVERIFY(d.bars.back().hedge);
    QCOMPARE(d.portfolioVar, r.figures.var);
    QCOMPARE(d.undiversifiedVar, r.undiversifiedVar);
    CHECK_CLOSE(d.undiversifiedVar - d.portfolioVar, d.diversificationBenefit, 1e-8 * d.undiversifiedVar);
    QVERIFY(d.diversificationBenefit > 0.0);
}

void TestChartData::contributionsPooledKeepTheSum()
{
    const RiskReport r = sampleReport();
    const ContributionsChartData d = buildContributionsChartData(r, {5});
    QCOMPARE(d.bars.size(), std::size_t{5});
    QCOMPARE(d.bars.back().pooled, static_cast<int>(r.holdings.size()) - 4);
    double sum = 0.0;
    for (const ContributionBar &b : d.bars)
        sum += b.componentVar;
    CHECK_CLOSE(sum, r.figures.var, 1e-8 * r.figures.var);
    for (std::size_t k = 1; k + 1 < d.bars.size(); ++k)
        QVERIFY(d.bars[k - 1].componentVar >= d.bars[k].componentVar);
}

QTEST_GUILESS_MAIN(TestChartData)
#include "test_chartdata.moc"

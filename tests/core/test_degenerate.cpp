// Degenerate portfolios give a defined, finite result with a warning, or a clear refusal — never
// NaN or infinity (issue 7; DEVELOPERS.md "Conventions"). Cases: zero variance (constant prices),
// a zero net value (long and short netting to 0), a singular covariance (two identical assets), a
// single holding, all exposures zero, and inputs whose figures overflow double precision.
//
// Expected values are identities of the normal model (README "What the figures mean"), not
// outputs of this code: with σ_p = 0 and zero mean, VaR = ES = 0; two identical assets held
// q₁ and q₂ are one asset held q₁ + q₂ (same returns, same price), so their VaR is equal; for
// one holding the portfolio VaR is its standalone VaR, z·σ·|e|, and the diversification benefit
// is 0; components add up to the VaR (Euler allocation). z = Φ⁻¹(0.99) = 2.3263478740408408
// (SciPy 1.10 norm.ppf(0.99); REFERENCE-VALUES.md §1).
#include "closeness.h"

#include "tailwise/finitecheck.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"

#include <QTest>

#include <cmath>
#include <string>

using namespace tailwise;

namespace {

const char *const constantPrices = "date,A,B\n2024-01-02,10,20\n2024-01-03,10,20\n2024-01-04,10,20\n"
                                   "2024-01-05,10,20\n2024-01-08,10,20\n2024-01-09,10,20\n";
// A and B are the same series; C differs (invented prices).
const char *const twinPrices = "date,A,B,C\n2024-01-02,10,10,5\n2024-01-03,10.5,10.5,5.1\n2024-01-04,10.2,10.2,4.9\n"
                               "2024-01-05,10.9,10.9,5.2\n2024-01-08,10.4,10.4,5.0\n2024-01-09,10.1,10.1,5.3\n";

PriceHistory prices(const char *csv)
{
    auto r = parsePriceCsv(csv, "prices.csv");
    if (!r)
        qFatal("test prices refused: %s", r.error().message.c_str());
    return r.value();
}

Holdings holdings(const char *csv, const PriceHistory &p)
{
    auto r = parseHoldingsCsv(csv, "holdings.csv", &p);
    if (!r)
        qFatal("test holdings refused: %s", r.error().message.c_str());
    return r.value();
}

bool hasWarning(const RiskReport &r, const char *phrase)
{
    for (const auto &w : r.warnings)
        if (w.find(phrase) != std::string::npos)
            return true;
    return false;
}

QString warningsText(const RiskReport &r)
{
    QString s;
    for (const auto &w : r.warnings)
        s += QString::fromStdString(w) + QStringLiteral(" | ");
    return s;
}

const RiskModel allModels[] = {RiskModel::Normal, RiskModel::StudentT, RiskModel::CornishFisher, RiskModel::Historical,
                               RiskModel::MonteCarlo};

Assumptions assumptionsFor(RiskModel model, CovarianceEstimator estimator, MeanModel mean)
{
    Assumptions a;
    a.model = model;
    a.estimator = estimator;
    a.mean = mean;
    a.simulations = 2000; // enough to exercise the path, quick under the sanitisers
    return a;
}

} // namespace

class TestDegenerate : public QObject {
    Q_OBJECT

private slots:
    // Every model, estimator and mean on every degenerate case: finite or refused, never NaN/inf.
    void everyModelIsFiniteOrRefuses_data()
    {
        QTest::addColumn<QString>("pricesCsv");
        QTest::addColumn<QString>("holdingsCsv");
        QTest::newRow("zero variance") << constantPrices << "asset,quantity\nA,100\nB,-30\n";
        QTest::newRow("zero net value") << twinPrices << "asset,value\nA,1000\nC,-1000\n";
        QTest::newRow("zero net value, identical assets") << twinPrices << "asset,quantity\nA,100\nB,-100\n";
        QTest::newRow("singular covariance") << twinPrices << "asset,quantity\nA,100\nB,50\nC,10\n";
        QTest::newRow("single holding") << twinPrices << "asset,quantity\nC,1\n";
        QTest::newRow("all exposures zero") << twinPrices << "asset,quantity\nA,0\nC,0\n";
    }

    void everyModelIsFiniteOrRefuses()
    {
        QFETCH(QString, pricesCsv);
        QFETCH(QString, holdingsCsv);
        const PriceHistory p = prices(pricesCsv.toUtf8().constData());
        const Holdings h = holdings(holdingsCsv.toUtf8().constData(), p);
        for (const RiskModel model : allModels) {
            for (const auto estimator : {CovarianceEstimator::Sample, CovarianceEstimator::Ewma}) {
                for (const auto mean : {MeanModel::Zero, MeanModel::Sample}) {
                    const Assumptions a = assumptionsFor(model, estimator, mean);
                    const QString context = QStringLiteral("%1 / %2 / %3")
                                                .arg(QString::fromUtf8(toName(model).data(), static_cast<int>(toName(model).size())),
                                                     QString::fromUtf8(toName(estimator).data()), QString::fromUtf8(toName(mean).data()));
                    const auto r = computeRisk(p, h, a);
                    if (!r) {
                        // A refusal must say why, in a sentence.
                        QVERIFY2(!r.error().message.empty(), qPrintable(context));
                        continue;
                    }
                    const auto finite = requireFiniteReport(r.value());
                    QVERIFY2(finite.ok(), qPrintable(context + QStringLiteral(": ")
                                                     + (finite ? QString() : QString::fromStdString(finite.error().message))));
                }
            }
        }
    }

    void zeroVarianceGivesZeroVarWithWarning()
    {
        const PriceHistory p = prices(constantPrices);
        const auto r = computeRisk(p, holdings("asset,quantity\nA,100\nB,-30\n", p), Assumptions{});
        QVERIFY(r.ok());
        // σ_p = 0 and μ = 0: VaR = z·0 − 0 = 0, ES likewise (README "What the figures mean").
        TW_CLOSE_ABS(r.value().figures.var, 0.0, 0.0);
        TW_CLOSE_ABS(r.value().figures.es, 0.0, 0.0);
        QVERIFY2(hasWarning(r.value(), "zero variance"), qPrintable(warningsText(r.value())));
        TW_CLOSE_ABS(r.value().portfolioValue, 100 * 10.0 - 30 * 20.0, 0.0);
        QVERIFY(r.value().varFraction.has_value());
        TW_CLOSE_ABS(*r.value().varFraction, 0.0, 0.0);
        // A zero VaR has no shares to give out: a component share of nothing is not defined.
        for (const auto &hr : r.value().holdings)
            QVERIFY(!hr.componentShare.has_value());
    }

    void zeroNetValueHasNoFractions()
    {
        const PriceHistory p = prices(twinPrices);
        const auto r = computeRisk(p, holdings("asset,value\nA,1000\nC,-1000\n", p), Assumptions{});
        QVERIFY(r.ok());
        TW_CLOSE_ABS(r.value().portfolioValue, 0.0, 0.0);
        QVERIFY(r.value().figures.var > 0.0); // a long/short book still has risk
        QVERIFY(!r.value().varFraction.has_value());
        QVERIFY(!r.value().esFraction.has_value());
        for (const auto &hr : r.value().holdings)
            QVERIFY(!hr.weight.has_value());
        QVERIFY2(hasWarning(r.value(), "net value is zero"), qPrintable(warningsText(r.value())));
    }

    void identicalAssetsLongAndShortCancel()
    {
        // Long and short the same series by the same amount: P&L is zero every day, so σ_p = 0.
        // The singular covariance is repaired by raising its eigenvalues to 1e-12 × the largest
        // (DEVELOPERS.md, "Data rules"), which leaves a residual of order z·√(1e-12·λmax)·|e|:
        // here about 1e-7 of the gross exposure of 2,000; allow 1e-6 of it.
        const PriceHistory p = prices(twinPrices);
        const auto r = computeRisk(p, holdings("asset,quantity\nA,100\nB,-100\n", p), Assumptions{});
        QVERIFY(r.ok());
        const double gross = 2 * 100 * 10.1;
        TW_CLOSE_ABS(r.value().figures.var, 0.0, 1e-6 * gross);
        TW_CLOSE_ABS(r.value().figures.es, 0.0, 1e-6 * gross);
        QVERIFY(!r.value().varFraction.has_value());
    }

    void singularCovarianceEqualsMergedHolding()
    {
        const PriceHistory p = prices(twinPrices);
        for (const auto estimator : {CovarianceEstimator::Sample, CovarianceEstimator::Ewma}) {
            Assumptions a;
            a.estimator = estimator;
            const auto split = computeRisk(p, holdings("asset,quantity\nA,100\nB,50\nC,10\n", p), a);
            const auto merged = computeRisk(p, holdings("asset,quantity\nA,150\nC,10\n", p), a);
            QVERIFY(split.ok() && merged.ok());
            TW_CLOSE_REL(split.value().figures.var, merged.value().figures.var, 1e-12);
            TW_CLOSE_REL(split.value().figures.es, merged.value().figures.es, 1e-12);
            double sum = 0.0;
            for (const auto &hr : split.value().holdings)
                sum += hr.componentVar;
            TW_CLOSE_REL(sum, split.value().figures.var, 1e-12); // Euler: components add up
        }
    }

    void singleHoldingIsItsStandaloneVar()
    {
        const PriceHistory p = prices(twinPrices);
        const auto r = computeRisk(p, holdings("asset,quantity\nC,-40\n", p), Assumptions{});
        QVERIFY(r.ok());
        const auto &rep = r.value();
        QCOMPARE(rep.holdings.size(), std::size_t(1));
        const double z = 2.3263478740408408; // SciPy norm.ppf(0.99)
        const double expected = z * rep.holdings[0].dailyVolatility * std::abs(rep.holdings[0].exposure);
        TW_CLOSE_REL(rep.figures.var, expected, 1e-12);
        TW_CLOSE_REL(rep.holdings[0].standaloneVar, rep.figures.var, 1e-12);
        TW_CLOSE_ABS(rep.diversificationBenefit, 0.0, 1e-9 * rep.figures.var);
        QVERIFY(rep.holdings[0].componentShare.has_value());
        TW_CLOSE_REL(*rep.holdings[0].componentShare, 1.0, 1e-12);
    }

    void allExposuresZero()
    {
        const PriceHistory p = prices(twinPrices);
        const auto r = computeRisk(p, holdings("asset,quantity\nA,0\nC,0\n", p), Assumptions{});
        QVERIFY(r.ok());
        TW_CLOSE_ABS(r.value().figures.var, 0.0, 0.0);
        QVERIFY(!r.value().varFraction.has_value());
    }

    // Finite inputs whose figures would overflow (largest double ≈ 1.8e308, IEEE 754) are refused
    // with a message that names the holding or the asset.
    void overflowIsRefused()
    {
        // Returns that overflow are refused where the prices are read, naming the line and column.
        const auto jumpy = parsePriceCsv("date,A,B\n2024-01-02,1e-300,1\n2024-01-03,1e300,1\n2024-01-04,1e-300,1.1\n"
                                         "2024-01-05,1e300,1\n",
                                         "prices.csv");
        QVERIFY(!jumpy.ok());
        QVERIFY2(jumpy.error().message.find("\"A\"") != std::string::npos
                     && jumpy.error().message.find("prices.csv, line 3, column 2") != std::string::npos,
                 jumpy.error().message.c_str());

        const PriceHistory p = prices(twinPrices);
        const auto exposure = computeRisk(p, holdings("asset,quantity\nA,1\nC,1e308\n", p), Assumptions{});
        QVERIFY(!exposure.ok());
        QCOMPARE(exposure.error().kind, ErrorKind::Numerical);
        QCOMPARE(exposure.error().field, std::string("holding 2"));
        QVERIFY2(exposure.error().message.find("\"C\"") != std::string::npos, exposure.error().message.c_str());

        // Finite exposures whose P&L variance overflows: e ≈ 1e200, σ² ≈ 1e-3 → 1e397.
        const auto variance = computeRisk(p, holdings("asset,value\nA,1e200\nC,1e200\n", p), Assumptions{});
        QVERIFY(!variance.ok());
        QCOMPARE(variance.error().kind, ErrorKind::Numerical);
        QVERIFY2(variance.error().message.find("too large") != std::string::npos, variance.error().message.c_str());

        const auto single = computeSinglePositionRisk(SinglePosition{1e308, 100.0, 0.0}, Assumptions{});
        QVERIFY(!single.ok());
        QCOMPARE(single.error().kind, ErrorKind::Numerical);
    }
};

QTEST_GUILESS_MAIN(TestDegenerate)
#include "test_degenerate.moc"

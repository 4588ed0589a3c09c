// Monte Carlo VaR/ES: agreement with the closed forms within the reported standard error,
// reproducibility by seed, independence of the thread count, cancellation and progress.
// Inputs: the invented two- and three-asset portfolios of REFERENCE-VALUES §10 (NumPy values).
#include "closeness.h"

#include "tailwise/parametric.h"
#include "tailwise/simulate.h"
#include "tailwise/studentt.h"

#include <QTest>

#include <cmath>
#include <stop_token>
#include <vector>

using namespace tailwise;

namespace {

struct Portfolio {
    Eigen::VectorXd e;
    Eigen::MatrixXd cov;
    Eigen::VectorXd mean;
};

Eigen::MatrixXd covariance(const Eigen::VectorXd &vols, const Eigen::MatrixXd &corr)
{
    return vols.asDiagonal() * corr * vols.asDiagonal();
}

// REFERENCE-VALUES §10, two-asset (invented).
Portfolio twoAsset()
{
    Portfolio p;
    p.e = Eigen::Vector2d(600000, 400000);
    Eigen::Matrix2d corr;
    corr << 1.0, 0.3, 0.3, 1.0;
    p.cov = covariance(Eigen::Vector2d(0.02, 0.01), corr);
    p.mean = Eigen::Vector2d(0.0005, 0.0002);
    return p;
}

// REFERENCE-VALUES §10, three-asset (invented).
Portfolio threeAsset()
{
    Portfolio p;
    p.e = Eigen::Vector3d(500000, 300000, 200000);
    Eigen::Matrix3d corr;
    corr << 1.0, 0.4, 0.1, 0.4, 1.0, -0.2, 0.1, -0.2, 1.0;
    p.cov = covariance(Eigen::Vector3d(0.015, 0.025, 0.008), corr);
    p.mean = Eigen::Vector3d(0.0004, 0.0006, 0.0001);
    return p;
}

SimulationFigures run(const Portfolio &p, bool withMean, int horizon, SimulationSettings s, int threads)
{
    RunControl control;
    control.threads = threads;
    const Eigen::VectorXd mean = withMean ? p.mean : Eigen::VectorXd::Zero(p.e.size());
    auto r = simulateVarEs(p.e, p.cov, mean, horizon, 0.99, s, control);
    Q_ASSERT(r.ok());
    return r.value();
}

} // namespace

class TestSimulate : public QObject {
    Q_OBJECT

private slots:
    void normalWithinFourStandardErrors_data()
    {
        QTest::addColumn<int>("which");
        QTest::addColumn<bool>("withMean");
        QTest::addColumn<double>("var");
        QTest::addColumn<double>("es");
        // REFERENCE-VALUES §10 (invented, NumPy): VaR and ES at 99%, μ = 0 and with μ.
        QTest::newRow("two-asset mu=0") << 2 << false << 31965.06951 << 36621.24601;
        QTest::newRow("two-asset with mu") << 2 << true << 31585.06951 << 36241.24601;
        QTest::newRow("three-asset mu=0") << 3 << false << 29210.25977 << 33465.15824;
        QTest::newRow("three-asset with mu") << 3 << true << 28810.25977 << 33065.15824;
    }
    void normalWithinFourStandardErrors()
    {
        QFETCH(int, which);
        QFETCH(bool, withMean);
        QFETCH(double, var);
        QFETCH(double, es);
        const Portfolio p = which == 2 ? twoAsset() : threeAsset();
        const SimulationFigures f = run(p, withMean, 1, SimulationSettings{200000, 7, std::nullopt}, 2);
        QVERIFY(f.varStandardError > 0.0);
        // A 99% quantile from 200,000 draws: SE ≈ √(α(1−α)/N)/φ(z)·σ ≈ 0.0084 σ (asymptotic
        // order-statistic variance, e.g. Glasserman 2003 §9.1 (mem)); the batch estimate must be near it.
        const double sigma = std::sqrt(p.e.dot(p.cov * p.e));
        const double asymptotic = std::sqrt(0.01 * 0.99 / 200000.0) / 0.0266521422 * sigma;
        QVERIFY2(f.varStandardError > 0.4 * asymptotic && f.varStandardError < 2.5 * asymptotic,
                 qPrintable(QStringLiteral("batch SE %1, asymptotic %2").arg(f.varStandardError).arg(asymptotic)));
        TW_CLOSE_ABS(f.figures.var, var, 4.0 * f.varStandardError);
        TW_CLOSE_ABS(f.figures.es, es, 4.0 * f.esStandardError);
        QCOMPARE(f.simulations, 200000);
    }

    // One asset of unit variance: the losses are the normals themselves, so their quantiles and
    // tail means must be the standard normal's (parametric.h) at every level, including 0.9999,
    // whose quantile 3.719 lies beyond the ziggurat's base layer (r = 3.654), in its tail draws.
    void unitNormalDrawsHaveNormalQuantiles_data()
    {
        QTest::addColumn<double>("confidence");
        for (double c : {0.6, 0.9, 0.99, 0.999, 0.9999})
            QTest::newRow(qPrintable(QString::number(c))) << c;
    }
    void unitNormalDrawsHaveNormalQuantiles()
    {
        QFETCH(double, confidence);
        const Eigen::VectorXd e = Eigen::VectorXd::Ones(1);
        const Eigen::MatrixXd cov = Eigen::MatrixXd::Identity(1, 1);
        RunControl control;
        auto r = simulateVarEs(e, cov, Eigen::VectorXd::Zero(1), 1, confidence,
                               SimulationSettings{2000000, 5, std::nullopt}, control);
        QVERIFY(r.ok());
        const VarEs closed = normalVarEs(HorizonMoments{0.0, 1.0}, confidence);
        TW_CLOSE_ABS(r.value().figures.var, closed.var, 4.0 * r.value().varStandardError);
        TW_CLOSE_ABS(r.value().figures.es, closed.es, 4.0 * r.value().esStandardError);
    }

    void horizonScalesTheDraws()
    {
        // 10-day normal VaR = √10 z σ − 10 μ (square-root of time, REFERENCE-VALUES §9 factor 3.16228).
        const Portfolio p = twoAsset();
        const SimulationFigures f = run(p, true, 10, SimulationSettings{200000, 11, std::nullopt}, 2);
        const double sigma = std::sqrt(p.e.dot(p.cov * p.e));
        const double expected = normalVarEs(HorizonMoments{10.0 * p.e.dot(p.mean), std::sqrt(10.0) * sigma}, 0.99).var;
        TW_CLOSE_ABS(f.figures.var, expected, 4.0 * f.varStandardError);
    }

    void studentTDrawsMatchTheClosedForm()
    {
        // A multivariate t with one mixing variable makes eᵀr an exact univariate t (MFE 2005 §3.2,
        // normal variance mixtures (mem)), so the closed form of studentt.h is the target; ν = 5.
        const Portfolio p = threeAsset();
        const SimulationFigures f = run(p, false, 1, SimulationSettings{200000, 3, 5.0}, 2);
        const double sigma = std::sqrt(p.e.dot(p.cov * p.e));
        const VarEs t = studentTVarEs(HorizonMoments{0.0, sigma}, 5.0, 0.99);
        TW_CLOSE_ABS(f.figures.var, t.var, 4.0 * f.varStandardError);
        TW_CLOSE_ABS(f.figures.es, t.es, 4.0 * f.esStandardError);
    }

    void sameSeedSameFigures()
    {
        const Portfolio p = twoAsset();
        const SimulationFigures a = run(p, true, 1, SimulationSettings{50000, 42, std::nullopt}, 2);
        const SimulationFigures b = run(p, true, 1, SimulationSettings{50000, 42, std::nullopt}, 2);
        QCOMPARE(a.figures.var, b.figures.var);
        QCOMPARE(a.figures.es, b.figures.es);
        QCOMPARE(a.varStandardError, b.varStandardError);
        const SimulationFigures c = run(p, true, 1, SimulationSettings{50000, 43, std::nullopt}, 2);
        QVERIFY(c.figures.var != a.figures.var);
        QVERIFY(c.figures.es != a.figures.es);
    }

    void threadCountDoesNotMatter()
    {
        const Portfolio p = threeAsset();
        for (std::optional<double> dof : {std::optional<double>{}, std::optional<double>{4.5}}) {
            const SimulationSettings s{100003, 2026, dof}; // not a multiple of the block size
            const SimulationFigures one = run(p, true, 5, s, 1);
            for (int threads : {2, 4}) {
                const SimulationFigures more = run(p, true, 5, s, threads);
                QCOMPARE(more.figures.var, one.figures.var);
                QCOMPARE(more.figures.es, one.figures.es);
                QCOMPARE(more.varStandardError, one.varStandardError);
            }
        }
    }

    void blockSeedsDiffer()
    {
        QVERIFY(blockSeed(1, 0) != blockSeed(1, 1));
        QVERIFY(blockSeed(1, 0) != blockSeed(2, 0));
        QCOMPARE(blockSeed(5, 9), blockSeed(5, 9));
    }

    void cancelAndProgress()
    {
        const Portfolio p = twoAsset();
        std::stop_source source;
        source.request_stop();
        RunControl cancelled;
        cancelled.stop = source.get_token();
        auto r = simulateVarEs(p.e, p.cov, p.mean, 1, 0.99, SimulationSettings{100000, 1, std::nullopt}, cancelled);
        QVERIFY(!r.ok());
        QCOMPARE(r.error().kind, ErrorKind::Cancelled);

        std::vector<double> seen;
        RunControl watched;
        watched.threads = 1;
        watched.progress = [&](double f) { seen.push_back(f); };
        auto ok = simulateVarEs(p.e, p.cov, p.mean, 1, 0.99, SimulationSettings{100000, 1, std::nullopt}, watched);
        QVERIFY(ok.ok());
        QVERIFY(seen.size() >= 2);
        for (std::size_t i = 1; i < seen.size(); ++i)
            QVERIFY(seen[i] >= seen[i - 1]);
        QCOMPARE(seen.back(), 1.0);
    }

    void riskFreePortfolioHasNoNaN()
    {
        // Zero covariance: every draw is the mean; VaR = −μ_h, SE = 0, all finite.
        Portfolio p = twoAsset();
        p.cov.setZero();
        const SimulationFigures f = run(p, true, 1, SimulationSettings{2000, 1, 5.0}, 2);
        TW_CLOSE_REL(f.figures.var, -p.e.dot(p.mean), 1e-12);
        QCOMPARE(f.varStandardError, 0.0);
        QVERIFY(std::isfinite(f.figures.es));
    }
};

QTEST_GUILESS_MAIN(TestSimulate)
#include "test_simulate.moc"

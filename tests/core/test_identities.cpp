// Identities that any correct normal VaR must satisfy, checked on the real data set and on
// random inputs: Euler's theorem (components add up), homogeneity in the holdings, monotonicity in
// the confidence, the square-root-of-time rule, the EWMA weights, and the Cholesky check with its
// eigenvalue repair.
#include "closeness.h"

#include "tailwise/contributions.h"
#include "tailwise/estimate.h"
#include "tailwise/holdings.h"
#include "tailwise/parametric.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"

#include <Eigen/Cholesky>
#include <Eigen/Eigenvalues>

#include <QTest>

#include <cmath>
#include <random>

using namespace tailwise;

namespace {

const std::string dataDir = TAILWISE_TEST_DATA_DIR;

Eigen::MatrixXd randomMatrix(std::mt19937 &rng, Eigen::Index rows, Eigen::Index cols, double scale)
{
    std::normal_distribution<double> normal(0.0, scale);
    Eigen::MatrixXd m(rows, cols);
    for (Eigen::Index r = 0; r < rows; ++r)
        for (Eigen::Index c = 0; c < cols; ++c)
            m(r, c) = normal(rng);
    return m;
}

} // namespace

class TestIdentities : public QObject {
    Q_OBJECT

    PriceHistory m_prices;
    Holdings m_short; // has a short position and a price override

    Result<RiskReport> risk(const Holdings &holdings, Assumptions a) const { return computeRisk(m_prices, holdings, a); }

private slots:
    void initTestCase()
    {
        auto prices = readPriceCsv(dataDir + "/eu-stock-indices-1991-1998.csv");
        QVERIFY2(prices.ok(), prices.ok() ? "" : prices.error().message.c_str());
        m_prices = std::move(prices).value();
        auto holdings = readHoldingsCsv(dataDir + "/eu-holdings-short.csv", &m_prices);
        QVERIFY2(holdings.ok(), holdings.ok() ? "" : holdings.error().message.c_str());
        m_short = std::move(holdings).value();
    }

    void contributionsSumToVarAndEs_data()
    {
        QTest::addColumn<int>("estimator");
        QTest::addColumn<int>("mean");
        QTest::addColumn<int>("horizon");
        QTest::newRow("sample, zero mean, H=1") << 0 << 0 << 1;
        QTest::newRow("sample, sample mean, H=10") << 0 << 1 << 10;
        QTest::newRow("ewma, zero mean, H=5") << 1 << 0 << 5;
        QTest::newRow("ewma, sample mean, H=250") << 1 << 1 << 250;
    }

    void contributionsSumToVarAndEs()
    {
        // Euler's theorem for functions homogeneous of degree one (MFE 2005 §6.3): the components
        // add up to the total, for VaR and ES alike, the mean term included.
        QFETCH(int, estimator);
        QFETCH(int, mean);
        QFETCH(int, horizon);
        Assumptions a;
        a.estimator = estimator ? CovarianceEstimator::Ewma : CovarianceEstimator::Sample;
        a.mean = mean ? MeanModel::Sample : MeanModel::Zero;
        a.horizonDays = horizon;
        auto r = risk(m_short, a);
        QVERIFY(r.ok());
        double var = 0.0, es = 0.0, share = 0.0;
        for (const auto &h : r.value().holdings) {
            var += h.componentVar;
            es += h.componentEs;
            share += h.componentShare.value_or(0.0);
        }
        TW_CLOSE_REL(var, r.value().figures.var, 1e-12);
        TW_CLOSE_REL(es, r.value().figures.es, 1e-12);
        TW_CLOSE_REL(share, 1.0, 1e-12);
        // The undiversified VaR is the sum of the standalone VaRs, the benefit their difference.
        double standalone = 0.0;
        for (const auto &h : r.value().holdings)
            standalone += h.standaloneVar;
        TW_CLOSE_REL(r.value().undiversifiedVar, standalone, 1e-12);
        TW_CLOSE_REL(r.value().diversificationBenefit, standalone - r.value().figures.var, 1e-9);
    }

    void contributionsSumOnRandomPortfolios()
    {
        // The same identity on random covariances, exposures (long and short) and means.
        std::mt19937 rng(20261201);
        for (int trial = 0; trial < 200; ++trial) {
            const Eigen::Index n = 1 + trial % 12;
            const Eigen::MatrixXd a = randomMatrix(rng, n, n, 0.01);
            const Eigen::MatrixXd cov = a * a.transpose() + 1e-6 * Eigen::MatrixXd::Identity(n, n);
            const Eigen::VectorXd e = randomMatrix(rng, n, 1, 1e6);
            const Eigen::VectorXd mu = randomMatrix(rng, n, 1, 1e-3);
            const int horizon = 1 + trial % 20;
            const double confidence = 0.9 + 0.0995 * (trial % 10) / 9.0;
            const Contributions c = normalContributions(e, cov, mu, horizon, confidence);
            const HorizonMoments m{horizon * e.dot(mu), std::sqrt(horizon * e.dot(cov * e))};
            const VarEs f = normalVarEs(m, confidence);
            const QString where = QStringLiteral("trial %1, n=%2").arg(trial).arg(n);
            // Relative to the spread term, since VaR itself may be near zero when μ_h is large.
            const double scale = normalTailMeanFactor(confidence) * m.sd + std::abs(m.mean);
            TW_CLOSE_ABS_CTX(c.componentVar.sum(), f.var, 1e-12 * scale, where);
            TW_CLOSE_ABS_CTX(c.componentEs.sum(), f.es, 1e-12 * scale, where);
            TW_CLOSE_ABS_CTX(e.dot(c.marginalVar), f.var, 1e-12 * scale, where);
        }
    }

    void scalingHoldingsScalesVar()
    {
        // Positive homogeneity: VaR(k·e) = k·VaR(e) for k > 0, with or without the mean
        // (issue 2; MFE 2005 §6.1 coherence axioms).
        for (const MeanModel mean : {MeanModel::Zero, MeanModel::Sample}) {
            Assumptions a;
            a.mean = mean;
            a.window = 500;
            auto base = risk(m_short, a);
            QVERIFY(base.ok());
            for (const double k : {0.001, 2.5, 1000.0}) {
                Holdings scaled = m_short;
                for (auto &h : scaled)
                    h.quantity *= k;
                auto r = risk(scaled, a);
                QVERIFY(r.ok());
                const QString where = QStringLiteral("k=%1, mean=%2").arg(k).arg(QString::fromUtf8(toName(mean).data()));
                TW_CLOSE_REL_CTX(r.value().figures.var, k * base.value().figures.var, 1e-12, where);
                TW_CLOSE_REL_CTX(r.value().figures.es, k * base.value().figures.es, 1e-12, where);
                TW_CLOSE_REL_CTX(r.value().undiversifiedVar, k * base.value().undiversifiedVar, 1e-12, where);
                // Fractions of value and shares do not change.
                TW_CLOSE_REL_CTX(*r.value().varFraction, *base.value().varFraction, 1e-12, where);
                TW_CLOSE_REL_CTX(*r.value().holdings[0].componentShare, *base.value().holdings[0].componentShare,
                                 1e-12, where);
            }
        }
    }

    void varRisesWithConfidence()
    {
        // z = Φ⁻¹(C) increases with C, and so do VaR and ES for σ_h > 0 (common practice);
        // ES ≥ VaR at every level (the mean beyond a quantile exceeds it).
        for (const MeanModel mean : {MeanModel::Zero, MeanModel::Sample}) {
            Assumptions a;
            a.mean = mean;
            double previousVar = -1e300, previousEs = -1e300;
            for (const double c : {0.5, 0.8, 0.9, 0.95, 0.975, 0.99, 0.995, 0.999, 0.9999}) {
                a.confidence = c;
                auto r = risk(m_short, a);
                QVERIFY(r.ok());
                const auto &f = r.value().figures;
                QVERIFY2(f.var > previousVar, qPrintable(QStringLiteral("C=%1: VaR %2 not above %3").arg(c).arg(f.var).arg(previousVar)));
                QVERIFY2(f.es > previousEs, qPrintable(QStringLiteral("C=%1: ES %2 not above %3").arg(c).arg(f.es).arg(previousEs)));
                QVERIFY2(f.es > f.var, qPrintable(QStringLiteral("C=%1: ES %2 not above VaR %3").arg(c).arg(f.es).arg(f.var)));
                previousVar = f.var;
                previousEs = f.es;
            }
        }
    }

    void zeroMeanVarGrowsAsRootH()
    {
        // Square-root-of-time (issue 2; common practice, REF §9): with μ = 0, VaR(H) = √H·VaR(1).
        Assumptions a;
        auto one = risk(m_short, a);
        QVERIFY(one.ok());
        for (const int h : {2, 5, 10, 21, 250}) {
            a.horizonDays = h;
            auto r = risk(m_short, a);
            QVERIFY(r.ok());
            const QString where = QStringLiteral("H=%1").arg(h);
            TW_CLOSE_REL_CTX(r.value().figures.var, std::sqrt(double(h)) * one.value().figures.var, 1e-12, where);
            TW_CLOSE_REL_CTX(r.value().figures.es, std::sqrt(double(h)) * one.value().figures.es, 1e-12, where);
            TW_CLOSE_REL_CTX(r.value().horizon.sd, std::sqrt(double(h)) * one.value().oneDay.sd, 1e-12, where);
        }
        // With the sample mean, μ_h = H·μ_1 grows linearly (issue 2).
        a.mean = MeanModel::Sample;
        a.horizonDays = 1;
        auto m1 = risk(m_short, a);
        a.horizonDays = 10;
        auto m10 = risk(m_short, a);
        QVERIFY(m1.ok() && m10.ok());
        TW_CLOSE_REL(m10.value().horizon.mean, 10.0 * m1.value().horizon.mean, 1e-12);
    }

    void ewmaOfConstantReturnsIsTheirOuterProduct()
    {
        // The normalised EWMA weights (1−λ)λ^k/(1−λ^n) sum to one (issue 2's definition), so when
        // every return is the same vector r the estimate is r rᵀ, for any λ and window length.
        Eigen::VectorXd r(3);
        r << 0.01, -0.02, 0.005;
        for (const double lambda : {0.5, 0.94, 0.97, 0.999}) {
            for (const Eigen::Index n : {1, 2, 60, 1000}) {
                const Eigen::MatrixXd returns = r.transpose().replicate(n, 1);
                const Eigen::MatrixXd cov = ewmaCovariance(returns, lambda);
                const Eigen::MatrixXd expected = r * r.transpose();
                const QString where = QStringLiteral("lambda=%1 n=%2").arg(lambda).arg(n);
                for (Eigen::Index i = 0; i < 3; ++i)
                    for (Eigen::Index j = 0; j < 3; ++j)
                        TW_CLOSE_REL_CTX(cov(i, j), expected(i, j), 1e-12, where);
            }
        }
    }

    void ewmaWeightsByAge()
    {
        // A single non-zero return of age k (0 = newest, the last row) enters with weight
        // (1−λ)λ^k/(1−λ^n): issue 2, RiskMetrics Technical Document (1996) exponential weighting.
        const double lambda = 0.94;
        const Eigen::Index n = 50;
        for (const Eigen::Index k : {0, 1, 10, 49}) {
            Eigen::MatrixXd returns = Eigen::MatrixXd::Zero(n, 2);
            returns(n - 1 - k, 0) = 0.03;
            returns(n - 1 - k, 1) = -0.01;
            const Eigen::MatrixXd cov = ewmaCovariance(returns, lambda);
            const double weight = (1 - lambda) * std::pow(lambda, double(k)) / (1 - std::pow(lambda, double(n)));
            const QString where = QStringLiteral("age %1").arg(k);
            TW_CLOSE_REL_CTX(cov(0, 0), weight * 0.03 * 0.03, 1e-12, where);
            TW_CLOSE_REL_CTX(cov(0, 1), weight * 0.03 * -0.01, 1e-12, where);
            TW_CLOSE_REL_CTX(cov(1, 1), weight * 0.01 * 0.01, 1e-12, where);
        }
    }

    void sampleEstimatorsByDefinition()
    {
        // Sample mean 1/n Σ r_t and covariance 1/(n−1) Σ (r_t − μ̂)(r_t − μ̂)ᵀ (issue 2), by hand
        // on a 3 × 2 example: returns (1,2), (3,6), (5,7) → mean (3,5), cov [[4,5],[5,7]].
        Eigen::MatrixXd returns(3, 2);
        returns << 1, 2, 3, 6, 5, 7;
        const Eigen::VectorXd mean = sampleMean(returns);
        const Eigen::MatrixXd cov = sampleCovariance(returns);
        TW_CLOSE_REL(mean(0), 3.0, 1e-15);
        TW_CLOSE_REL(mean(1), 5.0, 1e-15);
        TW_CLOSE_REL(cov(0, 0), 4.0, 1e-14);
        TW_CLOSE_REL(cov(0, 1), 5.0, 1e-14);
        TW_CLOSE_REL(cov(1, 0), 5.0, 1e-14);
        TW_CLOSE_REL(cov(1, 1), 7.0, 1e-14);
        // The zero-mean model ignores the sample mean; the sample-mean model uses it.
        const Moments zero = estimateMoments(returns, CovarianceEstimator::Sample, 0.94, MeanModel::Zero);
        const Moments sample = estimateMoments(returns, CovarianceEstimator::Sample, 0.94, MeanModel::Sample);
        QCOMPARE(zero.mean.cwiseAbs().maxCoeff(), 0.0);
        TW_CLOSE_REL(sample.mean(1), 5.0, 1e-15);
    }

    void choleskyRoundTripOnRandomMatrices()
    {
        // A A^T + εI is positive definite: the check must say so, and its factor must rebuild it.
        std::mt19937 rng(7);
        for (int trial = 0; trial < 100; ++trial) {
            const Eigen::Index n = 1 + trial % 15;
            const Eigen::MatrixXd a = randomMatrix(rng, n, n, 1.0);
            const Eigen::MatrixXd m = a * a.transpose() + 1e-3 * Eigen::MatrixXd::Identity(n, n);
            QVERIFY2(isPositiveDefinite(m), qPrintable(QStringLiteral("trial %1").arg(trial)));
            const Eigen::LLT<Eigen::MatrixXd> llt(m);
            const Eigen::MatrixXd l = llt.matrixL();
            const double error = (l * l.transpose() - m).cwiseAbs().maxCoeff();
            TW_CLOSE_ABS_CTX(error, 0.0, 1e-12 * m.cwiseAbs().maxCoeff(), QStringLiteral("trial %1").arg(trial));
            // Clipping leaves a positive definite matrix as it is (to rounding).
            const Eigen::MatrixXd clipped = clipEigenvalues(m);
            TW_CLOSE_ABS_CTX((clipped - m).cwiseAbs().maxCoeff(), 0.0, 1e-12 * m.cwiseAbs().maxCoeff(),
                             QStringLiteral("trial %1").arg(trial));
        }
    }

    void nonPositiveDefiniteIsRepairedByClipping()
    {
        // Q diag(λ) Qᵀ with some negative eigenvalues is not positive definite; the check must
        // refuse it, and eigenvalue clipping (estimate.h) must give a symmetric matrix whose
        // eigenvalues are at least the floor, 1e-12 × the largest, keeping the positive ones.
        std::mt19937 rng(11);
        for (int trial = 0; trial < 100; ++trial) {
            const Eigen::Index n = 2 + trial % 10;
            const Eigen::HouseholderQR<Eigen::MatrixXd> qr(randomMatrix(rng, n, n, 1.0));
            const Eigen::MatrixXd q = qr.householderQ();
            Eigen::VectorXd values = randomMatrix(rng, n, 1, 1.0).cwiseAbs().array() + 0.1;
            values(0) = -values(0);             // at least one negative eigenvalue
            if (n > 3)
                values(1) = 0.0;                // and a zero one
            const Eigen::MatrixXd m = q * values.asDiagonal() * q.transpose();
            const QString where = QStringLiteral("trial %1, n=%2").arg(trial).arg(n);
            QVERIFY2(!isPositiveDefinite(m), qPrintable(where));

            const Eigen::MatrixXd repaired = clipEigenvalues(m);
            QVERIFY2(isPositiveDefinite(repaired), qPrintable(where));
            TW_CLOSE_ABS_CTX((repaired - repaired.transpose()).cwiseAbs().maxCoeff(), 0.0, 0.0, where);
            const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> solver(repaired);
            const double largest = values.maxCoeff();
            TW_CLOSE_ABS_CTX(solver.eigenvalues().maxCoeff(), largest, 1e-12 * largest, where);
            QVERIFY2(solver.eigenvalues().minCoeff() >= 1e-12 * largest * (1 - 1e-3) - 1e-14 * largest,
                     qPrintable(QStringLiteral("%1: lowest eigenvalue %2 below the floor %3")
                                    .arg(where).arg(solver.eigenvalues().minCoeff()).arg(1e-12 * largest)));
        }
    }

    void estimateMomentsRepairsWithAWarning()
    {
        // A column of zero returns next to others makes the sample covariance singular (an
        // exact zero pivot): the estimate must repair it, say so, and still give a finite VaR.
        std::mt19937 rng(3);
        Eigen::MatrixXd returns = randomMatrix(rng, 30, 3, 0.01);
        returns.col(1).setZero();
        const Moments m = estimateMoments(returns, CovarianceEstimator::Sample, 0.94, MeanModel::Zero);
        QVERIFY(m.repaired);
        QCOMPARE(m.warnings.size(), std::size_t(1));
        QVERIFY2(m.warnings[0].find("not positive definite") != std::string::npos, m.warnings[0].c_str());
        const Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> solver(m.covariance);
        QVERIFY2(solver.eigenvalues().minCoeff() > 0.0, "the repaired covariance is not positive definite");
        Eigen::VectorXd e(3);
        e << 1e5, 2e5, -5e4;
        const Contributions c = normalContributions(e, m.covariance, m.mean, 1, 0.99);
        QVERIFY(std::isfinite(c.componentVar.sum()));

        // Every return zero: nothing to repair, a warning, zero risk.
        const Moments z = estimateMoments(Eigen::MatrixXd::Zero(10, 2), CovarianceEstimator::Ewma, 0.94, MeanModel::Zero);
        QVERIFY(!z.repaired);
        QCOMPARE(z.warnings.size(), std::size_t(1));
        QCOMPARE(z.covariance.cwiseAbs().maxCoeff(), 0.0);
    }

    void zeroRiskPortfolioIsFiniteWithWarnings()
    {
        // σ_p = 0 (a holding of zero quantity only): every figure finite, no share of zero value.
        Holdings none{Holding{"DAX", 0.0, std::nullopt, std::nullopt}};
        auto r = risk(none, Assumptions{});
        QVERIFY(r.ok());
        QCOMPARE(r.value().figures.var, 0.0);
        QVERIFY(!r.value().varFraction.has_value());
        QVERIFY(!r.value().holdings[0].componentShare.has_value());
        QVERIFY(std::isfinite(r.value().holdings[0].marginalVar));
        QVERIFY(!r.value().warnings.empty());
    }
};

QTEST_GUILESS_MAIN(TestIdentities)
#include "test_identities.moc"

// The normal model against published values: quantiles and densities, ES factors, the
// square-root-of-time rule, and the invented portfolio scenarios of REFERENCE-VALUES.md §10.
// Each check names its source; "REF §n" is the section of ../shared/REFERENCE-VALUES.md.
// Table values are compared to half a unit in their last printed digit (TW_CLOSE_PRINTED).
#include "closeness.h"

#include "tailwise/contributions.h"
#include "tailwise/grid.h"
#include "tailwise/parametric.h"
#include "tailwise/risk.h"

#include <Eigen/Core>

#include <QTest>

#include <cmath>

using namespace tailwise;

namespace {

// φ(Φ⁻¹(p)) from the core's ES factor, which is φ(z)/(1−p).
double densityAtQuantile(double p) { return normalTailMeanFactor(p) * (1.0 - p); }

// Σ = diag(σ) R diag(σ) from daily volatilities and a correlation matrix.
Eigen::MatrixXd covarianceFrom(const Eigen::VectorXd &vols, const Eigen::MatrixXd &correlation)
{
    return vols.asDiagonal() * correlation * vols.asDiagonal();
}

HorizonMoments oneDayMoments(const Eigen::VectorXd &x, const Eigen::MatrixXd &cov, const Eigen::VectorXd &mean)
{
    return HorizonMoments{x.dot(mean), std::sqrt(x.dot(cov * x))};
}

Assumptions singleAssumptions(int horizon, int daysPerYear)
{
    Assumptions a;
    a.confidence = 0.99;
    a.horizonDays = horizon;
    a.daysPerYear = daysPerYear;
    return a;
}

} // namespace

class TestReferenceValues : public QObject {
    Q_OBJECT

private slots:
    void normalQuantiles()
    {
        // A&S (1964) Table 26.5 (mem), 5 decimals; then the SciPy check norm.ppf, 10 digits (REF §1).
        TW_CLOSE_PRINTED(normalQuantile(0.9), 1.28155);
        TW_CLOSE_PRINTED(normalQuantile(0.95), 1.64485);
        TW_CLOSE_PRINTED(normalQuantile(0.975), 1.95996);
        TW_CLOSE_PRINTED(normalQuantile(0.99), 2.32635);
        TW_CLOSE_PRINTED(normalQuantile(0.995), 2.57583);
        TW_CLOSE_PRINTED(normalQuantile(0.999), 3.09023);
        TW_CLOSE_PRINTED(normalQuantile(0.9), 1.281551566);   // SciPy norm.ppf(0.9)
        TW_CLOSE_PRINTED(normalQuantile(0.95), 1.644853627);  // SciPy norm.ppf(0.95)
        TW_CLOSE_PRINTED(normalQuantile(0.975), 1.959963985); // SciPy norm.ppf(0.975)
        TW_CLOSE_PRINTED(normalQuantile(0.99), 2.326347874);  // SciPy norm.ppf(0.99)
        TW_CLOSE_PRINTED(normalQuantile(0.995), 2.575829304); // SciPy norm.ppf(0.995)
        TW_CLOSE_PRINTED(normalQuantile(0.999), 3.090232306); // SciPy norm.ppf(0.999)
    }

    void normalQuantileLowerTailIsSymmetric()
    {
        // Φ⁻¹(1−p) = −Φ⁻¹(p), A&S 26.2 (symmetry of the normal); values from A&S Table 26.5 (mem).
        TW_CLOSE_PRINTED(normalQuantile(0.01), -2.32635);
        TW_CLOSE_PRINTED(normalQuantile(0.05), -1.64485);
        TW_CLOSE_PRINTED(normalQuantile(0.001), -3.09023);
        TW_CLOSE_REL(normalQuantile(0.5) + 1.0, 1.0, 1e-15); // the median is 0
    }

    void normalDensities()
    {
        // φ(Φ⁻¹(p)): A&S (1964) 26.2.1 (mem), then the SciPy check norm.pdf(norm.ppf(p)) (REF §1).
        TW_CLOSE_PRINTED(densityAtQuantile(0.9), 0.175498);
        TW_CLOSE_PRINTED(densityAtQuantile(0.95), 0.103136);
        TW_CLOSE_PRINTED(densityAtQuantile(0.975), 0.0584451);
        TW_CLOSE_PRINTED(densityAtQuantile(0.99), 0.0266521);
        TW_CLOSE_PRINTED(densityAtQuantile(0.995), 0.0144597);
        TW_CLOSE_PRINTED(densityAtQuantile(0.999), 0.00336709);
        TW_CLOSE_PRINTED(densityAtQuantile(0.9), 0.1754983319);    // SciPy
        TW_CLOSE_PRINTED(densityAtQuantile(0.95), 0.1031356404);   // SciPy
        TW_CLOSE_PRINTED(densityAtQuantile(0.975), 0.05844506981); // SciPy
        TW_CLOSE_PRINTED(densityAtQuantile(0.99), 0.0266521422);   // SciPy
        TW_CLOSE_PRINTED(densityAtQuantile(0.995), 0.01445974303); // SciPy
        TW_CLOSE_PRINTED(densityAtQuantile(0.999), 0.003367090077); // SciPy
    }

    void normalEsFactors()
    {
        // φ(Φ⁻¹(α))/α: MFE (2005) Ch. 2, normal ES (mem); then SciPy norm.pdf(norm.ppf(α))/α, which
        // REF §2 also confirms by quadrature of x·φ(x) over the tail.
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.9), 1.75498);
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.95), 2.06271);
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.975), 2.33780);
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.99), 2.66521);
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.999), 3.36709);
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.9), 1.754983319);   // SciPy
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.95), 2.062712808);  // SciPy
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.975), 2.337802792); // SciPy
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.99), 2.66521422);   // SciPy
        TW_CLOSE_PRINTED(normalTailMeanFactor(0.999), 3.367090077); // SciPy
    }

    void es975IsCloseToButAboveVar99()
    {
        // Common practice (REF §2, the rationale of the 97.5% ES level, mem): for the normal,
        // ES at 97.5% ≈ VaR at 99%. Assert the difference and the ratio, not equality.
        const double es975 = normalTailMeanFactor(0.975);
        const double var99 = normalQuantile(0.99);
        TW_CLOSE_PRINTED(es975 - var99, 0.0114549);
        TW_CLOSE_PRINTED(es975 / var99, 1.00492);
        // Through normalVarEs with σ = 1, μ = 0 the same factors come out as money.
        const VarEs at975 = normalVarEs(HorizonMoments{0.0, 1.0}, 0.975);
        const VarEs at99 = normalVarEs(HorizonMoments{0.0, 1.0}, 0.99);
        TW_CLOSE_PRINTED(at975.es - at99.var, 0.0114549);
    }

    void squareRootOfTimeSinglePosition()
    {
        // REF §9, common practice: V = 1,000,000, annual vol 20%, zero drift, 99%.
        const SinglePosition position{1'000'000.0, 0.20, 0.0};
        auto oneDay = computeSinglePositionRisk(position, singleAssumptions(1, 252));
        QVERIFY2(oneDay.ok(), oneDay.ok() ? "" : oneDay.error().message.c_str());
        TW_CLOSE_PRINTED(oneDay.value().figures.var, 29309.2);     // REF §9 1-day 99% VaR, N=252
        TW_CLOSE_PRINTED(oneDay.value().figures.var, 29309.22827); // SciPy check
        TW_CLOSE_PRINTED(oneDay.value().oneDay.sd / 1e6, 0.0125988); // daily sd 0.20/√252
        TW_CLOSE_PRINTED(oneDay.value().horizon.mean, 0.0);

        auto tenDay = computeSinglePositionRisk(position, singleAssumptions(10, 252));
        QVERIFY(tenDay.ok());
        TW_CLOSE_PRINTED(tenDay.value().figures.var, 92683.9);     // REF §9 10-day 99% VaR
        TW_CLOSE_PRINTED(tenDay.value().figures.var, 92683.91781); // SciPy check
        TW_CLOSE_PRINTED(tenDay.value().figures.var / oneDay.value().figures.var, 3.16228); // √10

        auto n250 = computeSinglePositionRisk(position, singleAssumptions(1, 250));
        QVERIFY(n250.ok());
        TW_CLOSE_PRINTED(n250.value().figures.var, 29426.2);     // REF §9, N=250
        TW_CLOSE_PRINTED(n250.value().figures.var, 29426.23165); // SciPy check
        TW_CLOSE_PRINTED(n250.value().oneDay.sd / 1e6, 0.0126491); // daily sd 0.20/√250

        // ES of the same position: σ_h·φ(z)/(1−C) = 0.20/√252·1e6·2.66521422 (REF §2 × §9 inputs).
        TW_CLOSE_REL(oneDay.value().figures.es, 0.20 / std::sqrt(252.0) * 1e6 * 2.66521422, 1e-9);
    }

    void singlePositionDrift()
    {
        // μ_h = M·H/N·V (issue 2; common practice). V = 1e6, M = 10%, H = 10, N = 252:
        // μ_h = 1e6·0.1·10/252 = 3968.253968…, VaR = 92683.91781 − 3968.25397 (REF §9 value).
        Assumptions a = singleAssumptions(10, 252);
        auto r = computeSinglePositionRisk(SinglePosition{1'000'000.0, 0.20, 0.10}, a);
        QVERIFY(r.ok());
        TW_CLOSE_REL(r.value().horizon.mean, 1e6 * 0.1 * 10.0 / 252.0, 1e-12);
        TW_CLOSE_PRINTED(r.value().figures.var, 88715.66384);
        // A short position of the same size has the same spread and the opposite drift.
        auto s = computeSinglePositionRisk(SinglePosition{-1'000'000.0, 0.20, 0.10}, a);
        QVERIFY(s.ok());
        TW_CLOSE_REL(s.value().horizon.sd, r.value().horizon.sd, 1e-15);
        TW_CLOSE_PRINTED(s.value().figures.var, 96652.17178); // 92683.91781 + 3968.25397
    }

    void gridMatchesSquareRootOfTime()
    {
        // REF §9 through the horizon × confidence grid: σ_1 = 1e6·0.20/√252, μ = 0.
        const RiskGrid grid = normalRiskGrid(HorizonMoments{0.0, 1e6 * 0.20 / std::sqrt(252.0)}, {1, 10}, {0.95, 0.99});
        QCOMPARE(grid.var.size(), std::size_t(4));
        TW_CLOSE_PRINTED(grid.varAt(0, 1), 29309.22827);
        TW_CLOSE_PRINTED(grid.varAt(1, 1), 92683.91781);
        // 95%: z = 1.644853627 (SciPy, REF §1) × σ_1.
        TW_CLOSE_REL(grid.varAt(0, 0), 1.644853627 * 1e6 * 0.20 / std::sqrt(252.0), 1e-9);
        TW_CLOSE_REL(grid.esAt(1, 1), 2.66521422 * std::sqrt(10.0) * 1e6 * 0.20 / std::sqrt(252.0), 1e-9);
    }

    void twoAssetScenario()
    {
        // REF §10 "Two-asset" (invented inputs, NumPy results; Jorion VaR tools / MFE Ch. 6 Euler
        // allocation, mem). Money to the cent, ratios to their printed digits.
        Eigen::VectorXd x(2), vols(2), mu(2);
        x << 600000, 400000;
        vols << 0.02, 0.01;
        mu << 0.0005, 0.0002;
        Eigen::MatrixXd corr(2, 2);
        corr << 1.0, 0.3, 0.3, 1.0;
        const Eigen::MatrixXd cov = covarianceFrom(vols, corr);
        const Eigen::VectorXd zero = Eigen::VectorXd::Zero(2);

        const HorizonMoments withMean = oneDayMoments(x, cov, mu);
        const HorizonMoments noMean = oneDayMoments(x, cov, zero);
        TW_CLOSE_PRINTED(noMean.sd / x.sum(), 0.01374045123);   // σ_p, np.sqrt(w@S@w)
        TW_CLOSE_PRINTED(noMean.sd, 13740.45123);               // σ_p·V, np.sqrt(x@S@x)
        TW_CLOSE_PRINTED(withMean.mean / x.sum(), 0.00038);     // μ_p
        const VarEs f0 = normalVarEs(noMean, 0.99);
        const VarEs fm = normalVarEs(withMean, 0.99);
        TW_CLOSE_PRINTED(f0.var, 31965.06951);  // VaR (μ = 0)
        TW_CLOSE_PRINTED(fm.var, 31585.06951);  // VaR (with μ)
        TW_CLOSE_PRINTED(f0.es, 36621.24601);   // ES 99% (μ = 0)
        TW_CLOSE_PRINTED(fm.es, 36241.25);      // ES 99% (with μ)

        const Contributions c = normalContributions(x, cov, zero, 1, 0.99);
        TW_CLOSE_PRINTED(c.undiversifiedVar, 37221.56598);      // Σ z·σ_i·x_i
        // 37221.56598 − 31965.06951: the difference of two values each good to ±5e-6.
        TW_CLOSE_ABS(c.diversificationBenefit, 5256.49647, 1e-5);
        TW_CLOSE_PRINTED(c.marginalVar(0), 0.0446969);          // MVaR_1
        TW_CLOSE_PRINTED(c.componentVar(0), 26818.15);          // CVaR_1
        TW_CLOSE_PRINTED(c.componentEs(0), 30724.60);           // CES_1
        TW_CLOSE_PRINTED(c.componentVar(0) / f0.var, 0.838983); // CVaR share 1
        TW_CLOSE_PRINTED(c.marginalVar(1), 0.0128673);          // MVaR_2
        TW_CLOSE_PRINTED(c.componentVar(1), 5146.92);           // CVaR_2
        TW_CLOSE_PRINTED(c.componentEs(1), 5896.64);            // CES_2
        TW_CLOSE_PRINTED(c.componentVar(1) / f0.var, 0.161017); // CVaR share 2
        // Euler identity, REF §10: ΣCVaR_i = VaR at 1e-8 relative; likewise for ES.
        TW_CLOSE_REL(c.componentVar.sum(), 31965.06951, 1e-8);
        TW_CLOSE_REL(c.componentVar.sum(), f0.var, 1e-12);
        TW_CLOSE_REL(c.componentEs.sum(), f0.es, 1e-12);
        TW_CLOSE_REL(x.dot(c.marginalVar), f0.var, 1e-12);
        // With the mean the components still add up to the VaR with μ (the −Hμ_i e_i terms sum
        // to −μ_h).
        const Contributions cm = normalContributions(x, cov, mu, 1, 0.99);
        TW_CLOSE_REL(cm.componentVar.sum(), fm.var, 1e-12);
        TW_CLOSE_REL(cm.componentEs.sum(), fm.es, 1e-12);

        // Incremental VaR of adding 100,000 to asset 2: exact 1,343.16 (new VaR 33,308.23), first
        // order MVaRᵀa = 1286.729493 (REF §10).
        Eigen::VectorXd trade(2);
        trade << 0, 100000;
        const double newVar = normalVarEs(oneDayMoments(x + trade, cov, zero), 0.99).var;
        TW_CLOSE_PRINTED(newVar, 33308.23);
        TW_CLOSE_PRINTED(newVar - f0.var, 1343.16);
        TW_CLOSE_PRINTED(c.marginalVar.dot(trade), 1286.729493);
    }

    void threeAssetScenario()
    {
        // REF §10 "Three-asset" (invented inputs, NumPy results; Jorion / MFE Ch. 6, mem).
        Eigen::VectorXd x(3), vols(3), mu(3);
        x << 500000, 300000, 200000;
        vols << 0.015, 0.025, 0.008;
        mu << 0.0004, 0.0006, 0.0001;
        Eigen::MatrixXd corr(3, 3);
        corr << 1.0, 0.4, 0.1, 0.4, 1.0, -0.2, 0.1, -0.2, 1.0;
        const Eigen::MatrixXd cov = covarianceFrom(vols, corr);
        const Eigen::VectorXd zero = Eigen::VectorXd::Zero(3);

        const HorizonMoments withMean = oneDayMoments(x, cov, mu);
        const HorizonMoments noMean = oneDayMoments(x, cov, zero);
        TW_CLOSE_PRINTED(noMean.sd / x.sum(), 0.01255627333); // σ_p
        TW_CLOSE_PRINTED(noMean.sd, 12556.27333);             // σ_p·V
        TW_CLOSE_PRINTED(withMean.mean / x.sum(), 0.0004);    // μ_p
        const VarEs f0 = normalVarEs(noMean, 0.99);
        const VarEs fm = normalVarEs(withMean, 0.99);
        TW_CLOSE_PRINTED(f0.var, 29210.25977); // VaR (μ = 0)
        TW_CLOSE_PRINTED(fm.var, 28810.25977); // VaR (with μ)
        TW_CLOSE_PRINTED(f0.es, 33465.15824);  // ES (μ = 0)
        TW_CLOSE_PRINTED(fm.es, 33065.16);     // ES (with μ)

        const Contributions c = normalContributions(x, cov, zero, 1, 0.99);
        TW_CLOSE_PRINTED(c.undiversifiedVar, 38617.37471);
        TW_CLOSE_PRINTED(c.marginalVar(0), 0.0296253);
        TW_CLOSE_PRINTED(c.componentVar(0), 14812.64);
        TW_CLOSE_PRINTED(c.componentEs(0), 16970.31);
        TW_CLOSE_PRINTED(c.componentVar(0) / f0.var, 0.507104);
        TW_CLOSE_PRINTED(c.marginalVar(1), 0.0471522);
        TW_CLOSE_PRINTED(c.componentVar(1), 14145.65);
        TW_CLOSE_PRINTED(c.componentEs(1), 16206.17);
        TW_CLOSE_PRINTED(c.componentVar(1) / f0.var, 0.484270);
        TW_CLOSE_PRINTED(c.marginalVar(2), 0.00125986);
        TW_CLOSE_PRINTED(c.componentVar(2), 251.97);
        TW_CLOSE_PRINTED(c.componentEs(2), 288.68);
        TW_CLOSE_PRINTED(c.componentVar(2) / f0.var, 0.00862616);
        TW_CLOSE_REL(c.componentVar.sum(), 29210.25977, 1e-8); // Euler identity, REF §10
        TW_CLOSE_REL(x.dot(c.marginalVar), f0.var, 1e-12);
        TW_CLOSE_REL(c.componentEs.sum(), f0.es, 1e-12);
        const Contributions cm = normalContributions(x, cov, mu, 1, 0.99);
        TW_CLOSE_REL(cm.componentVar.sum(), fm.var, 1e-12);

        // Incremental VaR of adding 50,000 to asset 3: 77.71 (new VaR 29,287.97); first order
        // 62.99307575 (REF §10).
        Eigen::VectorXd trade(3);
        trade << 0, 0, 50000;
        const double newVar = normalVarEs(oneDayMoments(x + trade, cov, zero), 0.99).var;
        TW_CLOSE_PRINTED(newVar, 29287.97);
        TW_CLOSE_PRINTED(newVar - f0.var, 77.71);
        TW_CLOSE_PRINTED(c.marginalVar.dot(trade), 62.99307575);
    }

    void horizonScalesContributions()
    {
        // The contributions follow square-root-of-time (common practice): at H = 10 with μ = 0,
        // each component is √10 times its one-day value (Two-asset inputs, REF §10).
        Eigen::VectorXd x(2), vols(2);
        x << 600000, 400000;
        vols << 0.02, 0.01;
        Eigen::MatrixXd corr(2, 2);
        corr << 1.0, 0.3, 0.3, 1.0;
        const Eigen::MatrixXd cov = covarianceFrom(vols, corr);
        const Eigen::VectorXd zero = Eigen::VectorXd::Zero(2);
        const Contributions one = normalContributions(x, cov, zero, 1, 0.99);
        const Contributions ten = normalContributions(x, cov, zero, 10, 0.99);
        TW_CLOSE_PRINTED(ten.componentVar(0), 84806.44149); // NumPy: z·√10·x_1(Σx)_1/√(xᵀΣx)
        TW_CLOSE_REL(ten.componentVar(1), std::sqrt(10.0) * one.componentVar(1), 1e-13);
        TW_CLOSE_REL(ten.undiversifiedVar, std::sqrt(10.0) * 37221.56598, 1e-9);
    }
};

QTEST_GUILESS_MAIN(TestReferenceValues)
#include "test_reference_values.moc"

// The model-comparison rows and the model densities for the loss-tail chart.
#include "closeness.h"

#include "tailwise/comparison.h"
#include "tailwise/modeldensity.h"
#include "tailwise/prices.h"
#include "tailwise/studentt.h"

#include <QTest>

#include <boost/math/distributions/normal.hpp>

#include <cmath>
#include <numbers>
#include <stop_token>
#include <vector>

using namespace tailwise;

namespace {

PriceHistory euPrices()
{
    auto prices = readPriceCsv(TAILWISE_TEST_DATA_DIR "/eu-stock-indices-1991-1998.csv");
    Q_ASSERT(prices.ok());
    return prices.value();
}

Holdings euHoldings()
{
    return {Holding{std::string("DAX"), 100.0, std::nullopt, std::nullopt},
            Holding{std::string("SMI"), -40.0, std::nullopt, std::nullopt},
            Holding{std::string("FTSE"), 60.0, std::nullopt, std::nullopt}};
}

// Trapezoid rule over an even grid (common practice).
double integrate(const std::vector<double> &x, const std::vector<double> &f)
{
    double sum = 0.0;
    for (std::size_t i = 1; i < x.size(); ++i)
        sum += 0.5 * (f[i] + f[i - 1]) * (x[i] - x[i - 1]);
    return sum;
}

std::vector<double> grid(double from, double to, int n)
{
    std::vector<double> x(static_cast<std::size_t>(n));
    for (int i = 0; i < n; ++i)
        x[static_cast<std::size_t>(i)] = from + (to - from) * i / (n - 1);
    return x;
}

} // namespace

class TestComparison : public QObject {
    Q_OBJECT

private slots:
    void everyModelGivesARow()
    {
        const PriceHistory prices = euPrices();
        Assumptions a;
        a.simulations = 20000;
        a.window = 1000;
        std::vector<double> progress;
        RunControl control;
        control.progress = [&](double f) { progress.push_back(f); };
        auto rows = compareModels(prices, euHoldings(), a, control);
        QVERIFY(rows.ok());
        QCOMPARE(rows.value().size(), std::size_t{5});
        for (const ModelRow &row : rows.value()) {
            const QString ctx = QString::fromUtf8(toName(row.model).data(), int(toName(row.model).size()));
            QVERIFY2(row.figures, qPrintable(ctx));
            QVERIFY2(std::isfinite(row.figures->var) && std::isfinite(row.figures->es), qPrintable(ctx));
            QVERIFY2(row.figures->es >= row.figures->var, qPrintable(ctx));
            // Each row is computeRisk with that model (comparison.h).
            Assumptions one = a;
            one.model = row.model;
            auto direct = computeRisk(prices, euHoldings(), one);
            TW_CLOSE_REL_CTX(row.figures->var, direct.value().figures.var, 1e-13, ctx);
            QCOMPARE(row.used, row.model);
        }
        QVERIFY(rows.value()[4].varStandardError.has_value());
        for (std::size_t i = 1; i < progress.size(); ++i)
            QVERIFY(progress[i] >= progress[i - 1]);
        QCOMPARE(progress.back(), 1.0);
    }

    void aFailingModelKeepsTheOthers()
    {
        const PriceHistory prices = euPrices();
        Assumptions a;
        a.window = 20;
        a.horizonDays = 30; // overlapping 30-day sums need 31 returns: the historical row fails
        a.historicalHorizon = HistoricalHorizon::Overlapping;
        a.simulations = 2000;
        auto rows = compareModels(prices, euHoldings(), a);
        QVERIFY(rows.ok());
        QVERIFY(!rows.value()[3].figures);
        QVERIFY(rows.value()[3].error.find("31 daily returns") != std::string::npos);
        QVERIFY(rows.value()[0].figures && rows.value()[4].figures);
    }

    void cancelledComparison()
    {
        std::stop_source source;
        source.request_stop();
        RunControl control;
        control.stop = source.get_token();
        auto rows = compareModels(euPrices(), euHoldings(), Assumptions{}, control);
        QVERIFY(!rows.ok());
        QCOMPARE(rows.error().kind, ErrorKind::Cancelled);
    }

    void densitiesIntegrateToOne_data()
    {
        QTest::addColumn<int>("model");
        QTest::newRow("normal") << int(RiskModel::Normal);
        QTest::newRow("student-t") << int(RiskModel::StudentT);
        QTest::newRow("cornish-fisher") << int(RiskModel::CornishFisher);
    }
    void densitiesIntegrateToOne()
    {
        QFETCH(int, model);
        Assumptions a;
        a.model = static_cast<RiskModel>(model);
        a.dof = DegreesOfFreedom::given(6.0);
        auto r = computeRisk(euPrices(), euHoldings(), a);
        QVERIFY(r.ok());
        const double mu = r.value().horizon.mean, sd = r.value().horizon.sd;
        const std::vector<double> x = grid(mu - 40.0 * sd, mu + 40.0 * sd, 40001);
        const auto f = modelPnlDensity(r.value(), x);
        QVERIFY(f);
        TW_CLOSE_ABS(integrate(x, *f), 1.0, 1e-5);
        // Mass beyond −VaR is 1 − C (the density and the VaR are the same model).
        std::vector<double> tailX, tailF;
        for (std::size_t i = 0; i < x.size(); ++i)
            if (x[i] <= -r.value().figures.var) {
                tailX.push_back(x[i]);
                tailF.push_back((*f)[i]);
            }
        TW_CLOSE_ABS(integrate(tailX, tailF), 0.01, 2e-4);
    }

    void densityShapesAgree()
    {
        // Student-t: f(x) = f_ν(u/s)/(s σ) (studentt.h); at x = μ, f_ν(0) = Γ((ν+1)/2)/(√(νπ) Γ(ν/2)).
        Assumptions a;
        a.model = RiskModel::StudentT;
        a.dof = DegreesOfFreedom::given(4.0);
        auto r = computeRisk(euPrices(), euHoldings(), a);
        const double mu = r.value().horizon.mean, sd = r.value().horizon.sd;
        const std::vector<double> at = {mu};
        const double f0 = std::tgamma(2.5) / (std::sqrt(4.0 * std::numbers::pi) * std::tgamma(2.0)); // 0.375 for ν = 4
        TW_CLOSE_REL((*modelPnlDensity(r.value(), at))[0], f0 / (studentTScale(4.0) * sd), 1e-12);
        // Historical and Monte Carlo have no closed density.
        a.model = RiskModel::Historical;
        QVERIFY(!modelPnlDensity(computeRisk(euPrices(), euHoldings(), a).value(), at));
    }
};

QTEST_GUILESS_MAIN(TestComparison)
#include "test_comparison.moc"

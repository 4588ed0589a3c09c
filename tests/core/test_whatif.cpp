// What-if trades (incremental VaR vs the marginal estimate) and stress scenarios.
// Published/invented values: REFERENCE-VALUES §10 (invented portfolios, NumPy); real data:
// tests/data/eu-stock-indices-1991-1998.csv with the NumPy fixture eu-models-fixture.json.
#include "closeness.h"

#include "tailwise/contributions.h"
#include "tailwise/parametric.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"
#include "tailwise/stress.h"
#include "tailwise/whatif.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTest>

#include <cmath>

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

// Normal VaR (μ = 0) at 99% and its Euler marginals, from exposures and covariance.
double normalVar(const Eigen::VectorXd &e, const Eigen::MatrixXd &cov)
{
    return normalVarEs(HorizonMoments{0.0, std::sqrt(e.dot(cov * e))}, 0.99).var;
}

} // namespace

class TestWhatIf : public QObject {
    Q_OBJECT

private slots:
    void incrementalVarOfTheInventedPortfolios_data()
    {
        QTest::addColumn<int>("which");
        QTest::addColumn<double>("incremental");
        QTest::addColumn<double>("varAfter");
        QTest::addColumn<double>("firstOrder");
        // REFERENCE-VALUES §10 (invented, NumPy): incremental VaR, new VaR, first-order MVaRᵀa.
        QTest::newRow("two-asset, +100,000 in asset 2") << 2 << 1343.16 << 33308.23 << 1286.729493;
        QTest::newRow("three-asset, +50,000 in asset 3") << 3 << 77.71 << 29287.97 << 62.99307575;
    }
    void incrementalVarOfTheInventedPortfolios()
    {
        QFETCH(int, which);
        QFETCH(double, incremental);
        QFETCH(double, varAfter);
        QFETCH(double, firstOrder);
        Eigen::VectorXd e, vols, a;
        Eigen::MatrixXd corr;
        if (which == 2) {
            e = Eigen::Vector2d(600000, 400000);
            vols = Eigen::Vector2d(0.02, 0.01);
            corr = Eigen::Matrix2d{{1.0, 0.3}, {0.3, 1.0}};
            a = Eigen::Vector2d(0, 100000);
        } else {
            e = Eigen::Vector3d(500000, 300000, 200000);
            vols = Eigen::Vector3d(0.015, 0.025, 0.008);
            corr = Eigen::Matrix3d{{1.0, 0.4, 0.1}, {0.4, 1.0, -0.2}, {0.1, -0.2, 1.0}};
            a = Eigen::Vector3d(0, 0, 50000);
        }
        const Eigen::MatrixXd cov = vols.asDiagonal() * corr * vols.asDiagonal();
        const Eigen::VectorXd zero = Eigen::VectorXd::Zero(e.size());
        const Contributions c = normalContributions(e, cov, zero, 1, 0.99);
        const WhatIfFigures f = whatIfFigures(normalVar(e, cov), normalVar(e + a, cov), c.marginalVar, a);
        TW_CLOSE_ABS(f.incrementalVar, incremental, 0.005); // money rounded to cents in §10
        TW_CLOSE_ABS(f.varAfter, varAfter, 0.005);
        TW_CLOSE_REL(f.marginalEstimate, firstOrder, 1e-8);
        TW_CLOSE_REL(f.estimateGap, f.incrementalVar - f.marginalEstimate, 1e-12);
    }

    void smallTradeAgreesToFirstOrder_data()
    {
        QTest::addColumn<int>("model");
        QTest::newRow("normal") << int(RiskModel::Normal);
        QTest::newRow("student-t fit") << int(RiskModel::StudentT);
        QTest::newRow("cornish-fisher") << int(RiskModel::CornishFisher);
        QTest::newRow("historical") << int(RiskModel::Historical);
        QTest::newRow("monte-carlo") << int(RiskModel::MonteCarlo);
    }
    void smallTradeAgreesToFirstOrder()
    {
        // First order (Jorion, "VaR tools"): incremental − marginal = O(|Δe|²); halving the trade
        // must shrink the relative gap, and a trade of 0.1% of a holding keeps it small.
        QFETCH(int, model);
        const PriceHistory prices = euPrices();
        Assumptions a;
        a.model = static_cast<RiskModel>(model);
        a.simulations = 20000;
        const std::vector<Trade> small = {{"DAX", 0.1}};
        auto w = whatIf(prices, euHoldings(), a, small);
        QVERIFY2(w.ok(), w.ok() ? "" : w.error().message.c_str());
        const WhatIfFigures &f = w.value().figures;
        QVERIFY(f.marginalEstimate != 0.0);
        const double gap = std::abs(f.incrementalVar - f.marginalEstimate) / std::abs(f.marginalEstimate);
        QVERIFY2(gap < 0.02, qPrintable(QStringLiteral("incremental %1 marginal %2 gap %3")
                                            .arg(f.incrementalVar, 0, 'g', 12)
                                            .arg(f.marginalEstimate, 0, 'g', 12)
                                            .arg(gap)));
        TW_CLOSE_REL(f.varBefore + f.incrementalVar, f.varAfter, 1e-12);
        if (a.model == RiskModel::Normal) {
            // Smooth model: the gap falls like the trade size (second-order remainder).
            const std::vector<Trade> half = {{"DAX", 0.05}};
            auto w2 = whatIf(prices, euHoldings(), a, half);
            const WhatIfFigures &g = w2.value().figures;
            const double gap2 = std::abs(g.incrementalVar - g.marginalEstimate) / std::abs(g.marginalEstimate);
            QVERIFY2(gap2 < 0.6 * gap, qPrintable(QStringLiteral("gap %1 then %2").arg(gap).arg(gap2)));
        }
    }

    void closingAPositionGivesTheVarWithoutIt_data()
    {
        QTest::addColumn<int>("model");
        QTest::newRow("normal") << int(RiskModel::Normal);
        QTest::newRow("student-t fit") << int(RiskModel::StudentT);
        QTest::newRow("cornish-fisher") << int(RiskModel::CornishFisher);
        QTest::newRow("historical") << int(RiskModel::Historical);
    }
    void closingAPositionGivesTheVarWithoutIt()
    {
        QFETCH(int, model);
        const PriceHistory prices = euPrices();
        Assumptions a;
        a.model = static_cast<RiskModel>(model);
        a.horizonDays = 10;
        const std::vector<Trade> close = {{"SMI", 40}};
        auto w = whatIf(prices, euHoldings(), a, close);
        QVERIFY(w.ok());
        Holdings without = euHoldings();
        without.erase(without.begin() + 1);
        auto direct = computeRisk(prices, without, a);
        QVERIFY(direct.ok());
        TW_CLOSE_REL(w.value().figures.varAfter, direct.value().figures.var, 1e-10);
        QCOMPARE(w.value().holdingsAfter[1].quantity, 0.0);
        auto before = computeRisk(prices, euHoldings(), a);
        TW_CLOSE_REL(w.value().figures.varBefore, before.value().figures.var, 1e-12);
    }

    void newAssetAndRefusals()
    {
        const PriceHistory prices = euPrices();
        const Assumptions a;
        const std::vector<Trade> add = {{"CAC", 25}, {"CAC", 5}};
        auto w = whatIf(prices, euHoldings(), a, add);
        QVERIFY(w.ok());
        QCOMPARE(w.value().holdingsAfter.size(), std::size_t{4});
        QCOMPARE(w.value().holdingsAfter[3].quantity, 30.0);
        QCOMPARE(w.value().before.holdings.size(), std::size_t{4}); // CAC at zero before
        QCOMPARE(w.value().before.holdings[3].exposure, 0.0);
        const double cacPrice = prices.prices(prices.dayCount() - 1, prices.assetIndex("CAC"));
        TW_CLOSE_REL(w.value().exposureChange(3), 30.0 * cacPrice, 1e-14);

        // Monte Carlo what-if: progress over its four runs never goes back, and ends at 1.
        Assumptions mc;
        mc.model = RiskModel::MonteCarlo;
        mc.simulations = 20000;
        std::vector<double> seen;
        RunControl control;
        control.progress = [&](double f) { seen.push_back(f); };
        QVERIFY(whatIf(prices, euHoldings(), mc, add, control).ok());
        for (std::size_t i = 1; i < seen.size(); ++i)
            QVERIFY2(seen[i] >= seen[i - 1], qPrintable(QStringLiteral("%1 then %2").arg(seen[i - 1]).arg(seen[i])));
        QCOMPARE(seen.back(), 1.0);

        const std::vector<Trade> unknown = {{"NIKKEI", 1}};
        auto bad = whatIf(prices, euHoldings(), a, unknown);
        QVERIFY(!bad.ok());
        QCOMPARE(bad.error().field, std::string("trade"));
        QVERIFY(bad.error().message.find("NIKKEI") != std::string::npos);
    }

    void scenarioFileAndPnl()
    {
        const PriceHistory prices = euPrices();
        auto s = parseScenarioCsv("asset,shock\nDAX,-0.2\nFTSE,0.05\n", "crash.csv", "crash", &prices);
        QVERIFY(s.ok());
        const Holdings h = euHoldings();
        const double dax = h[0].quantity * prices.prices(prices.dayCount() - 1, prices.assetIndex("DAX"));
        const double ftse = h[2].quantity * prices.prices(prices.dayCount() - 1, prices.assetIndex("FTSE"));
        // P&L = Σ e_i s_i (stress.h; SMI has no shock).
        TW_CLOSE_REL(scenarioPnl(s.value(), prices, h), -0.2 * dax + 0.05 * ftse, 1e-14);
        auto all = runStress(prices, h, Assumptions{}, {s.value()}, 5);
        QVERIFY(all.ok());
        QCOMPARE(all.value().size(), std::size_t{6});
        QCOMPARE(all.value()[0].name, std::string("crash"));
        QVERIFY(!all.value()[0].date);
    }

    void scenarioErrorsNamePlace()
    {
        const PriceHistory prices = euPrices();
        struct Case {
            const char *text;
            int line;
            int column;
            const char *words;
        };
        const Case cases[] = {
            {"asset,move\nDAX,0.1\n", 1, 2, "unknown column"},
            {"asset,shock\nDAX,abc\n", 2, 2, "expected a shock"},
            {"asset,shock\nDAX,-1\n", 2, 2, "above -1"},
            {"asset,shock\nDAX,0.1\nDAX,0.2\n", 3, 1, "already shocked on line 2"},
            {"asset,shock\nNIKKEI,0.1\n", 2, 1, "NIKKEI"},
            {"asset,shock\nDAX,nan\n", 2, 2, "expected a shock"},
            {"asset,shock\n", 1, 0, "no rows"},
        };
        for (const Case &c : cases) {
            auto r = parseScenarioCsv(c.text, "s.csv", "s", &prices);
            QVERIFY2(!r.ok(), c.text);
            QCOMPARE(r.error().file, std::string("s.csv"));
            QCOMPARE(r.error().line, c.line);
            QCOMPARE(r.error().column, c.column);
            QVERIFY2(r.error().message.find(c.words) != std::string::npos, r.error().message.c_str());
        }
        auto missing = readScenarioCsv("/nonexistent/folder/shock.csv", &prices);
        QVERIFY(!missing.ok());
        QCOMPARE(missing.error().kind, ErrorKind::FileUnreadable);
    }

    void worstDaysMatchNumPy()
    {
        QFile file(QStringLiteral(TAILWISE_TEST_DATA_DIR "/eu-models-fixture.json"));
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QJsonObject fixture = QJsonDocument::fromJson(file.readAll()).object();
        const PriceHistory prices = euPrices();
        const char *names[] = {"DAX", "SMI", "CAC", "FTSE"};
        for (const auto item : fixture.value("worst_days").toArray()) {
            const QJsonObject c = item.toObject();
            Holdings h;
            for (int i = 0; i < 4; ++i) {
                Holding x;
                x.asset = names[i];
                x.value = c.value("exposures").toArray().at(i).toDouble();
                h.push_back(x);
            }
            // Whatever return type the estimate uses, the replay moves prices by simple returns.
            Assumptions a;
            a.returns = ReturnType::Log;
            auto worst = worstDays(prices, h, a, 5);
            QVERIFY(worst.ok());
            const QJsonArray days = c.value("days").toArray();
            QCOMPARE(worst.value().size(), std::size_t(days.size()));
            for (int k = 0; k < days.size(); ++k) {
                const QJsonObject d = days.at(k).toObject();
                QCOMPARE(QString::fromStdString(toIso(*worst.value()[std::size_t(k)].date)), d.value("date").toString());
                TW_CLOSE_REL(worst.value()[std::size_t(k)].pnl, d.value("pnl").toDouble(), 1e-10); // NumPy argsort
            }
        }
    }
};

QTEST_GUILESS_MAIN(TestWhatIf)
#include "test_whatif.moc"

// Returns, the estimation window and the assumptions' domains (returns.h, assumptions.h):
// values by hand from the definitions of issue 2, and the errors naming the field.
#include "closeness.h"

#include "tailwise/assumptions.h"
#include "tailwise/prices.h"
#include "tailwise/returns.h"
#include "tailwise/risk.h"

#include <QTest>

#include <cmath>
#include <limits>

using namespace tailwise;

namespace {

PriceHistory fourDays()
{
    auto p = parsePriceCsv("date,A,B\n2020-01-01,100,50\n2020-01-02,110,50\n2020-01-03,99,55\n2020-01-06,99,44\n",
                           "prices.csv");
    return std::move(p).value();
}

bool mentions(const std::string &text, const std::string &phrase) { return text.find(phrase) != std::string::npos; }

} // namespace

class TestReturnsWindow : public QObject {
    Q_OBJECT

private slots:
    void simpleAndLogReturns()
    {
        // r = P_t/P_{t−1} − 1 and ln(P_t/P_{t−1}) (issue 2): 100 → 110 → 99 → 99.
        const PriceHistory h = fourDays();
        const Eigen::MatrixXd s = computeReturns(h.prices, ReturnType::Simple);
        const Eigen::MatrixXd l = computeReturns(h.prices, ReturnType::Log);
        QCOMPARE(s.rows(), Eigen::Index(3));
        TW_CLOSE_REL(s(0, 0), 0.1, 1e-14);
        TW_CLOSE_REL(s(1, 0), -0.1, 1e-14);
        QCOMPARE(s(2, 0), 0.0);
        TW_CLOSE_REL(s(2, 1), -0.2, 1e-14);
        TW_CLOSE_REL(l(0, 0), std::log(1.1), 1e-14);
        TW_CLOSE_REL(l(1, 1), std::log(1.1), 1e-14);
        TW_CLOSE_REL(l(2, 1), std::log(0.8), 1e-14);
    }

    void windowTakesTheNewestReturns()
    {
        const PriceHistory h = fourDays();
        auto all = selectWindow(h, ReturnType::Simple, std::nullopt);
        QVERIFY(all.ok());
        QCOMPARE(all.value().returns.rows(), Eigen::Index(3));
        QCOMPARE(toIso(all.value().firstDate), std::string("2020-01-02"));
        QCOMPARE(toIso(all.value().lastDate), std::string("2020-01-06"));
        auto two = selectWindow(h, ReturnType::Simple, 2);
        QVERIFY(two.ok());
        QCOMPARE(two.value().returns.rows(), Eigen::Index(2));
        QCOMPARE(toIso(two.value().firstDate), std::string("2020-01-03")); // the oldest return kept
        TW_CLOSE_REL(two.value().returns(0, 0), -0.1, 1e-14);
        // Two returns for two assets: the covariance is singular, and the window says so.
        QVERIFY(!two.value().warnings.empty());
        QVERIFY2(mentions(two.value().warnings[0], "2 returns for 2 assets"), two.value().warnings[0].c_str());
    }

    void windowOutOfRange()
    {
        const PriceHistory h = fourDays();
        auto one = selectWindow(h, ReturnType::Simple, 1);
        QVERIFY(!one.ok());
        QCOMPARE(one.error().kind, ErrorKind::Assumption);
        QCOMPARE(one.error().field, std::string("window"));
        QVERIFY2(mentions(one.error().message, "at least 2 returns"), one.error().message.c_str());
        auto many = selectWindow(h, ReturnType::Simple, 4);
        QVERIFY(!many.ok());
        QCOMPARE(many.error().field, std::string("window"));
        QVERIFY2(mentions(many.error().message, "asks for 4 returns but the price history has only 3"),
                 many.error().message.c_str());
    }

    void riskWarnsWhenTheWindowIsShort()
    {
        // N ≤ number of holdings: a warning travels with the result (issue 2).
        const PriceHistory h = fourDays();
        Assumptions a;
        a.window = 2;
        auto r = computeRisk(h, Holdings{Holding{"A", 1, {}, {}}, Holding{"B", 1, {}, {}}}, a);
        QVERIFY2(r.ok(), r.ok() ? "" : r.error().message.c_str());
        bool warned = false;
        for (const auto &w : r.value().warnings)
            warned |= mentions(w, "2 returns for 2 holdings");
        QVERIFY(warned);
        // The window is reported with the result.
        QCOMPARE(r.value().windowReturns, 2);
        QCOMPARE(toIso(r.value().windowFirst), std::string("2020-01-03"));
    }

    void assumptionsDomains_data()
    {
        QTest::addColumn<QString>("field");
        QTest::addColumn<double>("confidence");
        QTest::addColumn<int>("horizon");
        QTest::addColumn<int>("daysPerYear");
        QTest::addColumn<int>("window");
        QTest::addColumn<double>("lambda");
        const double nan = std::numeric_limits<double>::quiet_NaN();
        QTest::newRow("confidence 0") << "confidence" << 0.0 << 1 << 252 << 0 << 0.94;
        QTest::newRow("confidence 1") << "confidence" << 1.0 << 1 << 252 << 0 << 0.94;
        QTest::newRow("confidence 1.5") << "confidence" << 1.5 << 1 << 252 << 0 << 0.94;
        QTest::newRow("confidence NaN") << "confidence" << nan << 1 << 252 << 0 << 0.94;
        QTest::newRow("horizon 0") << "horizon" << 0.99 << 0 << 252 << 0 << 0.94;
        QTest::newRow("horizon -3") << "horizon" << 0.99 << -3 << 252 << 0 << 0.94;
        QTest::newRow("days-per-year 0") << "days-per-year" << 0.99 << 1 << 0 << 0 << 0.94;
        QTest::newRow("days-per-year 367") << "days-per-year" << 0.99 << 1 << 367 << 0 << 0.94;
        QTest::newRow("window 1") << "window" << 0.99 << 1 << 252 << 1 << 0.94;
        QTest::newRow("lambda 0") << "lambda" << 0.99 << 1 << 252 << 0 << 0.0;
        QTest::newRow("lambda 1") << "lambda" << 0.99 << 1 << 252 << 0 << 1.0;
        QTest::newRow("lambda NaN") << "lambda" << 0.99 << 1 << 252 << 0 << nan;
    }

    void assumptionsDomains()
    {
        QFETCH(QString, field);
        QFETCH(double, confidence);
        QFETCH(int, horizon);
        QFETCH(int, daysPerYear);
        QFETCH(int, window);
        QFETCH(double, lambda);
        Assumptions a;
        a.confidence = confidence;
        a.horizonDays = horizon;
        a.daysPerYear = daysPerYear;
        if (window > 0)
            a.window = window;
        a.lambda = lambda;
        const Status s = validate(a);
        QVERIFY(!s.ok());
        QCOMPARE(s.error().kind, ErrorKind::Assumption);
        QCOMPARE(QString::fromStdString(s.error().field), field);
        QVERIFY2(s.error().message.rfind(field.toStdString() + ": expected", 0) == 0, s.error().message.c_str());
        // computeRisk refuses the same assumptions before touching the data.
        auto r = computeRisk(fourDays(), Holdings{Holding{"A", 1, {}, {}}}, a);
        QVERIFY(!r.ok());
        QCOMPARE(QString::fromStdString(r.error().field), field);
    }

    void defaultsAreValidAndNamesRoundTrip()
    {
        const Assumptions a;
        QVERIFY(validate(a).ok());
        QCOMPARE(a.confidence, 0.99); // issue 2's defaults
        QCOMPARE(a.horizonDays, 1);
        QCOMPARE(a.daysPerYear, 252);
        QCOMPARE(a.lambda, 0.94);
        QVERIFY(!a.window.has_value());
        for (auto v : {ReturnType::Simple, ReturnType::Log})
            QVERIFY(parseReturnType(toName(v)) == v);
        for (auto v : {CovarianceEstimator::Sample, CovarianceEstimator::Ewma})
            QVERIFY(parseEstimator(toName(v)) == v);
        for (auto v : {MeanModel::Zero, MeanModel::Sample})
            QVERIFY(parseMeanModel(toName(v)) == v);
        QVERIFY(parseRiskModel("normal") == RiskModel::Normal);
        QVERIFY(!parseReturnType("Simple").has_value()); // names are exact
        // EWMA effective days 1/(1−λ) (common practice): λ = 0.94 → 16.67 days.
        TW_CLOSE_PRINTED(ewmaEffectiveDays(0.94), 16.6666666667);
    }
};

QTEST_GUILESS_MAIN(TestReturnsWindow)
#include "test_returns_window.moc"

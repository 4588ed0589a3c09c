// The backtest (backtest.h) and its incremental rolling estimates (rollingmoments.h).
//
// - Real data: tests/data/backtest-eu-fixture.json, computed by tests/core/make_backtest_fixture.py
//   with NumPy/SciPy from the definition in backtest.h (normal, Student-t fitted and given,
//   Cornish-Fisher, historical), refitting every window from scratch
//   (versions recorded in the file; data provenance in tests/data/README.md). Exceptions must be
//   the same days; figures and statistics agree to 1e-9 relative.
// - Incremental estimates equal a from-scratch refit (estimate.h) at every step to 1e-9.
// - The statistics of a given hit sequence are those of coveragetests.h (REFERENCE-VALUES.md §7).
// - Errors name their field; a stop request cancels; progress rises to 1.
#include "closeness.h"

#include "tailwise/backtest.h"
#include "tailwise/estimate.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/returns.h"
#include "tailwise/rollingmoments.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTest>

#include <Eigen/Core>

#include <cmath>
#include <random>
#include <stop_token>
#include <string>
#include <vector>

using namespace tailwise;

namespace {

constexpr double relTolerance = 1e-9; // issue 5: fixture and refit agreement

const std::string dataDir = TAILWISE_TEST_DATA_DIR;

const PriceHistory &euPrices()
{
    static const PriceHistory prices = [] {
        auto p = readPriceCsv(dataDir + "/eu-stock-indices-1991-1998.csv");
        if (!p)
            qFatal("cannot read the real data set: %s", p.error().message.c_str());
        return p.value();
    }();
    return prices;
}

QJsonObject fixture()
{
    QFile file(QString::fromStdString(dataDir + "/backtest-eu-fixture.json"));
    if (!file.open(QIODevice::ReadOnly))
        qFatal("cannot open backtest-eu-fixture.json");
    return QJsonDocument::fromJson(file.readAll()).object();
}

BacktestRequest requestOf(const QJsonObject &c)
{
    BacktestRequest r;
    r.prices = euPrices();
    for (const auto &item : c["holdings"].toArray()) {
        const QJsonArray h = item.toArray();
        Holding holding;
        holding.asset = h[0].toString().toStdString();
        if (h[1].toString() == "value")
            holding.value = h[2].toDouble();
        else
            holding.quantity = h[2].toDouble();
        r.holdings.push_back(holding);
    }
    Assumptions &a = r.assumptions;
    a.window = c["window"].toInt();
    a.confidence = c["confidence"].toDouble();
    a.returns = c["returns"].toString() == "log" ? ReturnType::Log : ReturnType::Simple;
    a.estimator = c["estimator"].toString() == "ewma" ? CovarianceEstimator::Ewma : CovarianceEstimator::Sample;
    a.lambda = c["lambda"].toDouble();
    a.mean = c["mean"].toString() == "sample" ? MeanModel::Sample : MeanModel::Zero;
    if (c.contains("model")) {
        const auto model = parseRiskModel(c["model"].toString().toStdString());
        if (!model)
            qFatal("unknown model in the fixture");
        a.model = *model;
    }
    if (c["dof"].isDouble())
        a.dof = DegreesOfFreedom::given(c["dof"].toDouble());
    else if (c["dof"].toString() == "fit")
        a.dof = DegreesOfFreedom::fit();
    return r;
}

// max |a − b| ≤ rel · max |b| over all entries: agreement relative to the matrix's scale.
bool matrixClose(const Eigen::MatrixXd &actual, const Eigen::MatrixXd &expected, double rel, QString &why)
{
    const double scale = expected.cwiseAbs().maxCoeff();
    const double diff = (actual - expected).cwiseAbs().maxCoeff();
    if (actual.allFinite() && diff <= rel * scale)
        return true;
    why = QStringLiteral("max difference %1 exceeds %2 x scale %3").arg(diff, 0, 'g', 3).arg(rel).arg(scale, 0, 'g', 6);
    return false;
}

// Walks a RollingMoments over `returns` and compares it with a refit of every window.
void checkAgainstRefit(const Eigen::MatrixXd &returns, int window, CovarianceEstimator estimator, double lambda,
                       int resyncEvery, const QString &label)
{
    RollingMoments rolling(returns, window, estimator, lambda, MeanModel::Sample, resyncEvery);
    Eigen::VectorXd e = Eigen::VectorXd::LinSpaced(returns.cols(), 1.0, 2.0);
    e(0) = -0.7; // a short position, so eᵀΣe is not dominated by one sign
    int steps = 0;
    double worst = 0.0;
    for (;;) {
        const Eigen::MatrixXd win = returns.middleRows(rolling.start(), window);
        const Eigen::MatrixXd refit = estimator == CovarianceEstimator::Ewma ? ewmaCovariance(win, lambda)
                                                                             : sampleCovariance(win);
        const Eigen::MatrixXd mean = sampleMean(win);
        QString why;
        if (!matrixClose(rolling.covariance(), refit, relTolerance, why))
            QFAIL(qPrintable(QStringLiteral("%1, covariance at step %2: %3").arg(label).arg(steps).arg(why)));
        if (!matrixClose(rolling.sampleMean(), mean, relTolerance, why))
            QFAIL(qPrintable(QStringLiteral("%1, mean at step %2: %3").arg(label).arg(steps).arg(why)));
        const double quadratic = e.dot(refit * e);
        // Relative to the scale the sum is formed on, |e|ᵀ|Σ||e|, as the matrices above are
        // compared relative to theirs: with a short position and W = 2, eᵀΣe is a small difference
        // of large terms, and its own relative error follows the rounding of those terms (the
        // bound on a dot product's error, e.g. Higham 2002 §3.1 (mem)); which side of 1e-9 it
        // falls depends on whether the compiler fuses multiply-adds.
        const double scale = e.cwiseAbs().dot(refit.cwiseAbs() * e.cwiseAbs());
        TW_CLOSE_ABS_CTX(rolling.portfolioVariance(e), quadratic, relTolerance * scale,
                         QStringLiteral("%1, e'Se at step %2").arg(label).arg(steps));
        worst = std::max(worst, (rolling.covariance() - refit).cwiseAbs().maxCoeff() / refit.cwiseAbs().maxCoeff());
        if (!rolling.canAdvance())
            break;
        rolling.advance();
        ++steps;
    }
    QCOMPARE(steps, static_cast<int>(returns.rows()) - window);
    qInfo("%s: %d steps, worst relative difference %.3g", qPrintable(label), steps, worst);
}

// A price history in CSV text: one asset, the given closes on consecutive days from 2020-01-01.
PriceHistory onePriceSeries(const std::vector<double> &closes)
{
    std::string text = "date,A\n";
    Date d = dateFromCivil(2020, 1, 1);
    for (double c : closes) {
        text += toIso(d) + "," + std::to_string(c) + "\n";
        ++d.serial;
    }
    auto p = parsePriceCsv(text, "test prices");
    if (!p)
        qFatal("%s", p.error().message.c_str());
    return p.value();
}

} // namespace

class TestBacktest : public QObject {
    Q_OBJECT
private slots:
    void realDataAgainstNumpy_data();
    void realDataAgainstNumpy();
    void incrementalEqualsRefit_data();
    void incrementalEqualsRefit();
    void incrementalSurvivesRegimeChange();
    void statisticsOfGivenSequence();
    void exceptionRuleIsStrict();
    void valueHoldingsKeepExposure();
    void errorsNameTheirField();
    void unsupportedModelIsRefused();
    void stopAndProgress();
};

void TestBacktest::realDataAgainstNumpy_data()
{
    QTest::addColumn<QJsonObject>("c");
    const QJsonObject f = fixture();
    qInfo("fixture from NumPy %s, SciPy %s", qPrintable(f["numpy"].toString()), qPrintable(f["scipy"].toString()));
    for (const auto &item : f["cases"].toArray())
        QTest::newRow(qPrintable(item.toObject()["name"].toString())) << item.toObject();
}

void TestBacktest::realDataAgainstNumpy()
{
    // NumPy/SciPy fixture (make_backtest_fixture.py) on the real data set, definition of backtest.h.
    QFETCH(QJsonObject, c);
    const auto result = runBacktest(requestOf(c));
    QVERIFY2(result.ok(), result.ok() ? "" : result.error().message.c_str());
    const BacktestResult &r = result.value();
    QCOMPARE(r.observations, c["observations"].toInt());
    QCOMPARE(toIso(r.days.front().date), c["first_date"].toString().toStdString());
    QCOMPARE(toIso(r.days.back().date), c["last_date"].toString().toStdString());
    std::vector<std::string> dates;
    for (Date d : exceptionDates(r))
        dates.push_back(toIso(d));
    std::vector<std::string> expectedDates;
    for (const auto &d : c["exception_dates"].toArray())
        expectedDates.push_back(d.toString().toStdString());
    QCOMPARE(dates, expectedDates);
    QCOMPARE(r.exceptions, c["exceptions"].toInt());
    QCOMPARE(r.normalFallbackDays, c["normal_fallback_days"].toInt());
    TW_CLOSE_REL(r.expectedExceptions, c["expected_exceptions"].toDouble(), relTolerance);
    const QJsonObject k = c["kupiec"].toObject();
    TW_CLOSE_REL(r.kupiec.lr, k["lr"].toDouble(), relTolerance);
    TW_CLOSE_REL(r.kupiec.pValue, k["p_value"].toDouble(), relTolerance);
    const QJsonObject ch = c["christoffersen"].toObject();
    TW_CLOSE_REL(r.christoffersen.independence.lr, ch["lr_ind"].toDouble(), relTolerance);
    TW_CLOSE_REL(r.christoffersen.independence.pValue, ch["p_ind"].toDouble(), relTolerance);
    TW_CLOSE_REL(r.christoffersen.conditionalCoverage.lr, ch["lr_cc"].toDouble(), relTolerance);
    TW_CLOSE_REL(r.christoffersen.conditionalCoverage.pValue, ch["p_cc"].toDouble(), relTolerance);
    const QJsonArray t = ch["transitions"].toArray();
    QCOMPARE(r.christoffersen.transitions.n00, t[0].toInt());
    QCOMPARE(r.christoffersen.transitions.n01, t[1].toInt());
    QCOMPARE(r.christoffersen.transitions.n10, t[2].toInt());
    QCOMPARE(r.christoffersen.transitions.n11, t[3].toInt());
    QCOMPARE(std::string(toName(r.zone.zone)), c["zone"].toString().toStdString());
    TW_CLOSE_REL(r.zone.cumulativeProbability, c["cumulative_probability"].toDouble(), relTolerance);
    for (const auto &item : c["sampled_days"].toArray()) {
        const QJsonObject d = item.toObject();
        const BacktestDay &day = r.days[static_cast<std::size_t>(d["index"].toInt())];
        const QString where = d["date"].toString();
        QCOMPARE(toIso(day.date), where.toStdString());
        TW_CLOSE_REL_CTX(day.var, d["var"].toDouble(), relTolerance, where);
        TW_CLOSE_REL_CTX(day.pnl, d["pnl"].toDouble(), relTolerance, where);
    }
}

void TestBacktest::incrementalEqualsRefit_data()
{
    QTest::addColumn<int>("window");
    QTest::addColumn<int>("estimator");
    QTest::addColumn<int>("resync");
    QTest::addColumn<int>("returnType");
    const int sample = static_cast<int>(CovarianceEstimator::Sample);
    const int ewma = static_cast<int>(CovarianceEstimator::Ewma);
    const int simple = static_cast<int>(ReturnType::Simple);
    const int log = static_cast<int>(ReturnType::Log);
    // resync 0 = the default periodic re-synchronisation; 1000000 = pure incremental updates, so
    // the update formulas themselves are shown to hold to 1e-9 over the whole history.
    QTest::newRow("sample W=250") << 250 << sample << 0 << simple;
    QTest::newRow("sample W=250 no periodic resync") << 250 << sample << 1000000 << simple;
    QTest::newRow("sample W=20 no periodic resync") << 20 << sample << 1000000 << simple;
    QTest::newRow("sample W=2 no periodic resync") << 2 << sample << 1000000 << simple;
    QTest::newRow("sample W=500 log") << 500 << sample << 0 << log;
    QTest::newRow("ewma W=250") << 250 << ewma << 0 << simple;
    QTest::newRow("ewma W=250 no periodic resync") << 250 << ewma << 1000000 << simple;
    QTest::newRow("ewma W=20 no periodic resync") << 20 << ewma << 1000000 << log;
    QTest::newRow("ewma W=1000 no periodic resync") << 1000 << ewma << 1000000 << simple;
}

void TestBacktest::incrementalEqualsRefit()
{
    // Refit from scratch with estimate.h's sampleCovariance / ewmaCovariance / sampleMean at every
    // step of the real data set (issue 5: agreement to 1e-9).
    QFETCH(int, window);
    QFETCH(int, estimator);
    QFETCH(int, resync);
    QFETCH(int, returnType);
    const Eigen::MatrixXd returns = computeReturns(euPrices().prices, static_cast<ReturnType>(returnType));
    checkAgainstRefit(returns, window, static_cast<CovarianceEstimator>(estimator), 0.94, resync,
                      QString::fromLatin1(QTest::currentDataTag()));
}

void TestBacktest::incrementalSurvivesRegimeChange()
{
    // The hard case for a subtractive update: a wild spell (daily sd 20%, means of 5%) followed by
    // a calm one (sd 0.001%), so that the calm covariance is 4e8 times smaller than the rounding
    // scale of the state it is updated from. Seeded, invented returns (common practice for a
    // stress of numerical accuracy); the refit is the reference.
    std::mt19937_64 rng(20261201);
    std::normal_distribution<double> normal;
    const int days = 3000, assets = 5;
    Eigen::MatrixXd returns(days, assets);
    for (int t = 0; t < days; ++t) {
        const bool wild = t >= 500 && t < 1623; // ends off the periodic re-sync steps
        const double sd = wild ? 0.2 : 0.00001;
        const double common = normal(rng);
        for (int i = 0; i < assets; ++i)
            returns(t, i) = (wild ? 0.05 : 0.0001) + sd * (0.6 * common + 0.8 * normal(rng));
    }
    checkAgainstRefit(returns, 250, CovarianceEstimator::Sample, 0.94, 0, QStringLiteral("regime sample"));
    checkAgainstRefit(returns, 250, CovarianceEstimator::Ewma, 0.97, 0, QStringLiteral("regime ewma"));
}

void TestBacktest::statisticsOfGivenSequence()
{
    // Christoffersen (1998), invented sequence A of REFERENCE-VALUES.md §7 at p = 0.05 (SciPy 1.10),
    // through the backtest's own statistics step.
    const char *seq = "0000000100000000011000000000001000000100";
    BacktestResult r;
    r.tailProbability = 0.05;
    for (const char *c = seq; *c; ++c)
        r.days.push_back(BacktestDay{Date{}, 0.0, 0.0, *c == '1'});
    fillStatistics(r);
    QCOMPARE(r.observations, 40);
    QCOMPARE(r.exceptions, 5);
    TW_CLOSE_REL(r.expectedExceptions, 2.0, 1e-12);
    TW_CLOSE_REL(r.kupiec.lr, 3.406240442, 1e-8);                        // Kupiec 1995
    TW_CLOSE_REL(r.christoffersen.independence.lr, 0.2365714793, 1e-8);  // Christoffersen 1998
    TW_CLOSE_REL(r.christoffersen.conditionalCoverage.lr, 3.642811921, 1e-8);
    TW_CLOSE_REL(r.christoffersen.conditionalCoverage.pValue, 0.161798, 1e-5);

    // Verdicts from those p-values (Kupiec 0.0649503, LR_ind 0.626693, LR_cc 0.161798; SciPy, §7).
    const BacktestVerdict at5 = verdictAt(r, 0.05);
    QVERIFY(!at5.kupiecRejected && !at5.independenceRejected && !at5.coverageRejected && at5.passed);
    QVERIFY(at5.clustering); // π1 = 0.2 > π0 = 0.117647
    const BacktestVerdict at10 = verdictAt(r, 0.10);
    QVERIFY(at10.kupiecRejected && at10.tooManyExceptions && !at10.coverageRejected && !at10.passed);
    const BacktestVerdict at20 = verdictAt(r, 0.20);
    QVERIFY(at20.coverageRejected && !at20.independenceRejected);
}

void TestBacktest::exceptionRuleIsStrict()
{
    // Definition of backtest.h: an exception is a loss strictly greater than the VaR; every day's
    // flag follows that rule and every figure is finite (real data, normal model).
    BacktestRequest request;
    request.prices = euPrices();
    request.holdings = {Holding{"DAX", 1.0, {}, {}}, Holding{"FTSE", -2.0, {}, {}}};
    request.assumptions.window = 60;
    request.assumptions.confidence = 0.975;
    const auto result = runBacktest(request);
    QVERIFY(result.ok());
    for (const auto &d : result.value().days) {
        QVERIFY(std::isfinite(d.pnl) && std::isfinite(d.var));
        QCOMPARE(d.exception, -d.pnl > d.var);
    }
    // Sanity of scale (common practice): a 97.5% VaR is exceeded on a few percent of days.
    const double rate = static_cast<double>(result.value().exceptions) / result.value().observations;
    QVERIFY2(rate > 0.005 && rate < 0.08, qPrintable(QString::number(rate)));
}

void TestBacktest::valueHoldingsKeepExposure()
{
    // A holding given by value keeps its money exposure: P&L = value × simple return (backtest.h).
    // Worked example on invented closes 100, 101, 99, 102, 98, 100.5, window 2.
    const std::vector<double> closes = {100, 101, 99, 102, 98, 100.5};
    BacktestRequest request;
    request.prices = onePriceSeries(closes);
    request.holdings = {Holding{"A", 0.0, {}, 1000.0}};
    request.assumptions.window = 2;
    request.assumptions.confidence = 0.95;
    const auto result = runBacktest(request);
    QVERIFY2(result.ok(), result.ok() ? "" : result.error().message.c_str());
    const auto &days = result.value().days;
    QCOMPARE(static_cast<int>(days.size()), 3); // 5 returns, window 2
    const double z = 1.6448536269514722;         // Φ⁻¹(0.95), A&S Table 26.5 / SciPy (REFERENCE-VALUES.md §1)
    for (std::size_t k = 0; k < days.size(); ++k) {
        const std::size_t t = k + 3; // price index of the day tested
        const double r1 = closes[t - 2] / closes[t - 3] - 1.0, r2 = closes[t - 1] / closes[t - 2] - 1.0;
        const double m = 0.5 * (r1 + r2);
        const double sd = std::sqrt((r1 - m) * (r1 - m) + (r2 - m) * (r2 - m)); // n − 1 = 1
        TW_CLOSE_REL(days[k].pnl, 1000.0 * (closes[t] / closes[t - 1] - 1.0), 1e-12);
        TW_CLOSE_REL(days[k].var, z * 1000.0 * sd, 1e-9);
    }
    // And by quantity the exposure follows the previous close: 10 units.
    request.holdings = {Holding{"A", 10.0, {}, {}}};
    const auto byQuantity = runBacktest(request);
    QVERIFY(byQuantity.ok());
    TW_CLOSE_REL(byQuantity.value().days[0].pnl, 10.0 * (closes[3] - closes[2]), 1e-12);
}

void TestBacktest::errorsNameTheirField()
{
    BacktestRequest request;
    request.prices = euPrices();
    request.holdings = {Holding{"DAX", 1.0, {}, {}}};
    // No window.
    auto r = runBacktest(request);
    QVERIFY(!r.ok());
    QCOMPARE(r.error().field, std::string("window"));
    QVERIFY2(r.error().message.find("window") != std::string::npos, r.error().message.c_str());
    // A window that leaves no day: 1,859 returns.
    request.assumptions.window = 1859;
    r = runBacktest(request);
    QVERIFY(!r.ok());
    QCOMPARE(r.error().kind, ErrorKind::InsufficientData);
    QCOMPARE(r.error().field, std::string("window"));
    QVERIFY2(r.error().message.find("1859") != std::string::npos, r.error().message.c_str());
    // 1,858 leaves exactly one day.
    request.assumptions.window = 1858;
    r = runBacktest(request);
    QVERIFY(r.ok());
    QCOMPARE(r.value().observations, 1);
    // A bad confidence names its field.
    request.assumptions.window = 250;
    request.assumptions.confidence = 1.0;
    r = runBacktest(request);
    QVERIFY(!r.ok());
    QCOMPARE(r.error().field, std::string("confidence"));
    // An asset the history lacks.
    request.assumptions.confidence = 0.99;
    request.holdings = {Holding{"NIKKEI", 1.0, {}, {}}};
    r = runBacktest(request);
    QVERIFY(!r.ok());
    QVERIFY2(r.error().message.find("NIKKEI") != std::string::npos, r.error().message.c_str());
    // No holdings.
    request.holdings.clear();
    r = runBacktest(request);
    QVERIFY(!r.ok());
    QCOMPARE(r.error().field, std::string("holdings"));
}

void TestBacktest::unsupportedModelIsRefused()
{
    for (RiskModel m : backtestModels())
        QVERIFY(checkBacktestModel(m).ok());
    QCOMPARE(static_cast<int>(backtestModels().size()), 4);
    // Any other model the core knows is refused up front, naming the field and the model.
    for (const char *name : {"monte-carlo"}) {
        const auto model = parseRiskModel(name);
        if (!model)
            continue;
        BacktestRequest request;
        request.prices = euPrices();
        request.holdings = {Holding{"DAX", 1.0, {}, {}}};
        request.assumptions.window = 250;
        request.assumptions.model = *model;
        const auto status = checkBacktestModel(*model);
        if (status.ok())
            continue; // supported since this test was written
        const auto r = runBacktest(request);
        QVERIFY(!r.ok());
        QCOMPARE(r.error().field, std::string("model"));
        QVERIFY2(r.error().message.find(name) != std::string::npos, r.error().message.c_str());
    }
}

void TestBacktest::stopAndProgress()
{
    BacktestRequest request;
    request.prices = euPrices();
    request.holdings = {Holding{"DAX", 1.0, {}, {}}, Holding{"CAC", 1.0, {}, {}}};
    request.assumptions.window = 250;
    std::vector<double> seen;
    const auto r = runBacktest(request, {}, [&](double f) { seen.push_back(f); });
    QVERIFY(r.ok());
    QVERIFY(!seen.empty() && seen.size() <= 110);
    for (std::size_t i = 1; i < seen.size(); ++i)
        QVERIFY(seen[i] >= seen[i - 1]);
    QCOMPARE(seen.back(), 1.0);
    // A stop requested from the progress callback ends the run as cancelled.
    std::stop_source source;
    const auto stopped = runBacktest(request, source.get_token(), [&](double f) {
        if (f > 0.3)
            source.request_stop();
    });
    QVERIFY(!stopped.ok());
    QCOMPARE(stopped.error().kind, ErrorKind::Cancelled);
    // The RunControl form, as the other long computations take it.
    std::stop_source early;
    early.request_stop();
    RunControl control;
    control.stop = early.get_token();
    const auto cancelled = runBacktest(request, control);
    QVERIFY(!cancelled.ok());
    QCOMPARE(cancelled.error().kind, ErrorKind::Cancelled);
    RunControl plain;
    const auto same = runBacktest(request, plain);
    QVERIFY(same.ok());
    QCOMPARE(same.value().exceptions, r.value().exceptions);
}

QTEST_APPLESS_MAIN(TestBacktest)
#include "test_backtest.moc"

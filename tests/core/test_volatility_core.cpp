// GARCH(1,1) (garch.h), the Acerbi–Székely ES test (estest.h) and the FZ0 ranking with the
// Diebold–Mariano test (ranking.h).
//
// Sources, beside each check:
// - tests/data/volatility-eu-fixture.json, written by tests/core/make_volatility_fixture.py with
//   NumPy/SciPy from the definitions in garch.h and ranking.h (and the filtered historical model
//   of the models branch, whose cases this test does not read), on the real
//   data set tests/data/eu-stock-indices-1991-1998.csv (provenance in tests/data/README.md).
// - GARCH recovery: a series simulated here from known parameters (seeded std::mt19937_64, whose
//   output the C++ standard fixes, and Box–Muller normals).
// - Z₂: Acerbi & Székely (2014), test 2, evaluated by hand on a four-day series, and on long
//   series whose tails are known by construction.
#include "closeness.h"

#include "tailwise/estest.h"
#include "tailwise/garch.h"
#include "tailwise/prices.h"
#include "tailwise/ranking.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTest>

#include <cmath>
#include <numbers>
#include <random>
#include <string>
#include <vector>

using namespace tailwise;

namespace {

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
    static const QJsonObject object = [] {
        QFile file(QString::fromStdString(dataDir + "/volatility-eu-fixture.json"));
        if (!file.open(QIODevice::ReadOnly))
            qFatal("cannot open volatility-eu-fixture.json");
        return QJsonDocument::fromJson(file.readAll()).object();
    }();
    return object;
}

std::vector<double> doubles(const QJsonArray &a)
{
    std::vector<double> out;
    for (const auto &v : a)
        out.push_back(v.toDouble());
    return out;
}

// Box–Muller normal from a 64-bit Mersenne Twister (the standard fixes its output).
struct Normals {
    std::mt19937_64 engine;
    explicit Normals(std::uint64_t seed) : engine(seed) {}
    double uniform() { return (static_cast<double>(engine() >> 11) + 0.5) * 0x1.0p-53; }
    double operator()()
    {
        const double u = uniform(), v = uniform();
        return std::sqrt(-2.0 * std::log(u)) * std::cos(2.0 * std::numbers::pi * v);
    }
};

std::vector<double> simulateGarch(const GarchParameters &p, int n, std::uint64_t seed)
{
    Normals z(seed);
    std::vector<double> r(static_cast<std::size_t>(n));
    double s2 = p.omega / (1.0 - p.alpha - p.beta);
    double previous = 0.0;
    for (int burn = -500; burn < n; ++burn) {
        s2 = p.omega + p.alpha * previous * previous + p.beta * s2;
        previous = std::sqrt(s2) * z();
        if (burn >= 0)
            r[static_cast<std::size_t>(burn)] = previous;
    }
    return r;
}

} // namespace

class TestVolatilityCore : public QObject {
    Q_OBJECT

private slots:
    void garchRecoversSimulatedParameters();
    void garchLikelihoodAtLeastSciPys();
    void garchHorizonVarianceIsTheSum();
    void z2ByHand();
    void z2KnownTails();
    void fz0AndDieboldMarianoMatchNumPy();
};

// Series simulated from ω = 2e-6, α = 0.08, β = 0.90 (four seeds, 4,000 days each): every fit
// lies within three of its standard errors (the information-matrix standard errors of garch.h; a
// 99.7 % band for each), and the mean of the four fits within two standard errors of a mean
// (SE/√4, the standard errors of the four fits averaged).
void TestVolatilityCore::garchRecoversSimulatedParameters()
{
    const GarchParameters truth{2e-6, 0.08, 0.90};
    GarchParameters mean, meanSe;
    for (std::uint64_t seed : {101u, 202u, 303u, 404u}) {
        const auto r = simulateGarch(truth, 4000, seed);
        const GarchFit fit = fitGarch(r);
        QCOMPARE(fit.outcome, FitOutcome::Fitted);
        QVERIFY(fit.standardErrors.has_value());
        const auto &p = fit.parameters;
        const auto &se = *fit.standardErrors;
        qInfo("seed %d: ω %.3g (se %.2g), α %.4f (se %.4f), β %.4f (se %.4f)", static_cast<int>(seed), p.omega, se.omega,
              p.alpha, se.alpha, p.beta, se.beta);
        QVERIFY(std::abs(p.omega - truth.omega) <= 3.0 * se.omega);
        QVERIFY(std::abs(p.alpha - truth.alpha) <= 3.0 * se.alpha);
        QVERIFY(std::abs(p.beta - truth.beta) <= 3.0 * se.beta);
        TW_CLOSE_REL(fit.persistence, p.alpha + p.beta, 1e-15);
        TW_CLOSE_REL(fit.logLikelihood, garchLogLikelihood(r, p), 1e-15);
        QVERIFY(fit.logLikelihood >= garchLogLikelihood(r, truth)); // the optimum beats the truth in-sample
        mean.omega += p.omega / 4;
        mean.alpha += p.alpha / 4;
        mean.beta += p.beta / 4;
        meanSe.omega += se.omega / 4;
        meanSe.alpha += se.alpha / 4;
        meanSe.beta += se.beta / 4;
    }
    QVERIFY(std::abs(mean.omega - truth.omega) <= 2.0 * meanSe.omega / 2.0);
    QVERIFY(std::abs(mean.alpha - truth.alpha) <= 2.0 * meanSe.alpha / 2.0);
    QVERIFY(std::abs(mean.beta - truth.beta) <= 2.0 * meanSe.beta / 2.0);
}

// On the real data the log-likelihood at our fit is at least the best SciPy's optimisers find
// from several starts (make_volatility_fixture.py, garch cases), minus 1e-6.
void TestVolatilityCore::garchLikelihoodAtLeastSciPys()
{
    const PriceHistory &prices = euPrices();
    for (const auto &c : fixture()["garch"].toArray()) {
        const QJsonObject o = c.toObject();
        const std::string asset = o["asset"].toString().toStdString();
        Eigen::VectorXd column = prices.prices.col(prices.assetIndex(asset));
        Eigen::VectorXd r = column.tail(column.size() - 1).cwiseQuotient(column.head(column.size() - 1)).array() - 1.0;
        if (!o["window"].isNull())
            r = Eigen::VectorXd(r.tail(o["window"].toInt()));
        const GarchFit fit = fitGarch(std::span<const double>(r.data(), static_cast<std::size_t>(r.size())));
        const QString name = QString::fromStdString(asset) + " " + (o["window"].isNull() ? "all" : QString::number(o["window"].toInt()));
        QVERIFY2(fit.outcome == FitOutcome::Fitted, qPrintable(name));
        const double scipy = o["scipy_best_loglik"].toDouble();
        QVERIFY2(fit.logLikelihood >= scipy - 1e-6,
                 qPrintable(name + QStringLiteral(": ours %1, SciPy %2").arg(fit.logLikelihood, 0, 'g', 17).arg(scipy, 0, 'g', 17)));
        // Our log-likelihood function agrees with NumPy's at SciPy's parameters.
        const QJsonArray sp = o["scipy_params"].toArray();
        TW_CLOSE_REL_CTX(garchLogLikelihood(std::span<const double>(r.data(), static_cast<std::size_t>(r.size())),
                                            GarchParameters{sp[0].toDouble(), sp[1].toDouble(), sp[2].toDouble()}),
                         scipy, 1e-12, name);
    }
}

// The closed form of garch.h equals the explicit sum of the recursion's expectations.
void TestVolatilityCore::garchHorizonVarianceIsTheSum()
{
    const GarchParameters p{3e-6, 0.09, 0.88};
    const double next = 4e-4;
    const double longRun = p.omega / (1.0 - p.alpha - p.beta);
    double sum = 0.0, s2 = next;
    for (int h = 1; h <= 10; ++h) {
        sum += s2;
        s2 = p.omega + (p.alpha + p.beta) * s2; // E[σ²_{T+h+1}] = ω + (α+β) σ²_{T+h}
    }
    TW_CLOSE_REL(garchHorizonVariance(p, next, 10), sum, 1e-13);
    TW_CLOSE_REL(garchHorizonVariance(p, next, 1), next, 1e-15);
    TW_CLOSE_REL(garchHorizonVariance(p, longRun, 25), 25 * longRun, 1e-13);
}

// Z₂ = 1 − Σ L_t I_t / (T α ES_t), by hand on four days at C = 0.9 (α = 0.1):
// days 1 and 3 are exceptions, 12/15 + 30/20 = 2.3, so Z₂ = 1 − 2.3/(4 · 0.1) = −4.75.
void TestVolatilityCore::z2ByHand()
{
    const std::vector<EsTestDay> days{{12.0, 10.0, 15.0}, {5.0, 10.0, 15.0}, {30.0, 18.0, 20.0}, {18.0, 18.0, 20.0}};
    TW_CLOSE_REL(acerbiSzekelyZ2(days, 0.9), -4.75, 1e-15);
    std::vector<LossDistribution> models(4);
    for (auto &m : models)
        m.sd = 10.0;
    QVERIFY(!esTest(days, models, 0.9, 10, 1));                     // too few simulations
    std::vector<EsTestDay> bad = days;
    bad[2].es = 0.0;
    auto refused = esTest(bad, models, 0.9, 1000, 1);
    QVERIFY(!refused);
    QCOMPARE(refused.error().field, std::string("es-test"));
}

// Known tails: losses drawn from the very normal the forecasts describe give Z₂ near 0 and a
// p-value far from rejection; losses with Student-t(3) tails scaled to the same variance, judged
// by normal forecasts, give Z₂ < 0 and a rejection. The simulated p-value moves by at most ±0.01
// across seeds at 10,000 simulations.
void TestVolatilityCore::z2KnownTails()
{
    const double c = 0.975;
    const double z = 1.959963984540054;                   // Φ⁻¹(0.975)
    const double esFactor = 0.05844094433345147 / 0.025;  // φ(z)/α
    Normals normal(11);
    const int days = 1000;
    std::vector<EsTestDay> right(days), heavy(days);
    std::vector<LossDistribution> models(days);
    std::mt19937_64 engine(12);
    std::student_t_distribution<double> t3(3.0); // only to make the heavy series; not a check value
    for (int d = 0; d < days; ++d) {
        const double sd = 100.0 * (1.0 + 0.5 * std::sin(d / 50.0));
        models[static_cast<std::size_t>(d)].kind = LossDistribution::Kind::Normal;
        models[static_cast<std::size_t>(d)].sd = sd;
        right[static_cast<std::size_t>(d)] = {sd * normal(), z * sd, esFactor * sd};
        heavy[static_cast<std::size_t>(d)] = {sd * t3(engine) / std::sqrt(3.0), z * sd, esFactor * sd};
    }
    auto ok = esTest(right, models, c, 10000, 1);
    auto bad = esTest(heavy, models, c, 10000, 1);
    QVERIFY(ok && bad);
    qInfo("right tails: Z2 %.4f p %.4f; heavy tails: Z2 %.4f p %.4f", ok.value().z2, ok.value().pValue, bad.value().z2,
          bad.value().pValue);
    QVERIFY(std::abs(ok.value().z2) < 0.5);
    QVERIFY(ok.value().pValue > 0.05);
    QVERIFY(!ok.value().rejected);
    QVERIFY(bad.value().z2 < ok.value().z2);
    QVERIFY(bad.value().rejected);
    double lo = ok.value().pValue, hi = ok.value().pValue;
    for (std::uint64_t seed : {2u, 3u, 4u}) {
        auto again = esTest(right, models, c, 10000, seed);
        QVERIFY(again);
        QCOMPARE(again.value().z2, ok.value().z2);
        lo = std::min(lo, again.value().pValue);
        hi = std::max(hi, again.value().pValue);
    }
    QVERIFY2(hi - lo <= 0.02, qPrintable(QStringLiteral("p-values from %1 to %2").arg(lo).arg(hi)));
    // Empirical draws: forecasts from each day's own scenario losses. The statistic is seeded.
    std::vector<LossDistribution> empirical(days);
    for (int d = 0; d < days; ++d) {
        empirical[static_cast<std::size_t>(d)].kind = LossDistribution::Kind::Empirical;
        for (int k = 0; k < 200; ++k)
            empirical[static_cast<std::size_t>(d)].losses.push_back(models[static_cast<std::size_t>(d)].sd * normal());
    }
    auto e1 = esTest(right, empirical, c, 2000, 5);
    auto e2 = esTest(right, empirical, c, 2000, 5);
    QVERIFY(e1 && e2);
    QCOMPARE(e1.value().pValue, e2.value().pValue);
}

// FZ0 scores and the Diebold–Mariano test against NumPy (make_volatility_fixture.py, ranking).
void TestVolatilityCore::fz0AndDieboldMarianoMatchNumPy()
{
    const QJsonObject o = fixture()["ranking"].toObject();
    const double c = o["confidence"].toDouble();
    const std::vector<double> losses = doubles(o["losses"].toArray());
    std::vector<RankingInput> inputs;
    const QJsonArray models = o["models"].toArray();
    for (int k = 0; k < models.size(); ++k) {
        const QJsonObject m = models[k].toObject();
        inputs.push_back({m["model"].toString().toStdString(), losses, doubles(m["var"].toArray()), doubles(m["es"].toArray())});
        const auto first = doubles(o["first_scores"].toArray()[k].toArray());
        for (std::size_t t = 0; t < first.size(); ++t)
            TW_CLOSE_REL(fz0Score(losses[t], inputs.back().vars[t], inputs.back().ess[t], 1.0 - c), first[t], 1e-12);
    }
    auto rows = rankByFz0(inputs, c);
    QVERIFY(rows);
    std::vector<QJsonObject> expected;
    for (const auto &r : o["rows"].toArray())
        expected.push_back(r.toObject());
    std::sort(expected.begin(), expected.end(), [](const QJsonObject &a, const QJsonObject &b) { return a["fz0"].toDouble() < b["fz0"].toDouble(); });
    QCOMPARE(rows.value().size(), expected.size());
    for (std::size_t k = 0; k < expected.size(); ++k) {
        const RankingRow &row = rows.value()[k];
        QCOMPARE(QString::fromStdString(row.model), expected[k]["model"].toString());
        TW_CLOSE_REL(row.fz0, expected[k]["fz0"].toDouble(), 1e-12);
        TW_CLOSE_ABS(row.dmStatistic, expected[k]["dm_statistic"].toDouble(), 1e-9);
        TW_CLOSE_ABS(row.dmPValue, expected[k]["dm_p_value"].toDouble(), 1e-9);
    }
    QCOMPARE(neweyWestLag(400), 7);
    QCOMPARE(neweyWestLag(1000), 10);
    QCOMPARE(neweyWestLag(999), 9);
    // A non-positive ES is refused, naming the model.
    inputs[1].ess[3] = 0.0;
    auto refused = rankByFz0(inputs, c);
    QVERIFY(!refused);
    QCOMPARE(refused.error().field, std::string("compare"));
    QVERIFY(refused.error().message.find(inputs[1].model) != std::string::npos);
}

QTEST_GUILESS_MAIN(TestVolatilityCore)
#include "test_volatility_core.moc"

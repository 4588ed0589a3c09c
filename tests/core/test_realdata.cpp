// The core on real market data against NumPy/SciPy: tests/data/eu-realdata-fixture.json holds
// reference figures computed by tests/core/make_realdata_fixture.py from issue 2's definitions
// (NumPy/SciPy versions recorded in the file; data provenance in tests/data/README.md). Every case
// is a row of one data-driven test, so a failure names the portfolio and the assumptions.
#include "closeness.h"

#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTest>

#include <cmath>
#include <map>
#include <string>

using namespace tailwise;

namespace {

// Agreement demanded of the C++ results (issue 2).
constexpr double relTolerance = 1e-9;

const std::string dataDir = TAILWISE_TEST_DATA_DIR;

Assumptions assumptionsOf(const QJsonObject &c)
{
    Assumptions a;
    a.confidence = c["confidence"].toDouble();
    a.horizonDays = c["horizon"].toInt();
    if (c["window"].isDouble())
        a.window = c["window"].toInt();
    a.returns = c["returns"].toString() == "log" ? ReturnType::Log : ReturnType::Simple;
    a.estimator = c["estimator"].toString() == "ewma" ? CovarianceEstimator::Ewma : CovarianceEstimator::Sample;
    a.lambda = c["lambda"].toDouble();
    a.mean = c["mean"].toString() == "sample" ? MeanModel::Sample : MeanModel::Zero;
    return a;
}

QString caseName(const QJsonObject &c)
{
    QString window = c["window"].isDouble() ? QString::number(c["window"].toInt()) : QStringLiteral("all");
    QString estimator = c["estimator"].toString();
    if (estimator == "ewma")
        estimator += QString::number(c["lambda"].toDouble());
    return QStringLiteral("%1 window=%2 %3 mean=%4 %5 H=%6 C=%7")
        .arg(c["portfolio"].toString(), window, estimator, c["mean"].toString(), c["returns"].toString())
        .arg(c["horizon"].toInt())
        .arg(c["confidence"].toDouble());
}

} // namespace

class TestRealData : public QObject {
    Q_OBJECT

    QJsonObject m_fixture;
    PriceHistory m_prices;
    std::map<QString, Holdings> m_holdings;

private slots:
    void initTestCase()
    {
        QFile file(QString::fromStdString(dataDir + "/eu-realdata-fixture.json"));
        QVERIFY2(file.open(QIODevice::ReadOnly), qPrintable(file.fileName() + ": " + file.errorString()));
        QJsonParseError error;
        const QJsonDocument doc = QJsonDocument::fromJson(file.readAll(), &error);
        QVERIFY2(!doc.isNull(), qPrintable(error.errorString()));
        m_fixture = doc.object();

        auto prices = readPriceCsv(dataDir + "/" + m_fixture["prices_file"].toString().toStdString());
        QVERIFY2(prices.ok(), prices.ok() ? "" : prices.error().message.c_str());
        m_prices = std::move(prices).value();
    }

    void fixtureNamesItsSource()
    {
        // A fixture must say what made it (the mission's rule for generated fixtures).
        const QJsonObject with = m_fixture["generated_with"].toObject();
        QVERIFY(!with["numpy"].toString().isEmpty());
        QVERIFY(!with["scipy"].toString().isEmpty());
        QCOMPARE(m_fixture["cases"].toArray().size(), m_fixture["case_count"].toInt());
        QVERIFY(m_fixture["case_count"].toInt() >= 100);
    }

    void pricesAreTheWholeDataSet()
    {
        // /work/shared/data/README.md: 1,860 trading days of DAX, SMI, CAC, FTSE, no gaps.
        QCOMPARE(m_prices.dayCount(), 1860);
        QCOMPARE(m_prices.assets, (std::vector<std::string>{"DAX", "SMI", "CAC", "FTSE"}));
        QVERIFY(m_prices.warnings.empty());
        QCOMPARE(toIso(m_prices.dates.front()), std::string("1991-07-01"));
        QCOMPARE(toIso(m_prices.dates.back()), std::string("1998-08-14"));
    }

    void agreesWithNumpy_data()
    {
        QTest::addColumn<int>("index");
        const QJsonArray cases = m_fixture["cases"].toArray();
        for (qsizetype i = 0; i < cases.size(); ++i) {
            const QString name = QStringLiteral("%1: %2").arg(i).arg(caseName(cases[i].toObject()));
            QTest::newRow(qPrintable(name)) << static_cast<int>(i);
        }
    }

    void agreesWithNumpy()
    {
        QFETCH(int, index);
        const QJsonObject c = m_fixture["cases"].toArray()[index].toObject();
        const QString name = caseName(c);
        const QString holdingsFile = c["holdings_file"].toString();
        if (!m_holdings.count(holdingsFile)) {
            auto h = readHoldingsCsv(dataDir + "/" + holdingsFile.toStdString(), &m_prices);
            QVERIFY2(h.ok(), h.ok() ? "" : h.error().message.c_str());
            m_holdings[holdingsFile] = std::move(h).value();
        }
        auto result = computeRisk(m_prices, m_holdings[holdingsFile], assumptionsOf(c));
        QVERIFY2(result.ok(), result.ok() ? "" : result.error().message.c_str());
        const RiskReport &r = result.value();

        QCOMPARE(r.windowReturns, c["window_returns"].toInt());
        QVERIFY2(!r.moments.repaired, qPrintable(name)); // the reference assumes no repair
        TW_CLOSE_REL_CTX(r.portfolioValue, c["portfolio_value"].toDouble(), relTolerance, name);
        TW_CLOSE_REL_CTX(r.horizon.sd, c["horizon_sd_money"].toDouble(), relTolerance, name);
        TW_CLOSE_REL_CTX(r.horizon.mean, c["horizon_mean_money"].toDouble(), relTolerance, name);
        TW_CLOSE_REL_CTX(r.figures.var, c["var"].toDouble(), relTolerance, name);
        TW_CLOSE_REL_CTX(r.figures.es, c["es"].toDouble(), relTolerance, name);
        TW_CLOSE_REL_CTX(r.undiversifiedVar, c["undiversified_var"].toDouble(), relTolerance, name);
        // A difference of two figures (zero for one asset): relative to the larger of them.
        TW_CLOSE_ABS_CTX(r.diversificationBenefit, c["undiversified_var"].toDouble() - c["var"].toDouble(),
                         relTolerance * std::abs(c["undiversified_var"].toDouble()), name);
        TW_CLOSE_REL_CTX(*r.varFraction, c["var"].toDouble() / c["portfolio_value"].toDouble(), relTolerance, name);

        const QJsonArray exposures = c["exposures"].toArray();
        QCOMPARE(static_cast<qsizetype>(r.holdings.size()), exposures.size());
        for (qsizetype i = 0; i < exposures.size(); ++i) {
            const HoldingRisk &h = r.holdings[static_cast<std::size_t>(i)];
            const QString where = name + " " + QString::fromStdString(h.asset);
            TW_CLOSE_REL_CTX(h.exposure, exposures[i].toDouble(), relTolerance, where);
            TW_CLOSE_REL_CTX(h.marginalVar, c["marginal_var"].toArray()[i].toDouble(), relTolerance, where);
            TW_CLOSE_REL_CTX(h.componentVar, c["component_var"].toArray()[i].toDouble(), relTolerance, where);
            TW_CLOSE_REL_CTX(h.componentEs, c["component_es"].toArray()[i].toDouble(), relTolerance, where);
            TW_CLOSE_REL_CTX(h.standaloneVar, c["standalone_var"].toArray()[i].toDouble(), relTolerance, where);
        }
    }
};

QTEST_GUILESS_MAIN(TestRealData)
#include "test_realdata.moc"

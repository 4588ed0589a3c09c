// Allocations of VaR and ES under every model (allocation.h): additivity, the Student-t factor,
// Cornish–Fisher against a NumPy implementation of Boudt, Peterson & Croux (2008) and against
// finite differences, historical components against a NumPy reimplementation of the kernel and
// tail definitions on the real data set, the grid under the chosen model, aggregate scaling.
// Fixture: tests/data/eu-allocation-fixture.json, written by tests/core/make_allocation_fixture.py.
#include "closeness.h"

#include "tailwise/allocation.h"
#include "tailwise/modelgrid.h"
#include "tailwise/prices.h"
#include "tailwise/risk.h"
#include "tailwise/studentt.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QTest>

#include <cmath>

using namespace tailwise;

namespace {

QJsonObject loadFixture()
{
    QFile file(QStringLiteral(TAILWISE_TEST_DATA_DIR "/eu-allocation-fixture.json"));
    if (!file.open(QIODevice::ReadOnly))
        return {};
    return QJsonDocument::fromJson(file.readAll()).object();
}

const PriceHistory &euPrices()
{
    static const PriceHistory prices = [] {
        auto p = readPriceCsv(TAILWISE_TEST_DATA_DIR "/eu-stock-indices-1991-1998.csv");
        Q_ASSERT(p.ok());
        return p.value();
    }();
    return prices;
}

Holdings byValue(const std::vector<double> &exposures)
{
    const char *names[] = {"DAX", "SMI", "CAC", "FTSE"};
    Holdings h;
    for (std::size_t i = 0; i < exposures.size(); ++i) {
        Holding x;
        x.asset = names[i];
        x.value = exposures[i];
        h.push_back(x);
    }
    return h;
}

const std::vector<double> longBook{400000.0, 250000.0, 200000.0, 150000.0};
const std::vector<double> longShortBook{500000.0, -300000.0, 150000.0, -100000.0};

Assumptions baseAssumptions(RiskModel model)
{
    Assumptions a;
    a.window = 500;
    a.model = model;
    a.simulations = 20000;
    a.seed = 7;
    return a;
}

RiskReport run(const std::vector<double> &book, const Assumptions &a)
{
    auto r = computeRisk(euPrices(), byValue(book), a);
    if (!r)
        qFatal("computeRisk failed: %s", r.error().message.c_str());
    return r.value();
}

double sumOf(const RiskReport &r, double HoldingRisk::*field)
{
    double s = 0.0;
    for (const auto &h : r.holdings)
        s += h.*field;
    return s;
}

} // namespace

class TestAllocation : public QObject {
    Q_OBJECT

private slots:
    // Euler's theorem (common practice for the closed forms; Tasche 1999) and the tail-mean
    // identity (Acerbi & Tasche 2002): the components add up to the model's VaR and ES.
    void componentsAddUp_data()
    {
        QTest::addColumn<int>("model");
        QTest::addColumn<int>("horizon");
        QTest::addColumn<int>("hsHorizon");
        QTest::addColumn<bool>("longShort");
        const RiskModel models[] = {RiskModel::Normal, RiskModel::StudentT, RiskModel::CornishFisher,
                                    RiskModel::Historical, RiskModel::MonteCarlo};
        for (RiskModel m : models)
            for (int h : {1, 10})
                for (bool ls : {false, true}) {
                    QTest::addRow("%s H=%d %s", toName(m).data(), h, ls ? "long-short" : "long")
                        << static_cast<int>(m) << h << 0 << ls;
                    if (m == RiskModel::Historical && h > 1)
                        QTest::addRow("historical overlapping H=%d %s", h, ls ? "long-short" : "long")
                            << static_cast<int>(m) << h << 1 << ls;
                }
    }
    void componentsAddUp()
    {
        QFETCH(int, model);
        QFETCH(int, horizon);
        QFETCH(int, hsHorizon);
        QFETCH(bool, longShort);
        Assumptions a = baseAssumptions(static_cast<RiskModel>(model));
        a.horizonDays = horizon;
        a.historicalHorizon = hsHorizon ? HistoricalHorizon::Overlapping : HistoricalHorizon::SquareRoot;
        a.mean = MeanModel::Sample;
        const RiskReport r = run(longShort ? longShortBook : longBook, a);
        QCOMPARE(r.model.used, a.model);
        QCOMPARE(r.model.contributions, r.model.used);
        const bool scenarios = a.model == RiskModel::Historical || a.model == RiskModel::MonteCarlo;
        TW_CLOSE_REL(sumOf(r, &HoldingRisk::componentVar), r.figures.var, 1e-9);
        // Scenario ES: the same tail mean, summed in another order (exact up to rounding).
        TW_CLOSE_REL(sumOf(r, &HoldingRisk::componentEs), r.figures.es, scenarios ? 1e-13 : 1e-9);
        TW_CLOSE_REL(sumOf(r, &HoldingRisk::standaloneVar), r.undiversifiedVar, 1e-13);
        TW_CLOSE_ABS(r.undiversifiedVar - r.figures.var, r.diversificationBenefit, 1e-9 * r.undiversifiedVar);
        for (const auto &h : r.holdings)
            TW_CLOSE_REL(h.marginalVar * h.exposure, h.componentVar, 1e-12);
    }

    // The Student-t allocation is the normal allocation times t factor / z (allocation.h; with a
    // zero mean the drift term is absent).
    void studentTIsNormalTimesFactor()
    {
        Assumptions a = baseAssumptions(RiskModel::Normal);
        a.horizonDays = 10;
        const RiskReport normal = run(longShortBook, a);
        a.model = RiskModel::StudentT;
        a.dof = DegreesOfFreedom::given(5.0);
        const RiskReport t = run(longShortBook, a);
        const double ratioVar = studentTVarFactor(5.0, a.confidence) / normalQuantile(a.confidence);
        const double ratioEs = studentTEsFactor(5.0, a.confidence) / normalTailMeanFactor(a.confidence);
        for (std::size_t i = 0; i < t.holdings.size(); ++i) {
            TW_CLOSE_REL(t.holdings[i].componentVar, normal.holdings[i].componentVar * ratioVar, 1e-12);
            TW_CLOSE_REL(t.holdings[i].componentEs, normal.holdings[i].componentEs * ratioEs, 1e-12);
            TW_CLOSE_REL(t.holdings[i].standaloneVar, normal.holdings[i].standaloneVar * ratioVar, 1e-12);
        }
    }

    // Every model against tests/data/eu-allocation-fixture.json (NumPy/SciPy, see the script).
    void againstNumPyFixture()
    {
        const QJsonObject fixture = loadFixture();
        const QJsonArray cases = fixture.value("cases").toArray();
        QVERIFY(cases.size() >= 50);
        for (const QJsonValue &v : cases) {
            const QJsonObject c = v.toObject();
            const QString model = c.value("model").toString();
            Assumptions a = baseAssumptions(*parseRiskModel(model.toStdString()));
            a.horizonDays = c.value("horizon").toInt();
            a.confidence = c.value("confidence").toDouble();
            a.mean = c.value("mean").toString() == "sample" ? MeanModel::Sample : MeanModel::Zero;
            const bool aggregate = c.value("scaling").toString() == "aggregate";
            a.scaling = aggregate ? MultiDayScaling::Aggregate : MultiDayScaling::SquareRoot;
            if (c.contains("hs_horizon"))
                a.historicalHorizon = *parseHistoricalHorizon(c.value("hs_horizon").toString().toStdString());
            std::vector<double> book;
            for (const QJsonValue &x : c.value("exposures").toArray())
                book.push_back(x.toDouble());
            const RiskReport r = run(book, a);
            const QString name = QStringLiteral("%1 %2 %3 H=%4 C=%5 %6")
                                     .arg(model, c.value("portfolio").toString(), c.value("mean").toString())
                                     .arg(a.horizonDays)
                                     .arg(a.confidence)
                                     .arg(c.value("scaling").toString() + c.value("hs_horizon").toString());
            // SciPy 1.10's t.ppf is off by up to 2e-9 relative (test_models notes it); the rest
            // agrees to the quadrature's and the sums' rounding.
            const double rel = model == "student-t" ? 1e-8 : 1e-9;
            TW_CLOSE_REL_CTX(r.figures.var, c.value("var").toDouble(), rel, name);
            TW_CLOSE_REL_CTX(r.figures.es, c.value("es").toDouble(), rel, name);
            if (c.contains("horizon_dof"))
                TW_CLOSE_REL_CTX(*r.model.horizonDof, c.value("horizon_dof").toDouble(), 1e-9, name);
            const auto check = [&](const char *key, double HoldingRisk::*field, double scale) {
                const QJsonArray expected = c.value(key).toArray();
                for (int i = 0; i < expected.size(); ++i)
                    TW_CLOSE_ABS_CTX(r.holdings[static_cast<std::size_t>(i)].*field, expected.at(i).toDouble(),
                                     rel * scale, name + " " + key + QString::number(i));
            };
            check("component_var", &HoldingRisk::componentVar, std::abs(r.figures.var));
            check("component_es", &HoldingRisk::componentEs, std::abs(r.figures.es));
            check("standalone_var", &HoldingRisk::standaloneVar, r.undiversifiedVar);
            check("standalone_es", &HoldingRisk::standaloneEs, r.undiversifiedVar);
        }
    }

    // The Cornish–Fisher component is e_i ∂VaR/∂e_i: central differences of the model's own VaR
    // (computeRisk) in each exposure, relative step 1e-6 (common practice for checking a gradient).
    void cornishFisherAgainstFiniteDifferences()
    {
        for (const auto &book : {longBook, longShortBook})
            {
                Assumptions a = baseAssumptions(RiskModel::CornishFisher);
                a.horizonDays = 10;
                a.mean = MeanModel::Sample;
                const RiskReport r = run(book, a);
                for (std::size_t i = 0; i < book.size(); ++i) {
                    const double step = 1e-6 * std::abs(book[i]);
                    auto up = book, down = book;
                    up[i] += step;
                    down[i] -= step;
                    const RiskReport ru = run(up, a), rd = run(down, a);
                    const double dVar = (ru.figures.var - rd.figures.var) / (2.0 * step);
                    const double dEs = (ru.figures.es - rd.figures.es) / (2.0 * step);
                    TW_CLOSE_REL(r.holdings[i].marginalVar, dVar, 1e-6);
                    TW_CLOSE_REL(r.holdings[i].componentEs / book[i], dEs, 1e-6);
                }
            }
    }

    // A negative benefit is shown as it is: Cornish–Fisher VaR is not subadditive (a book where the
    // holdings' own shapes are milder than the portfolio's can have VaR > Σ standalone).
    void diversificationIsTheModelsOwnSubtraction()
    {
        for (RiskModel m : {RiskModel::StudentT, RiskModel::CornishFisher, RiskModel::Historical}) {
            const RiskReport r = run(longShortBook, baseAssumptions(m));
            double standalone = 0.0;
            for (const auto &h : r.holdings)
                standalone += h.standaloneVar;
            TW_CLOSE_REL(r.diversificationBenefit, standalone - r.figures.var, 1e-12);
        }
    }

    // Monte Carlo standalone figures are the model run on the holding alone with the same seed.
    void monteCarloStandaloneIsTheHoldingAlone()
    {
        Assumptions a = baseAssumptions(RiskModel::MonteCarlo);
        a.horizonDays = 5;
        a.mean = MeanModel::Sample;
        const RiskReport r = run(longShortBook, a);
        const char *names[] = {"DAX", "SMI", "CAC", "FTSE"};
        for (std::size_t i = 0; i < longShortBook.size(); ++i) {
            Holding one;
            one.asset = names[i];
            one.value = longShortBook[i];
            const auto alone = computeRisk(euPrices(), Holdings{one}, a);
            QVERIFY(alone.ok());
            TW_CLOSE_REL(r.holdings[i].standaloneVar, alone.value().figures.var, 1e-12);
            TW_CLOSE_REL(r.holdings[i].standaloneEs, alone.value().figures.es, 1e-12);
        }
    }

    // The grid under the chosen model: the cell at the headline's (H, C) is the headline.
    void gridCellIsTheHeadline_data()
    {
        QTest::addColumn<int>("model");
        QTest::addColumn<int>("variant");
        QTest::newRow("historical sqrt") << static_cast<int>(RiskModel::Historical) << 0;
        QTest::newRow("historical overlapping") << static_cast<int>(RiskModel::Historical) << 1;
        QTest::newRow("student-t sqrt") << static_cast<int>(RiskModel::StudentT) << 0;
        QTest::newRow("cornish-fisher sqrt") << static_cast<int>(RiskModel::CornishFisher) << 0;
        QTest::newRow("normal") << static_cast<int>(RiskModel::Normal) << 0;
        QTest::newRow("monte-carlo") << static_cast<int>(RiskModel::MonteCarlo) << 0;
    }
    void gridCellIsTheHeadline()
    {
        QFETCH(int, model);
        QFETCH(int, variant);
        for (int h : {1, 10}) {
            for (double conf : {0.95, 0.975, 0.99}) {
                Assumptions a = baseAssumptions(static_cast<RiskModel>(model));
                a.horizonDays = h;
                a.confidence = conf;
                a.mean = MeanModel::Sample;
                if (variant == 1)
                    a.historicalHorizon = HistoricalHorizon::Overlapping;
                const RiskReport r = run(longShortBook, a);
                auto grid = modelRiskGrid(r, {1, 5, 10, 20}, {0.95, 0.975, 0.99});
                QVERIFY(grid.ok());
                const std::size_t row = h == 1 ? 0 : 2;
                const std::size_t col = conf == 0.95 ? 0 : conf == 0.975 ? 1 : 2;
                if (a.model == RiskModel::MonteCarlo || a.model == RiskModel::Normal) {
                    // The same draws through a positive affine map: equal up to rounding.
                    TW_CLOSE_REL(grid.value().varAt(row, col), r.figures.var, 1e-12);
                    TW_CLOSE_REL(grid.value().esAt(row, col), r.figures.es, 1e-12);
                } else {
                    QCOMPARE(grid.value().varAt(row, col), r.figures.var);
                    QCOMPARE(grid.value().esAt(row, col), r.figures.es);
                }
            }
        }
    }

    // Aggregate scaling, ν of the H-day sum: 4 + 6/(K/H) = 4 + H(ν − 4) (multidayscaling.h); unchanged
    // for ν ≤ 4.
    void aggregateDegreesOfFreedom()
    {
        QCOMPARE(aggregateDof(10.0, 10), 64.0);
        QCOMPARE(aggregateDof(3.5, 10), 3.5);
        QCOMPARE(aggregateDof(8.0, 1), 8.0);
        // The grid under aggregate scaling: its cell at (H, C) is the aggregate figure.
        for (RiskModel m : {RiskModel::StudentT, RiskModel::CornishFisher}) {
            Assumptions a = baseAssumptions(m);
            a.horizonDays = 10;
            a.mean = MeanModel::Sample;
            a.scaling = MultiDayScaling::Aggregate;
            const RiskReport r = run(longShortBook, a);
            auto grid = modelRiskGrid(r, {1, 10}, {0.95, 0.99});
            QVERIFY(grid.ok());
            TW_CLOSE_REL(grid.value().varAt(1, 1), r.figures.var, 1e-12);
            TW_CLOSE_REL(grid.value().esAt(1, 1), r.figures.es, 1e-12);
            // and the aggregate allocation adds up like the others
            double sum = 0.0;
            for (const auto &h : r.holdings)
                sum += h.componentVar;
            TW_CLOSE_REL(sum, r.figures.var, 1e-9);
            // The grid's one-day row under aggregate scaling is the one-day model (H = 1: S/√1, K/1).
            a.horizonDays = 1;
            const RiskReport one = run(longShortBook, a);
            QCOMPARE(grid.value().varAt(0, 1), one.figures.var);
        }
    }

    // At one day the two conventions are the same model (S/√1 = S, K/1 = K, ν_1 = ν): every figure
    // is identical to the bit (multidayscaling.h).
    void oneDayIsTheSameUnderBothScalings()
    {
        for (RiskModel m : {RiskModel::StudentT, RiskModel::CornishFisher})
            for (const auto *book : {&longBook, &longShortBook}) {
                Assumptions a = baseAssumptions(m);
                a.mean = MeanModel::Sample;
                const RiskReport root = run(*book, a);
                a.scaling = MultiDayScaling::Aggregate;
                const RiskReport sum = run(*book, a);
                QCOMPARE(sum.figures.var, root.figures.var);
                QCOMPARE(sum.figures.es, root.figures.es);
                QCOMPARE(sum.undiversifiedVar, root.undiversifiedVar);
                for (std::size_t i = 0; i < root.holdings.size(); ++i) {
                    QCOMPARE(sum.holdings[i].componentVar, root.holdings[i].componentVar);
                    QCOMPARE(sum.holdings[i].componentEs, root.holdings[i].componentEs);
                    QCOMPARE(sum.holdings[i].standaloneVar, root.holdings[i].standaloneVar);
                }
                QCOMPARE(sum.warnings, root.warnings);
            }
    }

    // Student-t with ν ≤ 4 has no finite kurtosis to divide by H: aggregate scaling keeps ν (the
    // figures are those of square-root scaling) and says so in a warning.
    void aggregateKeepsDofOfFourOrLess()
    {
        Assumptions a = baseAssumptions(RiskModel::StudentT);
        a.dof = DegreesOfFreedom::given(3.5);
        a.horizonDays = 10;
        const RiskReport root = run(longBook, a);
        a.scaling = MultiDayScaling::Aggregate;
        const RiskReport sum = run(longBook, a);
        QCOMPARE(*sum.model.horizonDof, 3.5);
        QCOMPARE(sum.figures.var, root.figures.var);
        QCOMPARE(sum.figures.es, root.figures.es);
        bool said = false;
        for (const auto &w : sum.warnings)
            said = said || w.find("aggregate scaling keeps 3.5") != std::string::npos;
        QVERIFY(said);
        for (const auto &w : root.warnings)
            QVERIFY(w.find("aggregate scaling") == std::string::npos);
        // Above 4 the H-day ν is 4 + H(ν − 4): ν = 6, H = 10 gives 24, with no such warning.
        a.dof = DegreesOfFreedom::given(6.0);
        const RiskReport six = run(longBook, a);
        QCOMPARE(*six.model.horizonDof, 24.0);
        for (const auto &w : six.warnings)
            QVERIFY(w.find("aggregate scaling") == std::string::npos);
    }
};

QTEST_GUILESS_MAIN(TestAllocation)
#include "test_allocation.moc"

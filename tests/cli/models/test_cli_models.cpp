// `tailwise-cli var --model …`, `--trade`, `--scenario` and `--worst-days` as a user runs them, on
// the real data set: exit status, the JSON members each adds, finiteness, and messages that name
// the option or the file, line and column. Historical figures are compared with the NumPy fixture
// tests/data/eu-models-fixture.json (tests/core/make_models_fixture.py).
#include "../../core/closeness.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QProcess>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>

namespace {

const QString cli = QStringLiteral(TAILWISE_CLI);
const QString dataDir = QStringLiteral(TAILWISE_TEST_DATA_DIR);
const QString euPrices = dataDir + "/eu-stock-indices-1991-1998.csv";

struct Run {
    int exitCode = -1;
    QString out;
    QString err;
};

Run runCli(const QStringList &args)
{
    QProcess p;
    p.start(cli, args);
    Run r;
    if (!p.waitForFinished(60000) || p.exitStatus() != QProcess::NormalExit) {
        r.err = QStringLiteral("tailwise-cli did not finish normally: ") + p.errorString();
        return r;
    }
    r.exitCode = p.exitCode();
    r.out = QString::fromUtf8(p.readAllStandardOutput());
    r.err = QString::fromUtf8(p.readAllStandardError());
    return r;
}

bool allFinite(const QJsonValue &v)
{
    if (v.isDouble())
        return std::isfinite(v.toDouble());
    if (v.isArray()) {
        for (const auto x : v.toArray())
            if (!allFinite(x))
                return false;
    }
    if (v.isObject()) {
        const QJsonObject o = v.toObject();
        for (auto it = o.begin(); it != o.end(); ++it)
            if (!allFinite(it.value()))
                return false;
    }
    return true;
}

QString writeFile(const QTemporaryDir &dir, const QString &name, const QByteArray &text)
{
    const QString path = dir.filePath(name);
    QFile f(path);
    if (f.open(QIODevice::WriteOnly))
        f.write(text);
    return path;
}

} // namespace

class TestCliModels : public QObject {
    Q_OBJECT

    QTemporaryDir m_dir;
    QString m_holdings; // the fixture's "long" portfolio by value

    QJsonObject json(const QStringList &args)
    {
        const Run r = runCli(QStringList{"var", "--prices", euPrices, "--holdings", m_holdings, "--json"} + args);
        if (r.exitCode != 0) {
            qWarning("%s", qPrintable(QStringLiteral("exit %1: %2").arg(r.exitCode).arg(r.err)));
            return {};
        }
        QJsonParseError e;
        const QJsonDocument doc = QJsonDocument::fromJson(r.out.toUtf8(), &e);
        return e.error == QJsonParseError::NoError ? doc.object() : QJsonObject{};
    }

private slots:
    void initTestCase()
    {
        QVERIFY(m_dir.isValid());
        m_holdings = writeFile(m_dir, "long.csv", "asset,value\nDAX,400000\nSMI,250000\nCAC,200000\nFTSE,150000\n");
    }

    void everyModelRuns_data()
    {
        QTest::addColumn<QString>("model");
        for (const char *m : {"normal", "student-t", "cornish-fisher", "historical", "monte-carlo"})
            QTest::newRow(m) << QString::fromLatin1(m);
    }
    void everyModelRuns()
    {
        QFETCH(QString, model);
        const QJsonObject o = json({"--model", model, "--window", "500"});
        QVERIFY(!o.isEmpty());
        QCOMPARE(o.value("model").toString(), model);
        QCOMPARE(o.value("model_used").toString(), model);
        // Every figure under the chosen model (allocation.h): the components add up to its VaR and
        // ES, and the diversification benefit is its own subtraction.
        QCOMPARE(o.value("contributions_model").toString(), model);
        double componentVar = 0.0, componentEs = 0.0, standalone = 0.0;
        for (const auto h : o.value("contributions").toArray()) {
            componentVar += h.toObject().value("component_var").toDouble();
            componentEs += h.toObject().value("component_es").toDouble();
            standalone += h.toObject().value("standalone_var").toDouble();
        }
        const double var = o.value("var").toDouble(), es = o.value("es").toDouble();
        QVERIFY(std::abs(componentVar - var) <= 1e-9 * var);
        QVERIFY(std::abs(componentEs - es) <= 1e-9 * es);
        QVERIFY(std::abs(standalone - o.value("undiversified_var").toDouble()) <= 1e-9 * standalone);
        QVERIFY(std::abs(o.value("undiversified_var").toDouble() - var - o.value("diversification_benefit").toDouble())
                <= 1e-9 * standalone);
        QVERIFY(o.value("var").toDouble() > 0.0);
        QVERIFY(o.value("es").toDouble() >= o.value("var").toDouble());
        QVERIFY(allFinite(o));
        QCOMPARE(o.contains("standard_error"), model == "monte-carlo");
    }

    // --grid: every cell under the chosen model (modelgrid.h); the cell at the run's own horizon
    // and confidence is the headline, to the bit for historical and Student-t.
    void gridFollowsTheModel_data()
    {
        QTest::addColumn<QString>("model");
        for (const char *m : {"normal", "student-t", "cornish-fisher", "historical", "monte-carlo"})
            QTest::newRow(m) << QString::fromLatin1(m);
    }
    void gridFollowsTheModel()
    {
        QFETCH(QString, model);
        const QJsonObject o = json({"--model", model, "--window", "500", "--horizon", "10", "--confidence", "0.975", "--grid"});
        QVERIFY(!o.isEmpty());
        const QJsonObject grid = o.value("grid").toObject();
        QCOMPARE(grid.value("model").toString(), model);
        const QJsonArray horizons = grid.value("horizons_days").toArray();
        const QJsonArray confidences = grid.value("confidences").toArray();
        int row = -1, column = -1;
        for (int k = 0; k < horizons.size(); ++k)
            if (horizons.at(k).toInt() == 10)
                row = k;
        for (int k = 0; k < confidences.size(); ++k)
            if (confidences.at(k).toDouble() == 0.975)
                column = k;
        QVERIFY(row >= 0 && column >= 0);
        const double cell = grid.value("var").toArray().at(row).toArray().at(column).toDouble();
        const double var = o.value("var").toDouble();
        if (model == "historical" || model == "student-t" || model == "cornish-fisher")
            QCOMPARE(cell, var);
        else
            QVERIFY(std::abs(cell - var) <= 1e-9 * var);
        const Run text = runCli({"var", "--prices", euPrices, "--holdings", m_holdings, "--model", model, "--window", "500", "--grid"});
        QCOMPARE(text.exitCode, 0);
        QVERIFY(text.out.contains(QStringLiteral("every cell under the %1 model").arg(model)));
    }

    void historicalMatchesNumPy()
    {
        // tests/data/eu-models-fixture.json, portfolio "long", window 500, C = 0.99, H = 10:
        // numpy.quantile(losses, C, method="linear"), square-root and overlapping horizons.
        QFile file(dataDir + "/eu-models-fixture.json");
        QVERIFY(file.open(QIODevice::ReadOnly));
        QJsonObject expected;
        for (const auto c : QJsonDocument::fromJson(file.readAll()).object().value("cases").toArray()) {
            const QJsonObject o = c.toObject();
            if (o.value("portfolio").toString() == "long" && o.value("window").toInt() == 500
                && o.value("confidence").toDouble() == 0.99 && o.value("horizon").toInt() == 10)
                expected = o;
        }
        QVERIFY(!expected.isEmpty());
        const QStringList base = {"--model", "historical", "--window", "500", "--horizon", "10"};
        const QJsonObject root = json(base);
        TW_CLOSE_REL(root.value("var").toDouble(), expected.value("historical_sqrt_var").toDouble(), 1e-9);
        TW_CLOSE_REL(root.value("es").toDouble(), expected.value("historical_sqrt_es").toDouble(), 1e-9);
        QCOMPARE(root.value("assumptions").toObject().value("hs_horizon").toString(), QStringLiteral("sqrt"));
        const QJsonObject ol = json(base + QStringList{"--hs-horizon", "overlapping"});
        TW_CLOSE_REL(ol.value("var").toDouble(), expected.value("historical_overlapping_var").toDouble(), 1e-9);
        QCOMPARE(ol.value("model_details").toObject().value("scenarios").toInt(),
                 expected.value("scenarios_overlapping").toInt());
    }

    void monteCarloSeeds()
    {
        const QStringList mc = {"--model", "monte-carlo", "--simulations", "20000"};
        const QJsonObject a = json(mc + QStringList{"--seed", "5"});
        const QJsonObject b = json(mc + QStringList{"--seed", "5"});
        const QJsonObject c = json(mc + QStringList{"--seed", "6"});
        QCOMPARE(a.value("var").toDouble(), b.value("var").toDouble());
        QVERIFY(a.value("var").toDouble() != c.value("var").toDouble());
        QVERIFY(a.value("standard_error").toDouble() > 0.0);
        QVERIFY(!a.value("standard_error_method").toString().isEmpty());
        QCOMPARE(a.value("assumptions").toObject().value("simulations").toInt(), 20000);
        QCOMPARE(a.value("assumptions").toObject().value("seed").toInt(), 5);
    }

    void studentTParameters()
    {
        const QJsonObject fit = json({"--model", "student-t", "--dof", "fit"});
        QCOMPARE(fit.value("assumptions").toObject().value("dof").toString(), QStringLiteral("fit"));
        QVERIFY(fit.value("model_details").toObject().value("dof").toDouble() > 4.0); // ν = 4 + 6/K
        QVERIFY(fit.value("model_details").toObject().value("dof_fitted").toBool());
        const QJsonObject five = json({"--model", "student-t", "--dof", "5"});
        QCOMPARE(five.value("assumptions").toObject().value("dof").toDouble(), 5.0);
        // VaR = 2.606463569 σ_h for ν = 5 at 99% (REFERENCE-VALUES §3, unit-variance t factor).
        TW_CLOSE_REL(five.value("var").toDouble(), 2.606463569 * five.value("horizon_sd_money").toDouble(), 1e-9);
    }

    void whatIfMembers()
    {
        const QJsonObject o = json({"--trade", "DAX:-10", "--trade", "CAC:5"});
        const QJsonObject w = o.value("what_if").toObject();
        for (const char *key : {"var_before", "var_after", "incremental_var", "marginal_estimate"})
            QVERIFY2(w.value(key).isDouble(), key);
        TW_CLOSE_REL(w.value("var_before").toDouble(), o.value("var").toDouble(), 1e-12);
        TW_CLOSE_REL(w.value("var_after").toDouble() - w.value("var_before").toDouble(),
                     w.value("incremental_var").toDouble(), 1e-9);
        QCOMPARE(w.value("trades").toArray().size(), 2);
    }

    void stressMembers()
    {
        const QString scenario = writeFile(m_dir, "crash.csv", "asset,shock\nDAX,-0.2\nFTSE,-0.1\n");
        const QJsonObject o = json({"--scenario", scenario});
        const QJsonArray stress = o.value("stress").toArray();
        QCOMPARE(stress.size(), 6); // the scenario, then the five worst days
        QCOMPARE(stress.at(0).toObject().value("name").toString(), QStringLiteral("crash"));
        // P&L = Σ e_i s_i = 400000 × −0.2 + 150000 × −0.1 (stress.h; holdings by value).
        TW_CLOSE_REL(stress.at(0).toObject().value("pnl").toDouble(), -95000.0, 1e-12);
        for (int k = 1; k < 6; ++k)
            QVERIFY(!stress.at(k).toObject().value("date").toString().isEmpty());
        const QJsonObject worst = json({"--worst-days"});
        QCOMPARE(worst.value("stress").toArray().size(), 5);
    }

    void refusalsNameTheOptionOrPlace_data()
    {
        QTest::addColumn<QStringList>("args");
        QTest::addColumn<int>("exitCode");
        QTest::addColumn<QString>("words");
        QTest::newRow("dof with normal") << QStringList{"--dof", "5"} << 2 << "--dof: applies to";
        QTest::newRow("dof too small") << QStringList{"--model", "student-t", "--dof", "2"} << 2 << "--dof:";
        QTest::newRow("dof not a number") << QStringList{"--model", "student-t", "--dof", "many"} << 2 << "--dof:";
        QTest::newRow("seed with historical") << QStringList{"--model", "historical", "--seed", "3"} << 2 << "--seed:";
        QTest::newRow("too few draws") << QStringList{"--model", "monte-carlo", "--simulations", "5"} << 2
                                       << "--simulations:";
        QTest::newRow("bad hs-horizon") << QStringList{"--model", "historical", "--hs-horizon", "weekly"} << 2
                                        << "--hs-horizon:";
        QTest::newRow("unknown model") << QStringList{"--model", "gaussian"} << 2 << "--model:";
        QTest::newRow("trade without colon") << QStringList{"--trade", "DAX"} << 2 << "--trade:";
        QTest::newRow("trade unknown asset") << QStringList{"--trade", "NIKKEI:5"} << 1 << "NIKKEI";
        QTest::newRow("missing scenario") << QStringList{"--scenario", "/nonexistent/s.csv"} << 1 << "/nonexistent/s.csv";
    }
    void refusalsNameTheOptionOrPlace()
    {
        QFETCH(QStringList, args);
        QFETCH(int, exitCode);
        QFETCH(QString, words);
        const Run r = runCli(QStringList{"var", "--prices", euPrices, "--holdings", m_holdings} + args);
        QCOMPARE(r.exitCode, exitCode);
        QVERIFY2(r.err.contains(words), qPrintable(r.err));
        QVERIFY(r.out.isEmpty());
    }

    void badScenarioNamesLineAndColumn()
    {
        const QString scenario = writeFile(m_dir, "bad.csv", "asset,shock\nDAX,-0.2\nFTSE,lots\n");
        const Run r = runCli({"var", "--prices", euPrices, "--holdings", m_holdings, "--scenario", scenario});
        QCOMPARE(r.exitCode, 1);
        QVERIFY2(r.err.contains(scenario + ", line 3, column 2"), qPrintable(r.err));
    }

    void readableReportShowsTheSections()
    {
        const QString scenario = writeFile(m_dir, "crash2.csv", "asset,shock\nDAX,-0.2\n");
        const Run r = runCli({"var", "--prices", euPrices, "--holdings", m_holdings, "--model", "monte-carlo",
                              "--simulations", "5000", "--trade", "DAX:1", "--scenario", scenario});
        QCOMPARE(r.exitCode, 0);
        for (const char *words : {"Monte Carlo, 5000 draws", "Standard error", "What-if trade", "Incremental VaR",
                                  "Marginal estimate", "Stress", "crash2", "worst day 1", "Cautions"})
            QVERIFY2(r.out.contains(QLatin1String(words)), words);
    }

    void helpExplainsEachOption()
    {
        const Run r = runCli({"var", "--help"});
        QCOMPARE(r.exitCode, 0);
        for (const char *option : {"--model", "student-t", "cornish-fisher", "historical", "monte-carlo", "--dof",
                                   "--hs-horizon", "--simulations", "--seed", "--trade", "--scenario", "--worst-days"})
            QVERIFY2(r.out.contains(QLatin1String(option)), option);
    }
};

QTEST_GUILESS_MAIN(TestCliModels)
#include "test_cli_models.moc"

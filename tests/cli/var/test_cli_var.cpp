// `tailwise-cli var` as a user runs it: on the invented sample and on the real data set, readable
// and JSON output, exit status 1 for bad files (the message names file, line and column) and 2 for
// bad usage (the message names the option), and a --help that explains every option.
// The JSON figures on the real data are compared with the NumPy/SciPy fixture of test_realdata.
#include "../../core/closeness.h"

#include <QDir>
#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QProcess>
#include <QRegularExpression>
#include <QSet>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>

namespace {

const QString cli = QStringLiteral(TAILWISE_CLI);
const QString sourceDir = QStringLiteral(TAILWISE_SOURCE_DIR);
const QString dataDir = QStringLiteral(TAILWISE_TEST_DATA_DIR);
const QString samplePrices = sourceDir + "/samples/prices.csv";
const QString sampleHoldings = sourceDir + "/samples/holdings.csv";
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
    if (!p.waitForFinished(30000) || p.exitStatus() != QProcess::NormalExit) {
        r.err = QStringLiteral("tailwise-cli did not finish normally: ") + p.errorString();
        return r;
    }
    r.exitCode = p.exitCode();
    r.out = QString::fromUtf8(p.readAllStandardOutput());
    r.err = QString::fromUtf8(p.readAllStandardError());
    return r;
}

QString describe(const QStringList &args, const Run &r)
{
    return QStringLiteral("tailwise-cli %1\n   exit %2\n   stdout: %3\n   stderr: %4")
        .arg(args.join(' '))
        .arg(r.exitCode)
        .arg(r.out.left(600), r.err.left(600));
}

// Every key issue 2 requires of the JSON object, and of each contribution.
const QStringList topKeys = {"portfolio_value", "confidence", "horizon_days", "model", "horizon_mean_money",
                             "horizon_sd_money", "var", "var_fraction", "es", "es_fraction", "undiversified_var",
                             "diversification_benefit", "contributions", "warnings"};
const QStringList contributionKeys = {"asset", "exposure", "weight", "marginal_var", "component_var",
                                      "component_share"};

// No NaN or infinity anywhere: QJsonDocument would refuse the tokens, and every number it read
// must be finite.
bool allFinite(const QJsonValue &v, QString &where, const QString &path)
{
    if (v.isDouble() && !std::isfinite(v.toDouble())) {
        where = path;
        return false;
    }
    if (v.isArray()) {
        const QJsonArray a = v.toArray();
        for (qsizetype i = 0; i < a.size(); ++i)
            if (!allFinite(a[i], where, path + "[" + QString::number(i) + "]"))
                return false;
    }
    if (v.isObject()) {
        const QJsonObject o = v.toObject();
        for (auto it = o.begin(); it != o.end(); ++it)
            if (!allFinite(it.value(), where, path + "." + it.key()))
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

class TestCliVar : public QObject {
    Q_OBJECT

    // Runs with --json, checks exit 0 and the required shape, and returns the object.
    bool runJson(const QStringList &args, QJsonObject &out)
    {
        const Run r = runCli(args + QStringList{"--json"});
        if (r.exitCode != 0) {
            QTest::qFail(qPrintable(describe(args, r)), __FILE__, __LINE__);
            return false;
        }
        QJsonParseError error;
        const QJsonDocument doc = QJsonDocument::fromJson(r.out.toUtf8(), &error);
        if (doc.isNull() || !doc.isObject()) {
            QTest::qFail(qPrintable("the output is not one JSON object: " + error.errorString() + "\n" + describe(args, r)),
                         __FILE__, __LINE__);
            return false;
        }
        out = doc.object();
        for (const QString &key : topKeys)
            if (!out.contains(key)) {
                QTest::qFail(qPrintable("missing key \"" + key + "\"\n" + describe(args, r)), __FILE__, __LINE__);
                return false;
            }
        for (const QJsonValue &c : out["contributions"].toArray())
            for (const QString &key : contributionKeys)
                if (!c.toObject().contains(key)) {
                    QTest::qFail(qPrintable("a contribution lacks \"" + key + "\"\n" + describe(args, r)), __FILE__, __LINE__);
                    return false;
                }
        QString where;
        if (!allFinite(out, where, QStringLiteral("$")) || r.out.contains(QRegularExpression("\\b(nan|inf|NaN|Infinity)\\b"))) {
            QTest::qFail(qPrintable("a non-finite number at " + where + "\n" + describe(args, r)), __FILE__, __LINE__);
            return false;
        }
        return true;
    }

    void expectExit(const QStringList &args, int code, const QStringList &mentions)
    {
        const Run r = runCli(args);
        QVERIFY2(r.exitCode == code, qPrintable(QStringLiteral("expected exit %1\n").arg(code) + describe(args, r)));
        QVERIFY2(r.out.isEmpty(), qPrintable("nothing belongs on stdout after a refusal\n" + describe(args, r)));
        for (const QString &m : mentions)
            QVERIFY2(r.err.contains(m), qPrintable("stderr should mention \"" + m + "\"\n" + describe(args, r)));
    }

private slots:
    void sampleReadableReport()
    {
        const QStringList args{"var", "--prices", samplePrices, "--holdings", sampleHoldings};
        const Run r = runCli(args);
        QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
        for (const char *phrase : {"Portfolio value", "Value-at-Risk", "Expected Shortfall", "Undiversified VaR",
                                   "Contributions", "Cautions", "not the worst case", "not advice"})
            QVERIFY2(r.out.contains(phrase), qPrintable(QStringLiteral("missing \"%1\"\n").arg(phrase) + describe(args, r)));
        // Every holding of the sample appears in the table.
        QFile holdings(sampleHoldings);
        QVERIFY(holdings.open(QIODevice::ReadOnly));
        const QStringList lines = QString::fromUtf8(holdings.readAll()).split('\n', Qt::SkipEmptyParts);
        for (qsizetype i = 1; i < lines.size(); ++i) {
            const QString asset = lines[i].section(',', 0, 0).trimmed();
            QVERIFY2(r.out.contains(asset), qPrintable("missing holding " + asset));
        }
        QVERIFY2(!r.out.contains(QRegularExpression("\\b(nan|inf)\\b", QRegularExpression::CaseInsensitiveOption)),
                 qPrintable(describe(args, r)));
    }

    void sampleJson()
    {
        QJsonObject j;
        if (!runJson({"var", "--prices", samplePrices, "--holdings", sampleHoldings}, j))
            return;
        QCOMPARE(j["model"].toString(), QStringLiteral("normal"));
        QCOMPARE(j["confidence"].toDouble(), 0.99); // the defaults of issue 2
        QCOMPARE(j["horizon_days"].toInt(), 1);
        QCOMPARE(j["contributions"].toArray().size(), 13);
        // The JSON is self-consistent under issue 2's definitions.
        const double var = j["var"].toDouble();
        const double value = j["portfolio_value"].toDouble();
        double components = 0.0, shares = 0.0, exposures = 0.0;
        for (const QJsonValue &c : j["contributions"].toArray()) {
            const QJsonObject o = c.toObject();
            components += o["component_var"].toDouble();
            shares += o["component_share"].toDouble();
            exposures += o["exposure"].toDouble();
            TW_CLOSE_REL_CTX(o["component_var"].toDouble(), o["exposure"].toDouble() * o["marginal_var"].toDouble(), 1e-12,
                             o["asset"].toString());
            TW_CLOSE_REL_CTX(o["weight"].toDouble(), o["exposure"].toDouble() / value, 1e-12, o["asset"].toString());
        }
        TW_CLOSE_REL(components, var, 1e-12);          // Euler: components add up to VaR
        TW_CLOSE_REL(shares, 1.0, 1e-12);
        TW_CLOSE_REL(exposures, value, 1e-12);         // V = Σ e_i
        TW_CLOSE_REL(j["var_fraction"].toDouble(), var / value, 1e-12);
        TW_CLOSE_REL(j["es_fraction"].toDouble(), j["es"].toDouble() / value, 1e-12);
        TW_CLOSE_REL(j["diversification_benefit"].toDouble(), j["undiversified_var"].toDouble() - var, 1e-9);
        // Zero mean by default: VaR = z σ_h with z = Φ⁻¹(0.99) = 2.326347874 (A&S Table 26.5 / SciPy).
        QCOMPARE(j["horizon_mean_money"].toDouble(), 0.0);
        TW_CLOSE_REL(var, 2.326347874 * j["horizon_sd_money"].toDouble(), 1e-9);
        TW_CLOSE_REL(j["es"].toDouble(), 2.66521422 * j["horizon_sd_money"].toDouble(), 1e-8); // MFE factor, REF §2
    }

    void realDataAgreesWithNumpy_data()
    {
        QTest::addColumn<QString>("portfolio");
        QTest::addColumn<QString>("window");
        QTest::addColumn<QString>("estimator");
        QTest::addColumn<double>("lambda");
        QTest::addColumn<QString>("returns");
        QTest::addColumn<QString>("mean");
        QTest::newRow("long, all, sample") << "long" << "all" << "sample" << 0.94 << "simple" << "zero";
        QTest::newRow("short, 250, ewma 0.94, log, sample mean") << "short" << "250" << "ewma" << 0.94 << "log" << "sample";
        QTest::newRow("value, 60, ewma 0.97") << "value" << "60" << "ewma" << 0.97 << "simple" << "sample";
        QTest::newRow("single, 500, sample, log") << "single" << "500" << "sample" << 0.94 << "log" << "zero";
    }

    void realDataAgreesWithNumpy()
    {
        // The same figures as test_realdata, through the command line: tests/data/eu-realdata-
        // fixture.json (NumPy/SciPy, see tests/data/README.md), 1e-9 relative.
        QFETCH(QString, portfolio);
        QFETCH(QString, window);
        QFETCH(QString, estimator);
        QFETCH(double, lambda);
        QFETCH(QString, returns);
        QFETCH(QString, mean);
        QFile file(dataDir + "/eu-realdata-fixture.json");
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QJsonArray cases = QJsonDocument::fromJson(file.readAll()).object()["cases"].toArray();
        int compared = 0;
        for (const QJsonValue &v : cases) {
            const QJsonObject c = v.toObject();
            const QString caseWindow = c["window"].isDouble() ? QString::number(c["window"].toInt()) : c["window"].toString();
            if (c["portfolio"].toString() != portfolio || caseWindow != window || c["estimator"].toString() != estimator
                || c["lambda"].toDouble() != lambda || c["returns"].toString() != returns || c["mean"].toString() != mean)
                continue;
            QStringList args{"var", "--prices", euPrices, "--holdings", dataDir + "/" + c["holdings_file"].toString(),
                             "--window", window, "--estimator", estimator, "--returns", returns, "--mean", mean,
                             "--horizon", QString::number(c["horizon"].toInt()),
                             "--confidence", QString::number(c["confidence"].toDouble())};
            if (estimator == "ewma")
                args << "--lambda" << QString::number(lambda);
            QJsonObject j;
            if (!runJson(args, j))
                return;
            const QString name = args.mid(5).join(' ');
            TW_CLOSE_REL_CTX(j["portfolio_value"].toDouble(), c["portfolio_value"].toDouble(), 1e-9, name);
            TW_CLOSE_REL_CTX(j["horizon_sd_money"].toDouble(), c["horizon_sd_money"].toDouble(), 1e-9, name);
            TW_CLOSE_REL_CTX(j["horizon_mean_money"].toDouble(), c["horizon_mean_money"].toDouble(), 1e-9, name);
            TW_CLOSE_REL_CTX(j["var"].toDouble(), c["var"].toDouble(), 1e-9, name);
            TW_CLOSE_REL_CTX(j["es"].toDouble(), c["es"].toDouble(), 1e-9, name);
            TW_CLOSE_REL_CTX(j["undiversified_var"].toDouble(), c["undiversified_var"].toDouble(), 1e-9, name);
            const QJsonArray contributions = j["contributions"].toArray();
            QCOMPARE(contributions.size(), c["component_var"].toArray().size());
            for (qsizetype i = 0; i < contributions.size(); ++i) {
                const QJsonObject o = contributions[i].toObject();
                TW_CLOSE_REL_CTX(o["exposure"].toDouble(), c["exposures"].toArray()[i].toDouble(), 1e-9, name);
                TW_CLOSE_REL_CTX(o["marginal_var"].toDouble(), c["marginal_var"].toArray()[i].toDouble(), 1e-9, name);
                TW_CLOSE_REL_CTX(o["component_var"].toDouble(), c["component_var"].toArray()[i].toDouble(), 1e-9, name);
            }
            ++compared;
        }
        QVERIFY2(compared >= 2, qPrintable(QStringLiteral("only %1 fixture cases matched").arg(compared)));
    }

    void singlePosition()
    {
        // REFERENCE-VALUES.md §9 (common practice): V = 1e6, σ = 20%, 99%.
        QJsonObject j;
        if (!runJson({"var", "--value", "1000000", "--volatility", "0.2"}, j))
            return;
        TW_CLOSE_PRINTED(j["var"].toDouble(), 29309.22827);
        if (!runJson({"var", "--value", "1000000", "--volatility", "0.2", "--horizon", "10"}, j))
            return;
        TW_CLOSE_PRINTED(j["var"].toDouble(), 92683.91781);
        if (!runJson({"var", "--value", "1000000", "--volatility", "0.2", "--days-per-year", "250"}, j))
            return;
        TW_CLOSE_PRINTED(j["var"].toDouble(), 29426.23165);
        // Drift M: μ_h = M·H/N·V (issue 2), 1e6·0.1·10/252; VaR = 92683.91781 − 3968.253968.
        if (!runJson({"var", "--value", "1000000", "--volatility", "0.2", "--drift", "0.1", "--horizon", "10"}, j))
            return;
        TW_CLOSE_PRINTED(j["horizon_mean_money"].toDouble(), 3968.253968);
        TW_CLOSE_PRINTED(j["var"].toDouble(), 88715.66384);
        const Run text = runCli({"var", "--value", "1000000", "--volatility", "0.2"});
        QVERIFY2(text.exitCode == 0 && text.out.contains("29,309.23"), qPrintable(describe({"var", "--value", "1000000"}, text)));
    }

    void warningsAndZeroValueStayFinite()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        // A net value of zero: fractions are null, never NaN.
        const QString flat = writeFile(dir, "flat.csv", "asset,value\nDAX,1000\nSMI,-1000\n");
        QJsonObject j;
        if (!runJson({"var", "--prices", euPrices, "--holdings", flat}, j))
            return;
        QVERIFY(j["var_fraction"].isNull());
        QVERIFY(j["contributions"].toArray()[0].toObject()["weight"].isNull());
        QVERIFY(!j["warnings"].toArray().isEmpty());
        // A window no longer than the number of assets warns (issue 2), on stderr too with --json.
        const QStringList args{"var", "--prices", euPrices, "--holdings", dataDir + "/eu-holdings-long.csv", "--window", "3", "--json"};
        const Run r = runCli(args);
        QVERIFY2(r.exitCode == 0 && r.err.contains("warning"), qPrintable(describe(args, r)));
        QVERIFY2(QJsonDocument::fromJson(r.out.toUtf8()).object()["warnings"].toArray().size() >= 1, qPrintable(describe(args, r)));
    }

    void badFilesExitOne()
    {
        QTemporaryDir dir;
        QVERIFY(dir.isValid());
        const QString prices = writeFile(dir, "prices.csv", "date,A,B\n2020-01-01,1,2\n2020-01-02,1,2\n2020-01-03,1,x\n");
        const QString goodPrices = writeFile(dir, "good.csv", "date,A,B\n2020-01-01,1,2\n2020-01-02,1.1,2\n2020-01-03,1,2.1\n2020-01-06,1.2,2\n");
        const QString holdings = writeFile(dir, "holdings.csv", "asset,quantity\nA,1\nB,2\n");
        const QString unknown = writeFile(dir, "unknown.csv", "asset,quantity\nA,1\n\nZ,2\n");
        const QString badQty = writeFile(dir, "badqty.csv", "asset,quantity\r\nA,1\r\nB,two\r\n");
        expectExit({"var", "--prices", prices, "--holdings", holdings}, 1, {prices + ", line 4, column 3", "\"x\""});
        expectExit({"var", "--prices", goodPrices, "--holdings", unknown}, 1, {unknown + ", line 4, column 1", "\"Z\""});
        expectExit({"var", "--prices", goodPrices, "--holdings", badQty}, 1, {badQty + ", line 3, column 2", "\"two\""});
        expectExit({"var", "--prices", dir.filePath("none.csv"), "--holdings", holdings}, 1,
                   {dir.filePath("none.csv"), "does not exist"});
        expectExit({"var", "--prices", dir.path(), "--holdings", holdings}, 1, {"folder"});
        expectExit({"var", "--prices", goodPrices, "--holdings", dir.filePath("nope.csv")}, 1, {"nope.csv", "does not exist"});
        // More returns asked for than the file has: a data problem, named as the option.
        expectExit({"var", "--prices", goodPrices, "--holdings", holdings, "--window", "10"}, 1, {"--window", "only 3"});
    }

    void badUsageExitTwo_data()
    {
        QTest::addColumn<QStringList>("extra");
        QTest::addColumn<QString>("mentions");
        QTest::newRow("unknown flag") << QStringList{"--confidance", "0.9"} << "--confidance";
        QTest::newRow("confidence 1.5") << QStringList{"--confidence", "1.5"} << "--confidence";
        QTest::newRow("confidence 0") << QStringList{"--confidence", "0"} << "--confidence";
        QTest::newRow("confidence text") << QStringList{"--confidence", "high"} << "--confidence";
        QTest::newRow("confidence nan") << QStringList{"--confidence", "nan"} << "--confidence";
        QTest::newRow("horizon 0") << QStringList{"--horizon", "0"} << "--horizon";
        QTest::newRow("horizon 2.5") << QStringList{"--horizon", "2.5"} << "--horizon";
        QTest::newRow("lambda 1") << QStringList{"--lambda", "1"} << "--lambda";
        QTest::newRow("lambda 0") << QStringList{"--lambda", "0"} << "--lambda";
        QTest::newRow("window 1") << QStringList{"--window", "1"} << "--window";
        QTest::newRow("window text") << QStringList{"--window", "many"} << "--window";
        QTest::newRow("days-per-year 0") << QStringList{"--days-per-year", "0"} << "--days-per-year";
        QTest::newRow("returns") << QStringList{"--returns", "arithmetic"} << "--returns";
        QTest::newRow("estimator") << QStringList{"--estimator", "garch"} << "--estimator";
        QTest::newRow("mean") << QStringList{"--mean", "drift"} << "--mean";
        QTest::newRow("model") << QStringList{"--model", "magic"} << "--model";
        QTest::newRow("missing value") << QStringList{"--horizon"} << "--horizon";
        QTest::newRow("stray argument") << QStringList{"extra"} << "extra";
    }

    void badUsageExitTwo()
    {
        QFETCH(QStringList, extra);
        QFETCH(QString, mentions);
        expectExit(QStringList{"var", "--prices", samplePrices, "--holdings", sampleHoldings} + extra, 2, {mentions});
    }

    void badModeUsageExitTwo()
    {
        expectExit({}, 2, {"expected a command"});
        expectExit({"risk"}, 2, {"unknown command", "risk"});
        expectExit({"var"}, 2, {"--prices"});
        expectExit({"var", "--prices", samplePrices}, 2, {"--holdings"});
        expectExit({"var", "--value", "1000"}, 2, {"--volatility"});
        expectExit({"var", "--volatility", "0.2"}, 2, {"--value"});
        expectExit({"var", "--value", "1000", "--volatility", "-0.2"}, 2, {"--volatility"});
        expectExit({"var", "--prices", samplePrices, "--holdings", sampleHoldings, "--value", "1", "--volatility", "0.1"}, 2,
                   {"not both"});
    }

    void helpExplainsEveryOption()
    {
        const Run r = runCli({"var", "--help"});
        QVERIFY2(r.exitCode == 0, qPrintable(describe({"var", "--help"}, r)));
        // The options of issue 2 ...
        QSet<QString> options{"--prices", "--holdings", "--value", "--volatility", "--drift", "--confidence",
                              "--horizon", "--days-per-year", "--window", "--returns", "--estimator", "--lambda",
                              "--mean", "--model", "--json", "--help"};
        // ... and every option declared for var (app/cli/varoptions.cpp takes these groups; each
        // declaration carries its help text, so a new option cannot go unexplained).
        options += QSet<QString>{"--workbook", "--timings", "--dof", "--hs-horizon", "--simulations", "--seed",
                                 "--trade", "--scenario", "--worst-days"};
        for (const QString &option : options)
            QVERIFY2(r.out.contains(QRegularExpression("^\\s+" + QRegularExpression::escape(option) + "\\b",
                                                       QRegularExpression::MultilineOption)),
                     qPrintable("--help does not explain " + option + "\n" + r.out));
        QVERIFY(r.out.contains("Exit status"));
        QVERIFY(r.out.contains("not the worst case"));
        const Run top = runCli({"--help"});
        QVERIFY2(top.exitCode == 0 && top.out.contains("var"), qPrintable(describe({"--help"}, top)));
    }
};

QTEST_GUILESS_MAIN(TestCliVar)
#include "test_cli_var.moc"

// `tailwise-cli var --scaling sqrt|aggregate` as a user runs it, on the real data set
// (tests/data/eu-stock-indices-1991-1998.csv, window 500):
//   - VaR, ES and the horizon's ν / skewness / excess kurtosis under both conventions against
//     tests/data/eu-scaling-fixture.json, written by make_scaling_fixture.py beside this test from
//     the definitions with NumPy/SciPy: skewness S/√H and excess kurtosis K/H of the H-day sum,
//     the Student-t ν whose excess kurtosis 6/(ν − 4) equals K/H (ν kept when ν ≤ 4), the
//     Cornish–Fisher expansion as Zangari (1996) uses it, SciPy's Student-t quantile;
//   - square-root scaling is what the tool gave before the choice existed: `--scaling sqrt` prints
//     the same bytes as no option;
//   - at one day the two conventions give the same output;
//   - the ν ≤ 4 warning, the refusals naming the option (exit 2), and the workbook round trip
//     (pack --scaling, var --workbook).
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

QJsonObject parse(const Run &r)
{
    if (r.exitCode != 0) {
        qWarning("%s", qPrintable(QStringLiteral("exit %1: %2").arg(r.exitCode).arg(r.err)));
        return {};
    }
    QJsonParseError e;
    const QJsonDocument doc = QJsonDocument::fromJson(r.out.toUtf8(), &e);
    return e.error == QJsonParseError::NoError ? doc.object() : QJsonObject{};
}

QString writeFile(const QTemporaryDir &dir, const QString &name, const QByteArray &text)
{
    const QString path = dir.filePath(name);
    QFile f(path);
    if (f.open(QIODevice::WriteOnly))
        f.write(text);
    return path;
}

// The JSON without what names the convention itself (the assumption and the input hash, which
// covers the assumptions), to compare two runs' figures whole.
QJsonObject withoutConvention(QJsonObject o)
{
    o.remove(QStringLiteral("input_sha256"));
    QJsonObject a = o.value(QStringLiteral("assumptions")).toObject();
    a.remove(QStringLiteral("scaling"));
    o[QStringLiteral("assumptions")] = a;
    return o;
}

} // namespace

class TestCliScaling : public QObject {
    Q_OBJECT

    QTemporaryDir m_dir;
    QHash<QString, QString> m_holdings; // the fixture's portfolios by value

    QStringList base(const QString &portfolio) const
    {
        return {"var", "--prices", euPrices, "--holdings", m_holdings.value(portfolio), "--window", "500"};
    }

private slots:
    void initTestCase()
    {
        QVERIFY(m_dir.isValid());
        m_holdings["long"] = writeFile(m_dir, "long.csv", "asset,value\nDAX,400000\nSMI,250000\nCAC,200000\nFTSE,150000\n");
        m_holdings["long-short"] =
            writeFile(m_dir, "long-short.csv", "asset,value\nDAX,500000\nSMI,-300000\nCAC,150000\nFTSE,-100000\n");
    }

    // Every case of the fixture: the figures and what the horizon used, under the option given.
    void againstNumPyFixture()
    {
        QFile file(dataDir + "/eu-scaling-fixture.json");
        QVERIFY(file.open(QIODevice::ReadOnly));
        const QJsonObject fixture = QJsonDocument::fromJson(file.readAll()).object();
        QCOMPARE(fixture.value("window").toInt(), 500);
        const QJsonArray cases = fixture.value("cases").toArray();
        QCOMPARE(cases.size(), 96);
        for (const QJsonValue &v : cases) {
            const QJsonObject c = v.toObject();
            const QString model = c.value("model").toString();
            const QString scaling = c.value("scaling").toString();
            QStringList args = base(c.value("portfolio").toString());
            args << "--model" << model << "--horizon" << QString::number(c.value("horizon").toInt()) << "--confidence"
                 << QString::number(c.value("confidence").toDouble(), 'g', 17) << "--scaling" << scaling << "--json";
            if (model == "student-t")
                args << "--dof" << (c.value("dof").isString() ? c.value("dof").toString()
                                                               : QString::number(c.value("dof").toDouble(), 'g', 17));
            const QString name = args.mid(7).join(' ') + " " + c.value("portfolio").toString();
            const QJsonObject o = parse(runCli(args));
            QVERIFY2(!o.isEmpty(), qPrintable(name));
            QCOMPARE(o.value("model_used").toString(), model);
            QCOMPARE(o.value("assumptions").toObject().value("scaling").toString(), scaling);
            // SciPy 1.10's t.ppf is off by up to 2e-9 relative (tests/core/test_models notes it);
            // the Cornish–Fisher figures agree to the quadrature's rounding.
            const double rel = model == "student-t" ? 1e-8 : 1e-9;
            TW_CLOSE_REL_CTX(o.value("var").toDouble(), c.value("var").toDouble(), rel, name);
            TW_CLOSE_REL_CTX(o.value("es").toDouble(), c.value("es").toDouble(), rel, name);
            const QJsonObject details = o.value("model_details").toObject();
            if (model == "student-t") {
                TW_CLOSE_REL_CTX(details.value("dof").toDouble(), c.value("nu").toDouble(), 1e-9, name);
                TW_CLOSE_REL_CTX(details.value("horizon_dof").toDouble(), c.value("horizon_dof").toDouble(), 1e-9, name);
            } else {
                for (const char *key : {"skewness", "excess_kurtosis", "horizon_skewness", "horizon_excess_kurtosis"})
                    TW_CLOSE_REL_CTX(details.value(key).toDouble(), c.value(key).toDouble(), 1e-9,
                                     name + " " + key);
            }
        }
    }

    // Aggregate scaling changes the multi-day Student-t and Cornish–Fisher figures: the ten-day
    // sum is less fat-tailed (K/10), so at 99% its VaR is below √10 times the one-day VaR here, by
    // the amounts the fixture computes. The allocation follows: the components still add up.
    void aggregateChangesTheMultiDayFigures()
    {
        for (const char *model : {"student-t", "cornish-fisher"}) {
            const QStringList args = base("long") + QStringList{"--model", model, "--horizon", "10", "--json"};
            const QJsonObject root = parse(runCli(args + QStringList{"--scaling", "sqrt"}));
            const QJsonObject sum = parse(runCli(args + QStringList{"--scaling", "aggregate"}));
            QVERIFY(!root.isEmpty() && !sum.isEmpty());
            QVERIFY2(sum.value("var").toDouble() < root.value("var").toDouble() * (1.0 - 1e-3), model);
            QVERIFY2(sum.value("es").toDouble() < root.value("es").toDouble() * (1.0 - 1e-3), model);
            double componentVar = 0.0, standalone = 0.0;
            for (const auto h : sum.value("contributions").toArray()) {
                componentVar += h.toObject().value("component_var").toDouble();
                standalone += h.toObject().value("standalone_var").toDouble();
            }
            TW_CLOSE_REL(componentVar, sum.value("var").toDouble(), 1e-9);
            TW_CLOSE_REL(standalone, sum.value("undiversified_var").toDouble(), 1e-9);
            // The grid follows the convention: its cell at (10, 99%) is the headline.
            const QJsonObject grid =
                parse(runCli(args + QStringList{"--scaling", "aggregate", "--grid"})).value("grid").toObject();
            QCOMPARE(grid.value("scaling").toString(), QStringLiteral("aggregate"));
            const QJsonArray horizons = grid.value("horizons_days").toArray();
            const QJsonArray confidences = grid.value("confidences").toArray();
            for (int h = 0; h < horizons.size(); ++h)
                for (int k = 0; k < confidences.size(); ++k)
                    if (horizons.at(h).toInt() == 10 && confidences.at(k).toDouble() == 0.99)
                        QCOMPARE(grid.value("var").toArray().at(h).toArray().at(k).toDouble(), sum.value("var").toDouble());
        }
    }

    // Square-root scaling is the default and what the tool gave before the choice: the same bytes
    // with `--scaling sqrt` as without it, in text and JSON.
    void sqrtIsTheUnchangedDefault()
    {
        for (const char *model : {"student-t", "cornish-fisher"})
            for (const char *json : {"--json", "--grid"}) {
                const QStringList args = base("long-short") + QStringList{"--model", model, "--horizon", "10", json};
                const Run plain = runCli(args);
                const Run root = runCli(args + QStringList{"--scaling", "sqrt"});
                QCOMPARE(plain.exitCode, 0);
                QCOMPARE(root.exitCode, 0);
                QCOMPARE(root.out, plain.out);
            }
    }

    // At one day both conventions are the same model (S/√1, K/1, ν_1 = ν): the same figures,
    // contributions and warnings, to the bit.
    void oneDayIsTheSameUnderBoth()
    {
        for (const char *model : {"student-t", "cornish-fisher"})
            for (const char *portfolio : {"long", "long-short"}) {
                const QStringList args = base(portfolio) + QStringList{"--model", model, "--json"};
                const QJsonObject root = parse(runCli(args + QStringList{"--scaling", "sqrt"}));
                const QJsonObject sum = parse(runCli(args + QStringList{"--scaling", "aggregate"}));
                QVERIFY(!root.isEmpty() && !sum.isEmpty());
                QCOMPARE(sum.value("assumptions").toObject().value("scaling").toString(), QStringLiteral("aggregate"));
                QCOMPARE(withoutConvention(sum), withoutConvention(root));
            }
    }

    // Student-t with ν ≤ 4 under aggregate scaling: ν is kept, and the JSON and the text say so.
    void dofOfFourOrLessIsKeptWithAWarning()
    {
        const QStringList args = base("long") + QStringList{"--model", "student-t", "--dof", "3.5", "--horizon", "10",
                                                            "--scaling", "aggregate"};
        const Run json = runCli(args + QStringList{"--json"});
        const QJsonObject o = parse(json);
        QVERIFY(!o.isEmpty());
        QCOMPARE(o.value("model_details").toObject().value("horizon_dof").toDouble(), 3.5);
        bool said = false;
        for (const auto w : o.value("warnings").toArray())
            said = said || w.toString().contains(QStringLiteral("aggregate scaling keeps 3.5"));
        QVERIFY2(said, qPrintable(json.out));
        const Run text = runCli(args);
        QCOMPARE(text.exitCode, 0);
        QVERIFY2(text.out.contains(QStringLiteral("Longer horizons     the model applied to the sum of the horizon's days: "
                                                  "degrees of freedom kept at 3.5")),
                 qPrintable(text.out));
        QVERIFY2(text.out.contains(QStringLiteral("aggregate scaling keeps 3.5")), qPrintable(text.out));
        // Under square-root scaling there is nothing to keep: no such warning.
        const Run root = runCli(base("long") + QStringList{"--model", "student-t", "--dof", "3.5", "--horizon", "10"});
        QVERIFY(!root.out.contains(QStringLiteral("aggregate scaling")));
    }

    // The text output states the convention in words.
    void textStatesTheConvention()
    {
        const QStringList args = base("long") + QStringList{"--model", "student-t", "--dof", "8", "--horizon", "10"};
        const Run root = runCli(args);
        QVERIFY2(root.out.contains(QStringLiteral("Longer horizons     square root of time: the one-day figure times the "
                                                  "square root of the horizon, with one day's shape")),
                 qPrintable(root.out));
        const Run sum = runCli(args + QStringList{"--scaling", "aggregate"});
        // ν_10 = 4 + 10 (8 − 4) = 44.
        QVERIFY2(sum.out.contains(QStringLiteral("Longer horizons     the model applied to the sum of the horizon's days: "
                                                 "44 degrees of freedom for the 10-day sum")),
                 qPrintable(sum.out));
        const Run cf = runCli(base("long") + QStringList{"--model", "cornish-fisher", "--horizon", "10", "--scaling", "aggregate"});
        QVERIFY2(cf.out.contains(QStringLiteral("of the 10-day sum")), qPrintable(cf.out));
    }

    // Refusals name the option and exit 2.
    void refusalsNameTheOption_data()
    {
        QTest::addColumn<QStringList>("extra");
        QTest::addColumn<QString>("message");
        QTest::newRow("unknown value") << QStringList{"--model", "student-t", "--scaling", "cube-root"}
                                       << QStringLiteral("--scaling: expected 'sqrt' or 'aggregate', found \"cube-root\"");
        QTest::newRow("empty value") << QStringList{"--model", "student-t", "--scaling", ""}
                                     << QStringLiteral("--scaling: expected 'sqrt' or 'aggregate', found \"\"");
        QTest::newRow("given twice") << QStringList{"--model", "student-t", "--scaling", "sqrt", "--scaling", "aggregate"}
                                     << QStringLiteral("--scaling: given more than once");
        QTest::newRow("a model without it") << QStringList{"--model", "historical", "--scaling", "aggregate"}
                                            << QStringLiteral("--scaling: applies to --model student-t or cornish-fisher, "
                                                              "not historical");
        QTest::newRow("the normal default") << QStringList{"--scaling", "aggregate"}
                                            << QStringLiteral("--scaling: applies to --model student-t or cornish-fisher, "
                                                              "not normal");
    }
    void refusalsNameTheOption()
    {
        QFETCH(QStringList, extra);
        QFETCH(QString, message);
        const Run r = runCli(base("long") + extra);
        QCOMPARE(r.exitCode, 2);
        QVERIFY2(r.err.contains(message), qPrintable(r.err));
        QVERIFY(r.out.isEmpty());
    }

    // The workbook keeps the choice: pack --scaling aggregate, then var --workbook gives the
    // aggregate figures (and an option given there overrides the stored one).
    void workbookKeepsTheChoice()
    {
        const QString workbook = m_dir.filePath("aggregate.tailwise");
        const Run pack = runCli({"pack", "--prices", euPrices, "--holdings", m_holdings.value("long"), "--window", "500",
                                 "--horizon", "10", "--model", "cornish-fisher", "--scaling", "aggregate", "--out", workbook});
        QVERIFY2(pack.exitCode == 0, qPrintable(pack.err));
        const QJsonObject stored = parse(runCli({"var", "--workbook", workbook, "--json"}));
        const QJsonObject direct = parse(runCli(base("long") + QStringList{"--model", "cornish-fisher", "--horizon", "10",
                                                                            "--scaling", "aggregate", "--json"}));
        QVERIFY(!stored.isEmpty() && !direct.isEmpty());
        QCOMPARE(stored.value("assumptions").toObject().value("scaling").toString(), QStringLiteral("aggregate"));
        QCOMPARE(stored.value("var").toDouble(), direct.value("var").toDouble());
        QCOMPARE(stored.value("es").toDouble(), direct.value("es").toDouble());
        const QJsonObject overridden = parse(runCli({"var", "--workbook", workbook, "--scaling", "sqrt", "--json"}));
        QCOMPARE(overridden.value("assumptions").toObject().value("scaling").toString(), QStringLiteral("sqrt"));
        QVERIFY(overridden.value("var").toDouble() != stored.value("var").toDouble());
    }
};

QTEST_GUILESS_MAIN(TestCliScaling)
#include "test_cli_scaling.moc"

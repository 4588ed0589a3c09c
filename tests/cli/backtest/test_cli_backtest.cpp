// `tailwise-cli backtest` as a user runs it, on the real data set: the JSON figures equal the
// NumPy/SciPy fixture of tests/core/test_backtest.cpp (tests/data/backtest-eu-fixture.json, made
// by tests/core/make_backtest_fixture.py), the JSON has exactly the keys of issue 5, the readable
// report gives verdicts and cautions, and bad input exits 1 (naming the file, line or option) and
// bad usage 2 (naming the option).
#include "../../core/closeness.h"

#include <QFile>
#include <QJsonArray>
#include <QJsonDocument>
#include <QJsonObject>
#include <QProcess>
#include <QSet>
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

QString describe(const QStringList &args, const Run &r)
{
    return QStringLiteral("tailwise-cli %1\n   exit %2\n   stdout: %3\n   stderr: %4")
        .arg(args.join(' '))
        .arg(r.exitCode)
        .arg(r.out.left(600), r.err.left(600));
}

QJsonObject fixtureCase(const QString &name)
{
    QFile file(dataDir + "/backtest-eu-fixture.json");
    if (!file.open(QIODevice::ReadOnly))
        qFatal("cannot open backtest-eu-fixture.json");
    for (const auto &c : QJsonDocument::fromJson(file.readAll()).object()["cases"].toArray())
        if (c.toObject()["name"].toString() == name)
            return c.toObject();
    qFatal("no fixture case %s", qPrintable(name));
}

// The fixture case's holdings as a CSV file, and its assumptions as options.
QStringList argsFor(const QJsonObject &c, const QTemporaryDir &dir)
{
    const QJsonArray holdings = c["holdings"].toArray();
    const QString column = holdings[0].toArray()[1].toString();
    QString text = "asset," + column + "\n";
    for (const auto &h : holdings)
        text += h.toArray()[0].toString() + "," + QString::number(h.toArray()[2].toDouble(), 'g', 17) + "\n";
    const QString path = dir.filePath(c["name"].toString() + ".csv");
    QFile f(path);
    if (!f.open(QIODevice::WriteOnly))
        qFatal("cannot write %s", qPrintable(path));
    f.write(text.toUtf8());
    f.close();
    QStringList args = {"backtest", "--prices", euPrices, "--holdings", path,
                        "--window", QString::number(c["window"].toInt()),
                        "--confidence", QString::number(c["confidence"].toDouble(), 'g', 17),
                        "--estimator", c["estimator"].toString(),
                        "--lambda", QString::number(c["lambda"].toDouble(), 'g', 17),
                        "--mean", c["mean"].toString(),
                        "--returns", c["returns"].toString()};
    if (c.contains("model"))
        args << "--model" << c["model"].toString();
    if (c["dof"].isDouble())
        args << "--dof" << QString::number(c["dof"].toDouble(), 'g', 17);
    else if (c["dof"].isString())
        args << "--dof" << c["dof"].toString();
    return args;
}

// Relative agreement demanded of the figures (issue 5, as for the core).
constexpr double relTolerance = 1e-9;

} // namespace

class TestCliBacktest : public QObject {
    Q_OBJECT
private slots:
    void jsonEqualsFixture_data();
    void jsonEqualsFixture();
    void jsonHasExactlyTheKeys();
    void readableReport();
    void badInputAndUsage_data();
    void badInputAndUsage();
    void help();
    void workbookGivesTheSameBacktest();
};

void TestCliBacktest::jsonEqualsFixture_data()
{
    QTest::addColumn<QString>("name");
    // NumPy/SciPy fixture cases (make_backtest_fixture.py) on the real data set.
    for (const char *name : {"quantities-sample-99", "values-ewma-975", "long-short-log-95", "student-t-fit-99",
                             "cornish-fisher-99", "historical-99"})
        QTest::newRow(name) << QString::fromLatin1(name);
}

void TestCliBacktest::jsonEqualsFixture()
{
    QFETCH(QString, name);
    const QJsonObject c = fixtureCase(name);
    QTemporaryDir dir;
    QStringList args = argsFor(c, dir);
    args << "--json" << "--series";
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QJsonParseError error{};
    const QJsonObject j = QJsonDocument::fromJson(r.out.toUtf8(), &error).object();
    QVERIFY2(error.error == QJsonParseError::NoError, qPrintable(error.errorString()));
    QCOMPARE(j["observations"].toInt(), c["observations"].toInt());
    QCOMPARE(j["exceptions"].toInt(), c["exceptions"].toInt());
    TW_CLOSE_REL(j["expected_exceptions"].toDouble(), c["expected_exceptions"].toDouble(), relTolerance);
    TW_CLOSE_REL(j["kupiec"]["lr"].toDouble(), c["kupiec"]["lr"].toDouble(), relTolerance);
    TW_CLOSE_REL(j["kupiec"]["p_value"].toDouble(), c["kupiec"]["p_value"].toDouble(), relTolerance);
    for (const char *key : {"lr_ind", "p_ind", "lr_cc", "p_cc"})
        TW_CLOSE_REL_CTX(j["christoffersen"][key].toDouble(), c["christoffersen"][key].toDouble(), relTolerance,
                         QString::fromLatin1(key));
    QCOMPARE(j["christoffersen"]["transitions"].toArray(), c["christoffersen"]["transitions"].toArray());
    QCOMPARE(j["zone"].toString(), c["zone"].toString());

    const QJsonArray series = j["series"].toArray();
    QCOMPARE(series.size(), static_cast<qsizetype>(c["observations"].toInt()));
    QJsonArray exceptionDates;
    for (const auto &d : series)
        if (d.toObject()["exception"].toBool())
            exceptionDates.append(d.toObject()["date"]);
    QCOMPARE(exceptionDates, c["exception_dates"].toArray());
    for (const auto &item : c["sampled_days"].toArray()) {
        const QJsonObject expected = item.toObject();
        const QJsonObject day = series[expected["index"].toInt()].toObject();
        QCOMPARE(day["date"].toString(), expected["date"].toString());
        TW_CLOSE_REL_CTX(day["pnl"].toDouble(), expected["pnl"].toDouble(), relTolerance, expected["date"].toString());
        TW_CLOSE_REL_CTX(day["var"].toDouble(), expected["var"].toDouble(), relTolerance, expected["date"].toString());
    }
}

void TestCliBacktest::jsonHasExactlyTheKeys()
{
    // Issue 5: observations, exceptions, expected_exceptions, kupiec {lr, p_value}, christoffersen
    // {lr_ind, p_ind, lr_cc, p_cc, transitions}, zone; and with --series the daily records.
    QTemporaryDir dir;
    QStringList args = argsFor(fixtureCase("quantities-sample-99"), dir);
    args << "--json";
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    const QJsonObject j = QJsonDocument::fromJson(r.out.toUtf8()).object();
    const QStringList top = j.keys();
    QCOMPARE(QSet<QString>(top.begin(), top.end()),
             (QSet<QString>{"tool_version", "as_of", "input_sha256", "observations", "exceptions", "expected_exceptions",
                            "kupiec", "christoffersen", "zone"}));
    const QStringList kupiec = j["kupiec"].toObject().keys();
    QCOMPARE(QSet<QString>(kupiec.begin(), kupiec.end()), (QSet<QString>{"lr", "p_value"}));
    const QStringList ch = j["christoffersen"].toObject().keys();
    QCOMPARE(QSet<QString>(ch.begin(), ch.end()), (QSet<QString>{"lr_ind", "p_ind", "lr_cc", "p_cc", "transitions"}));
    QCOMPARE(j["christoffersen"]["transitions"].toArray().size(), 4);

    args << "--series";
    const Run withSeries = runCli(args);
    QVERIFY2(withSeries.exitCode == 0, qPrintable(describe(args, withSeries)));
    const QJsonObject s = QJsonDocument::fromJson(withSeries.out.toUtf8()).object();
    QVERIFY(s.contains("series"));
    const QStringList day = s["series"].toArray().first().toObject().keys();
    QCOMPARE(QSet<QString>(day.begin(), day.end()), (QSet<QString>{"date", "pnl", "var", "exception"}));
}

void TestCliBacktest::readableReport()
{
    QTemporaryDir dir;
    const QStringList args = argsFor(fixtureCase("quantities-sample-99"), dir);
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    // The fixture's figures in words: 33 exceptions in 1609 days, red zone, Kupiec rejected at 5%.
    for (const char *text : {"Days tested         1609", "Exceptions          33", "Zone                red",
                             "rejected: too many exceptions", "the model is rejected", "1992-10-05",
                             "not the worst case", "not advice", "regulatory use follows local rules"})
        QVERIFY2(r.out.contains(QString::fromUtf8(text)), qPrintable(QStringLiteral("missing \"%1\"\n%2").arg(text, r.out)));
    // A passing case says so (Cornish-Fisher at 99%: 16 exceptions, green).
    const QStringList pass = argsFor(fixtureCase("cornish-fisher-99"), dir);
    const Run p = runCli(pass);
    QVERIFY2(p.exitCode == 0, qPrintable(describe(pass, p)));
    QVERIFY2(p.out.contains("none of the tests rejects the model") && p.out.contains("the zone is green"),
             qPrintable(p.out));
}

void TestCliBacktest::badInputAndUsage_data()
{
    QTest::addColumn<QStringList>("extra");
    QTest::addColumn<QString>("holdingsText");
    QTest::addColumn<int>("exitCode");
    QTest::addColumn<QString>("names");
    const QString ok = "asset,quantity\nDAX,1\n";
    QTest::newRow("no window") << QStringList{} << ok << 2 << "--window";
    QTest::newRow("window not a number") << QStringList{"--window", "many"} << ok << 2 << "--window";
    QTest::newRow("window 1") << QStringList{"--window", "1"} << ok << 2 << "--window";
    QTest::newRow("window leaves no day") << QStringList{"--window", "1859"} << ok << 1 << "--window";
    QTest::newRow("unknown model") << QStringList{"--window", "250", "--model", "crystal-ball"} << ok << 2 << "--model";
    QTest::newRow("monte-carlo not backtested") << QStringList{"--window", "250", "--model", "monte-carlo"} << ok << 2
                                                << "--model";
    QTest::newRow("dof without student-t") << QStringList{"--window", "250", "--dof", "5"} << ok << 2 << "--dof";
    QTest::newRow("confidence 1") << QStringList{"--window", "250", "--confidence", "1"} << ok << 2 << "--confidence";
    QTest::newRow("lambda 1") << QStringList{"--window", "250", "--lambda", "1"} << ok << 2 << "--lambda";
    QTest::newRow("unknown option") << QStringList{"--window", "250", "--horizon", "10"} << ok << 2 << "--horizon";
    QTest::newRow("unknown asset") << QStringList{"--window", "250"} << "asset,quantity\nDAX,1\nNIKKEI,2\n" << 1
                                   << "line 3";
    QTest::newRow("bad quantity") << QStringList{"--window", "250"} << "asset,quantity\nDAX,lots\n" << 1 << "column 2";
}

void TestCliBacktest::badInputAndUsage()
{
    QFETCH(QStringList, extra);
    QFETCH(QString, holdingsText);
    QFETCH(int, exitCode);
    QFETCH(QString, names);
    QTemporaryDir dir;
    const QString holdings = dir.filePath("holdings.csv");
    QFile f(holdings);
    QVERIFY(f.open(QIODevice::WriteOnly));
    f.write(holdingsText.toUtf8());
    f.close();
    const QStringList args = QStringList{"backtest", "--prices", euPrices, "--holdings", holdings} + extra;
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == exitCode, qPrintable(describe(args, r)));
    QVERIFY2(r.err.contains(names), qPrintable(describe(args, r)));
    QVERIFY2(r.out.isEmpty(), qPrintable(describe(args, r)));

    // A missing price file names itself.
    const QStringList missing = {"backtest", "--prices", dir.filePath("nope.csv"), "--holdings", holdings, "--window", "5"};
    const Run m = runCli(missing);
    QCOMPARE(m.exitCode, 1);
    QVERIFY2(m.err.contains("nope.csv"), qPrintable(describe(missing, m)));
}

void TestCliBacktest::help()
{
    const Run r = runCli({"backtest", "--help"});
    QCOMPARE(r.exitCode, 0);
    for (const char *option : {"--prices", "--holdings", "--window", "--confidence", "--model", "--dof", "--estimator",
                               "--lambda", "--mean", "--returns", "--json", "--series", "--help", "not the worst case"})
        QVERIFY2(r.out.contains(QString::fromLatin1(option)), option);
}

// --workbook: the sample workbook (samples/larchmere.tailwise) holds the sample CSV files, the
// default assumptions and a backtest window of 250: the same backtest as from the CSV files, and
// an option given overrides the stored value.
void TestCliBacktest::workbookGivesTheSameBacktest()
{
    const QString samples = QStringLiteral(TAILWISE_SOURCE_DIR) + "/samples/";
    const Run fromWorkbook = runCli({"backtest", "--workbook", samples + "larchmere.tailwise", "--json"});
    const Run fromCsv = runCli({"backtest", "--prices", samples + "prices.csv", "--holdings", samples + "holdings.csv",
                                "--window", "250", "--json"});
    QCOMPARE(fromWorkbook.exitCode, 0);
    QCOMPARE(fromCsv.exitCode, 0);
    QCOMPARE(fromWorkbook.out, fromCsv.out);
    const Run shorter = runCli({"backtest", "--workbook", samples + "larchmere.tailwise", "--window", "100", "--json"});
    const Run shorterCsv = runCli({"backtest", "--prices", samples + "prices.csv", "--holdings", samples + "holdings.csv",
                                   "--window", "100", "--json"});
    QCOMPARE(shorter.exitCode, 0);
    QCOMPARE(shorter.out, shorterCsv.out);
    // Both sources at once, or the window given twice: refused, naming the option.
    const Run both = runCli({"backtest", "--workbook", samples + "larchmere.tailwise", "--prices", samples + "prices.csv"});
    QCOMPARE(both.exitCode, 2);
    QVERIFY2(both.err.contains("--workbook"), qPrintable(both.err));
    const Run twice = runCli({"backtest", "--workbook", samples + "larchmere.tailwise", "--window", "100", "--window", "200"});
    QCOMPARE(twice.exitCode, 2);
    QVERIFY2(twice.err.contains("--window: given more than once"), qPrintable(twice.err));
}

QTEST_APPLESS_MAIN(TestCliBacktest)
#include "test_cli_backtest.moc"

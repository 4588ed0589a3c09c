// `tailwise-cli var --workbook FILE` computes what the same inputs give as CSV files, figure for
// figure; an option given overrides the stored assumption; `pack` stores every option it is
// given; a bad workbook is refused with exit status 1 and the file's message.
//
// The reference for every figure is the CSV path of the same program (`var --prices --holdings`),
// whose figures are checked against published values and NumPy elsewhere (tests/core).
#include <QFile>
#include <QJsonDocument>
#include <QJsonObject>
#include <QProcess>
#include <QTemporaryDir>
#include <QTest>

#include <cmath>

namespace {

struct Run {
    int exitCode = -1;
    QByteArray out;
    QByteArray err;
};

Run cli(const QStringList &args)
{
    QProcess p;
    p.start(QStringLiteral(TAILWISE_CLI), args);
    if (!p.waitForFinished(120000))
        qFatal("tailwise-cli did not finish");
    return {p.exitStatus() == QProcess::NormalExit ? p.exitCode() : -1, p.readAllStandardOutput(),
            p.readAllStandardError()};
}

QString sample(const char *name) { return QStringLiteral(TAILWISE_SOURCE_DIR "/samples/") + QLatin1String(name); }

// The sample workbook's stored assumptions, as options (samples/README.md).
const QStringList sampleAssumptions = {"--horizon", "10", "--confidence", "0.99", "--window", "500",
                                       "--estimator", "sample"};

QStringList csvInputs() { return {"--prices", sample("prices.csv"), "--holdings", sample("holdings.csv")}; }

// The output of `var --workbook` on a workbook that states EUR, less what the currency adds (the
// JSON's "currency", the text's Currency line and the code beside each money figure): what the
// same run from the CSV files, which state no currency, prints.
QByteArray withoutCurrency(QByteArray out)
{
    out.replace("  \"currency\": \"EUR\",\n", "");
    out.replace("Currency            EUR (every money figure; only a label, nothing is converted)\n", "");
    out.replace(" EUR", "");
    return out;
}

double figure(const QByteArray &json, const char *key)
{
    return QJsonDocument::fromJson(json).object().value(QLatin1String(key)).toDouble(std::nan(""));
}

#define TW_RUN_OK(run)                                                                                             \
    QVERIFY2((run).exitCode == 0, qPrintable(QStringLiteral("exit %1: %2").arg((run).exitCode).arg(QString::fromUtf8((run).err))))

} // namespace

class TestCliWorkbook : public QObject {
    Q_OBJECT
private slots:
    void sampleWorkbookGivesTheFiguresOfItsCsvs();
    void sampleIsRebuiltByTheDocumentedCommand();
    void optionsOverrideTheStoredAssumptions();
    void packStoresEveryOptionGiven();
    void packStoresTheModelOptions();
    void olderWorkbookRunsWithTheDefaults();
    void refusesBadWorkbooks();
    void packRefusals();
};

void TestCliWorkbook::sampleWorkbookGivesTheFiguresOfItsCsvs()
{
    const Run fromWorkbook = cli({"var", "--workbook", sample("larchmere.tailwise"), "--json"});
    TW_RUN_OK(fromWorkbook);
    const Run fromCsv = cli(QStringList{"var"} + csvInputs() + sampleAssumptions + QStringList{"--json"});
    TW_RUN_OK(fromCsv);
    // Same bytes: every figure (VaR, ES, each contribution, the window's dates) is identical; the
    // workbook's output adds only its currency, after the run's stamp (version, as-of date, input hash:
    // the same inputs, so the same hash).
    QVERIFY2(fromWorkbook.out.startsWith("{\n  \"tool_version\": "), fromWorkbook.out.left(80).constData());
    QVERIFY(fromWorkbook.out.contains("\",\n  \"currency\": \"EUR\",\n"));
    QCOMPARE(withoutCurrency(fromWorkbook.out), fromCsv.out);
    QVERIFY(!fromCsv.out.contains("currency"));
    const double var = figure(fromWorkbook.out, "var");
    QVERIFY2(std::isfinite(var) && var > 0, qPrintable(QString::number(var)));
    QCOMPARE(figure(fromWorkbook.out, "horizon_days"), 10.0);
    QCOMPARE(figure(fromWorkbook.out, "confidence"), 0.99);

    // The readable report too.
    const Run textWorkbook = cli({"var", "--workbook", sample("larchmere.tailwise")});
    TW_RUN_OK(textWorkbook);
    const Run textCsv = cli(QStringList{"var"} + csvInputs() + sampleAssumptions);
    QVERIFY2(textWorkbook.out.contains("Currency            EUR") && textWorkbook.out.contains(" EUR   "),
             textWorkbook.out.left(600).constData());
    QCOMPARE(withoutCurrency(textWorkbook.out), textCsv.out);
}

void TestCliWorkbook::sampleIsRebuiltByTheDocumentedCommand()
{
    // samples/README.md gives this command; it must reproduce the committed workbook exactly.
    QTemporaryDir dir;
    const QString out = dir.filePath(QStringLiteral("larchmere.tailwise"));
    const Run pack = cli(QStringList{"pack"} + csvInputs() + sampleAssumptions
                         + QStringList{"--backtest-window", "250", "--backtest-test-size", "0.05", "--backtest-models",
                                       "normal,student-t,cornish-fisher,historical"}
                         + QStringList{"--scenario", sample("scenarios/Equity drawdown -20%.csv"), "--scenario",
                                       sample("scenarios/Rates up, bonds -5%.csv")}
                         + QStringList{"--title", "Larchmere Balanced Fund", "--currency", "EUR", "--out", out});
    TW_RUN_OK(pack);
    QFile rebuilt(out), committed(sample("larchmere.tailwise"));
    QVERIFY(rebuilt.open(QIODevice::ReadOnly));
    QVERIFY(committed.open(QIODevice::ReadOnly));
    QVERIFY2(rebuilt.readAll() == committed.readAll(),
             "samples/larchmere.tailwise differs from what samples/README.md's command makes: rebuild it");
}

void TestCliWorkbook::optionsOverrideTheStoredAssumptions()
{
    struct Case {
        QStringList override;
        QStringList csvAssumptions; // what the CSV run needs to mean the same
    };
    const QList<Case> cases = {
        {{"--confidence", "0.95"}, {"--horizon", "10", "--confidence", "0.95", "--window", "500"}},
        {{"--horizon", "1"}, {"--horizon", "1", "--confidence", "0.99", "--window", "500"}},
        {{"--window", "all"}, {"--horizon", "10", "--confidence", "0.99"}},
        {{"--estimator", "ewma", "--lambda", "0.97"},
         {"--horizon", "10", "--confidence", "0.99", "--window", "500", "--estimator", "ewma", "--lambda", "0.97"}},
    };
    const Run stored = cli({"var", "--workbook", sample("larchmere.tailwise"), "--json"});
    TW_RUN_OK(stored);
    for (const Case &c : cases) {
        const Run overridden = cli(QStringList{"var", "--workbook", sample("larchmere.tailwise")} + c.override
                                   + QStringList{"--json"});
        TW_RUN_OK(overridden);
        const Run csv = cli(QStringList{"var"} + csvInputs() + c.csvAssumptions + QStringList{"--json"});
        TW_RUN_OK(csv);
        QVERIFY2(withoutCurrency(overridden.out) == csv.out, qPrintable(c.override.join(QLatin1Char(' '))));
        QVERIFY2(figure(overridden.out, "var") != figure(stored.out, "var"),
                 qPrintable(c.override.join(QLatin1Char(' ')) + QStringLiteral(" changed nothing")));
    }
    // Lower confidence, smaller VaR: the override really took the place of the stored 0.99.
    const Run at95 = cli({"var", "--workbook", sample("larchmere.tailwise"), "--confidence", "0.95", "--json"});
    QVERIFY(figure(at95.out, "var") < figure(stored.out, "var"));
    // An override outside its domain is a usage error naming the option.
    const Run bad = cli({"var", "--workbook", sample("larchmere.tailwise"), "--confidence", "1.2"});
    QCOMPARE(bad.exitCode, 2);
    QVERIFY2(bad.err.contains("--confidence"), bad.err.constData());
}

void TestCliWorkbook::packStoresEveryOptionGiven()
{
    QTemporaryDir dir;
    const QString out = dir.filePath(QStringLiteral("packed.tailwise"));
    const QStringList assumptions = {"--confidence", "0.975", "--horizon", "5", "--days-per-year", "250",
                                     "--window", "250", "--returns", "log", "--estimator", "ewma",
                                     "--lambda", "0.96", "--mean", "sample"};
    const Run pack = cli(QStringList{"pack"} + csvInputs() + assumptions
                         + QStringList{"--title", "Packed «test»", "--out", out});
    TW_RUN_OK(pack);
    QVERIFY2(pack.out.contains("13 assets, 780 days, 13 holdings"), pack.out.constData());
    const Run fromWorkbook = cli({"var", "--workbook", out, "--json"});
    TW_RUN_OK(fromWorkbook);
    const Run fromCsv = cli(QStringList{"var"} + csvInputs() + assumptions + QStringList{"--json"});
    TW_RUN_OK(fromCsv);
    QCOMPARE(fromWorkbook.out, fromCsv.out);

    QFile f(out);
    QVERIFY(f.open(QIODevice::ReadOnly));
    const QJsonObject root = QJsonDocument::fromJson(f.readAll()).object();
    QCOMPARE(root.value(QStringLiteral("title")).toString(), QStringLiteral("Packed «test»"));
    const QJsonObject a = root.value(QStringLiteral("assumptions")).toObject();
    QCOMPARE(a.value(QStringLiteral("days-per-year")).toInt(), 250);
    QCOMPARE(a.value(QStringLiteral("returns")).toString(), QStringLiteral("log"));
    QCOMPARE(a.value(QStringLiteral("mean")).toString(), QStringLiteral("sample"));
}

void TestCliWorkbook::packStoresTheModelOptions()
{
    // Each model with its parameters: stored by pack, used by var --workbook exactly as the same
    // options with the CSV files; then one parameter overridden on the command line.
    const QList<QStringList> models = {
        {"--model", "student-t", "--dof", "5.5"},
        {"--model", "student-t"},
        {"--model", "cornish-fisher", "--horizon", "5"},
        {"--model", "historical", "--hs-horizon", "overlapping", "--horizon", "10"},
        {"--model", "monte-carlo", "--simulations", "20000", "--seed", "7", "--dof", "6"},
    };
    QTemporaryDir dir;
    for (const QStringList &options : models) {
        const QString out = dir.filePath(QStringLiteral("model.tailwise"));
        const Run pack = cli(QStringList{"pack"} + csvInputs() + options + QStringList{"--out", out});
        TW_RUN_OK(pack);
        const Run fromWorkbook = cli({"var", "--workbook", out, "--json"});
        TW_RUN_OK(fromWorkbook);
        const Run fromCsv = cli(QStringList{"var"} + csvInputs() + options + QStringList{"--json"});
        TW_RUN_OK(fromCsv);
        QVERIFY2(fromWorkbook.out == fromCsv.out, qPrintable(options.join(QLatin1Char(' '))));
    }
    const QString mc = dir.filePath(QStringLiteral("mc.tailwise"));
    TW_RUN_OK(cli(QStringList{"pack"} + csvInputs()
                  + QStringList{"--model", "monte-carlo", "--simulations", "20000", "--seed", "7", "--out", mc}));
    const Run reseeded = cli({"var", "--workbook", mc, "--seed", "8", "--json"});
    TW_RUN_OK(reseeded);
    const Run csv8 = cli(QStringList{"var"} + csvInputs()
                         + QStringList{"--model", "monte-carlo", "--simulations", "20000", "--seed", "8", "--json"});
    QCOMPARE(reseeded.out, csv8.out);
}

// A workbook from before the optional assumptions existed: the sample without them gives the
// sample's own figures (its values of those fields are the defaults), and stderr says which
// defaults were used (ui/document/workbookfile.h).
void TestCliWorkbook::olderWorkbookRunsWithTheDefaults()
{
    QTemporaryDir dir;
    QFile good(sample("larchmere.tailwise"));
    QVERIFY(good.open(QIODevice::ReadOnly));
    QJsonObject root = QJsonDocument::fromJson(good.readAll()).object();
    QJsonObject kept;
    const QJsonObject a = root[QStringLiteral("assumptions")].toObject();
    for (const char *key : {"confidence", "horizon", "window", "estimator"})
        kept[QLatin1String(key)] = a[QLatin1String(key)];
    root[QStringLiteral("assumptions")] = kept;
    const QString path = dir.filePath(QStringLiteral("older.tailwise"));
    QFile out(path);
    QVERIFY(out.open(QIODevice::WriteOnly));
    out.write(QJsonDocument(root).toJson());
    out.close();

    const Run full = cli({"var", "--workbook", sample("larchmere.tailwise"), "--json"});
    TW_RUN_OK(full);
    QVERIFY2(!full.err.contains("defaults apply"), full.err.constData());
    const Run older = cli({"var", "--workbook", path, "--json"});
    TW_RUN_OK(older);
    QCOMPARE(older.out, full.out);
    QVERIFY2(older.err.contains("tailwise-cli: warning: " + path.toUtf8()
                                + ": the file does not give these assumptions, so their defaults apply: days-per-year 252"),
             older.err.constData());
    QVERIFY2(older.err.contains("lambda 0.94") && older.err.contains("seed 1"), older.err.constData());
}

void TestCliWorkbook::refusesBadWorkbooks()
{
    QTemporaryDir dir;
    QFile good(sample("larchmere.tailwise"));
    QVERIFY(good.open(QIODevice::ReadOnly));
    const QByteArray bytes = good.readAll();
    auto write = [&](const char *name, const QByteArray &content) {
        const QString path = dir.filePath(QLatin1String(name));
        QFile f(path);
        if (!f.open(QIODevice::WriteOnly))
            qFatal("cannot write %s", qPrintable(path));
        f.write(content);
        return path;
    };
    struct Case {
        QString path;
        QByteArray expect;
    };
    QJsonObject newer = QJsonDocument::fromJson(bytes).object();
    newer[QStringLiteral("format")] = 7;
    const QList<Case> cases = {
        {dir.filePath(QStringLiteral("absent.tailwise")), "absent.tailwise: the file does not exist"},
        {write("cut.tailwise", bytes.left(bytes.size() / 2)), "may be truncated"},
        {write("newer.tailwise", QJsonDocument(newer).toJson()),
         "made by a newer Tailwise (format 7); this version reads format 1"},
        {write("other.json", R"({"colour": "teal"})"), "other.json: not a Tailwise workbook"},
        {write("prices.tailwise", "date,A\n2024-01-02,1\n"), "prices.tailwise, line 1"},
    };
    for (const Case &c : cases) {
        const Run r = cli({"var", "--workbook", c.path, "--json"});
        QVERIFY2(r.exitCode == 1, qPrintable(c.path + QStringLiteral(": exit %1").arg(r.exitCode)));
        QVERIFY2(r.err.contains(c.expect), r.err.constData());
        QVERIFY(r.out.isEmpty());
    }
    // Usage: a workbook and CSV files together; --workbook without a file.
    Run r = cli({"var", "--workbook", sample("larchmere.tailwise"), "--prices", sample("prices.csv")});
    QCOMPARE(r.exitCode, 2);
    QVERIFY2(r.err.contains("--workbook"), r.err.constData());
    r = cli({"var", "--workbook"});
    QCOMPARE(r.exitCode, 2);
    QVERIFY2(r.err.contains("--workbook: expected a value"), r.err.constData());
}

void TestCliWorkbook::packRefusals()
{
    QTemporaryDir dir;
    Run r = cli(QStringList{"pack"} + csvInputs());
    QCOMPARE(r.exitCode, 2);
    QVERIFY2(r.err.contains("--out"), r.err.constData());
    const QString nowhere = dir.filePath(QStringLiteral("no/such/folder/x.tailwise"));
    r = cli(QStringList{"pack"} + csvInputs() + QStringList{"--out", nowhere});
    QCOMPARE(r.exitCode, 1);
    QVERIFY2(r.err.contains(nowhere.toUtf8() + ": not saved"), r.err.constData());
    r = cli(QStringList{"pack", "--prices", sample("prices.csv"), "--holdings", sample("holdings.csv"),
                        "--horizon", "0", "--out", dir.filePath(QStringLiteral("x.tailwise"))});
    QCOMPARE(r.exitCode, 2);
    QVERIFY2(r.err.contains("--horizon"), r.err.constData());
    QVERIFY(!QFile::exists(dir.filePath(QStringLiteral("x.tailwise"))));
    // A currency that is not three capital letters: a usage error naming the option, no file.
    r = cli(QStringList{"pack"} + csvInputs() + QStringList{"--currency", "euro", "--out", dir.filePath(QStringLiteral("x.tailwise"))});
    QCOMPARE(r.exitCode, 2);
    QVERIFY2(r.err.contains("--currency: expected a currency code of three capital letters"), r.err.constData());
    QVERIFY(!QFile::exists(dir.filePath(QStringLiteral("x.tailwise"))));
}

QTEST_GUILESS_MAIN(TestCliWorkbook)
#include "test_cli_workbook.moc"

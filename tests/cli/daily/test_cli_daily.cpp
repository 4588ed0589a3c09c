// The daily routine as a user runs it: var's stamp (tool version, as-of date, input SHA-256) and
// limits, --fail-on-breach's exit 3; an as-of run equal to a run on the history cut at that date;
// batch lines equal to single runs, in input order, a bad and a missing workbook among good ones;
// --record and history (change from the previous record, nothing recorded twice); and the .xlsx
// exports read back with openpyxl (xlsx_dump.py; an independent reader) with the same numbers.
// Limit states follow tailwise/limits.h (common practice: a warning level below the limit).
#include <QDir>
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
const QString sourceDir = QStringLiteral(TAILWISE_SOURCE_DIR);
const QString sample = sourceDir + "/samples/larchmere.tailwise";
const QString samplePrices = sourceDir + "/samples/prices.csv";
const QString sampleHoldings = sourceDir + "/samples/holdings.csv";

struct Run {
    int exitCode = -1;
    QString out;
    QString err;
};

Run runProgram(const QString &program, const QStringList &args, const QString &dir = {})
{
    QProcess p;
    if (!dir.isEmpty())
        p.setWorkingDirectory(dir);
    p.start(program, args);
    Run r;
    if (!p.waitForFinished(60000) || p.exitStatus() != QProcess::NormalExit) {
        r.err = "did not finish normally: " + p.errorString();
        return r;
    }
    r.exitCode = p.exitCode();
    r.out = QString::fromUtf8(p.readAllStandardOutput());
    r.err = QString::fromUtf8(p.readAllStandardError());
    return r;
}

Run runCli(const QStringList &args, const QString &dir = {}) { return runProgram(cli, args, dir); }

QByteArray describe(const QStringList &args, const Run &r)
{
    return QStringLiteral("tailwise-cli %1\n exit %2\n stdout: %3\n stderr: %4")
        .arg(args.join(' '))
        .arg(r.exitCode)
        .arg(r.out.left(800), r.err.left(800))
        .toUtf8();
}

QJsonObject jsonOf(const QString &text)
{
    return QJsonDocument::fromJson(text.toUtf8()).object();
}

// A copy of the sample workbook with another title and every quantity scaled.
QString writeWorkbook(const QString &dir, const QString &name, const QString &title, double scale)
{
    QFile in(sample);
    in.open(QIODevice::ReadOnly);
    QJsonObject root = QJsonDocument::fromJson(in.readAll()).object();
    root["title"] = title;
    QJsonArray holdings = root["holdings"].toArray();
    for (qsizetype i = 0; i < holdings.size(); ++i) {
        QJsonObject h = holdings[i].toObject();
        h["quantity"] = h["quantity"].toDouble() * scale;
        holdings[i] = h;
    }
    root["holdings"] = holdings;
    const QString path = dir + "/" + name;
    QFile out(path);
    out.open(QIODevice::WriteOnly);
    out.write(QJsonDocument(root).toJson());
    return path;
}

} // namespace

class TestCliDaily : public QObject {
    Q_OBJECT

private slots:
    void varCarriesItsStampAndLimits()
    {
        const QStringList base{"var", "--workbook", sample, "--json"};
        const Run plain = runCli(base);
        QVERIFY2(plain.exitCode == 0, describe(base, plain));
        const QJsonObject p = jsonOf(plain.out);
        QVERIFY(!p["tool_version"].toString().isEmpty());
        QCOMPARE(p["as_of"].toString(), QString("2026-11-27")); // the sample's last date
        QCOMPARE(p["input_sha256"].toString().size(), 64);
        QVERIFY(p["limits"].isArray());
        QCOMPARE(p["limits"].toArray().size(), 0);
        const double var = p["var"].toDouble(), es = p["es"].toDouble(), value = p["portfolio_value"].toDouble();

        // A VaR limit that the figure uses 90 % of (warning), an ES limit it exceeds (breached),
        // and one in percent of value it is far from (ok).
        const QString varLimit = QString::number(var / 0.9, 'g', 17);
        const QString esLimit = QString::number(es * 0.95, 'g', 17);
        const QString pctLimit = QString::number(var / value * 100.0 * 4.0, 'g', 17);
        const QStringList withLimits = base + QStringList{"--limit", "var=" + varLimit, "--limit", "es=" + esLimit + ",warn=50%",
                                                          "--limit", "var=" + pctLimit + "%"};
        Run r = runCli(withLimits);
        QVERIFY2(r.exitCode == 0, describe(withLimits, r));
        const QJsonArray limits = jsonOf(r.out)["limits"].toArray();
        QCOMPARE(limits.size(), 3);
        const QStringList keys{"measure", "group", "limit", "warning_level", "value", "use", "state"};
        for (const auto &l : limits)
            for (const auto &k : keys)
                QVERIFY2(l.toObject().contains(k), qPrintable(k));
        QCOMPARE(limits[0].toObject()["measure"].toString(), QString("var"));
        QVERIFY(limits[0].toObject()["group"].isNull());
        QCOMPARE(limits[0].toObject()["warning_level"].toDouble(), 0.8);
        QVERIFY(std::abs(limits[0].toObject()["use"].toDouble() - 0.9) < 1e-12);
        QCOMPARE(limits[0].toObject()["state"].toString(), QString("warning"));
        QCOMPARE(limits[1].toObject()["measure"].toString(), QString("es"));
        QCOMPARE(limits[1].toObject()["warning_level"].toDouble(), 0.5);
        QCOMPARE(limits[1].toObject()["state"].toString(), QString("breached"));
        QVERIFY(std::abs(limits[2].toObject()["limit"].toDouble() - 4.0 * var) < 1e-6 * var);
        QCOMPARE(limits[2].toObject()["state"].toString(), QString("ok"));
        // The same run with --fail-on-breach: exit 3; the readable report says the state in words.
        r = runCli(withLimits + QStringList{"--fail-on-breach"});
        QCOMPARE(r.exitCode, 3);
        const QStringList text{"var", "--workbook", sample, "--limit", "es=" + esLimit};
        r = runCli(text);
        QVERIFY2(r.exitCode == 0, describe(text, r));
        QVERIFY(r.out.contains("BREACHED"));
        QVERIFY(r.out.contains("Inputs (SHA-256)  " + p["input_sha256"].toString()));
        // A changed assumption changes the input hash.
        r = runCli(base + QStringList{"--confidence", "0.975"});
        QVERIFY(jsonOf(r.out)["input_sha256"].toString() != p["input_sha256"].toString());
    }

    void packStoresLimitsThatEveryRunChecks()
    {
        QTemporaryDir dir;
        const QString wb = dir.path() + "/limited.tailwise";
        const QStringList pack{"pack", "--prices", samplePrices, "--holdings", sampleHoldings, "--limit", "var=1%",
                               "--limit", "es=99%,warn=90%", "--out", wb};
        const Run p = runCli(pack);
        QVERIFY2(p.exitCode == 0, describe(pack, p));
        const Run r = runCli({"var", "--workbook", wb, "--json"});
        const QJsonArray limits = jsonOf(r.out)["limits"].toArray();
        QCOMPARE(limits.size(), 2);
        QCOMPARE(limits[0].toObject()["state"].toString(), QString("breached"));
        QCOMPARE(limits[1].toObject()["state"].toString(), QString("ok"));
        QCOMPARE(limits[1].toObject()["warning_level"].toDouble(), 0.9);
        QCOMPARE(runCli({"var", "--workbook", wb, "--fail-on-breach"}).exitCode, 3);
        // Limits given on the command line replace the stored ones.
        QCOMPARE(jsonOf(runCli({"var", "--workbook", wb, "--json", "--limit", "var=99%"}).out)["limits"].toArray().size(), 1);
        const Run bad = runCli({"pack", "--prices", samplePrices, "--holdings", sampleHoldings, "--limit", "var=0", "--out", wb});
        QVERIFY2(bad.exitCode == 2 && bad.err.contains("--limit"), qPrintable(bad.err));
        QVERIFY(runCli({"var", "--help"}).out.contains("--fail-on-breach"));
    }

    void badLimitsAndDatesAreRefusedByName()
    {
        struct Case {
            QStringList args;
            int exit;
            QString words;
        };
        const QList<Case> cases{
            {{"--limit", "var=0"}, 2, "--limit: the limit must be greater than zero"},
            {{"--limit", "var=-3%"}, 2, "--limit"},
            {{"--limit", "var=1000,group=Equities"}, 2, "unknown group \"Equities\""},
            {{"--limit", "volatility=5"}, 2, "neither var nor es"},
            {{"--as-of", "2026-13-01"}, 2, "--as-of: expected a date as YYYY-MM-DD"},
            {{"--as-of", "2030-01-02"}, 1, "--as-of: the date 2030-01-02 is after the history"},
            {{"--as-of", "2020-01-02"}, 1, "is before the history"},
        };
        for (const auto &c : cases) {
            const QStringList args = QStringList{"var", "--workbook", sample} + c.args;
            const Run r = runCli(args);
            QVERIFY2(r.exitCode == c.exit && r.err.contains(c.words), describe(args, r));
            QVERIFY(r.out.isEmpty());
        }
    }

    void asOfEqualsARunOnTheHistoryCutThere()
    {
        QTemporaryDir dir;
        QFile in(samplePrices);
        QVERIFY(in.open(QIODevice::ReadOnly));
        QByteArray cut;
        for (const QByteArray &line : in.readAll().split('\n'))
            if (!line.isEmpty() && (line.startsWith("date") || line.left(10) <= "2025-06-30"))
                cut += line + "\n";
        const QString cutPath = dir.path() + "/prices-to-2025-06-30.csv";
        QFile out(cutPath);
        QVERIFY(out.open(QIODevice::WriteOnly));
        out.write(cut);
        out.close();
        const QStringList asOf{"var", "--prices", samplePrices, "--holdings", sampleHoldings, "--as-of", "2025-06-30", "--json"};
        const QStringList onCut{"var", "--prices", cutPath, "--holdings", sampleHoldings, "--json"};
        const Run a = runCli(asOf), b = runCli(onCut);
        QVERIFY2(a.exitCode == 0, describe(asOf, a));
        QVERIFY2(b.exitCode == 0, describe(onCut, b));
        const QJsonObject ja = jsonOf(a.out), jb = jsonOf(b.out);
        for (const char *key : {"var", "es", "portfolio_value", "undiversified_var"})
            QCOMPARE(ja[key].toDouble(), jb[key].toDouble());
        QCOMPARE(ja["as_of"].toString(), QString("2025-06-30"));
        QCOMPARE(ja["input_sha256"].toString(), jb["input_sha256"].toString());
        QCOMPARE(ja["assumptions"].toObject()["window_end"].toString(), QString("2025-06-30"));
    }

    void batchEqualsSingleRunsWithABadWorkbookAmongGoodOnes()
    {
        QTemporaryDir dir;
        const QString a = writeWorkbook(dir.path(), "a.tailwise", "Fund A", 1.0);
        const QString b = writeWorkbook(dir.path(), "b.tailwise", "Fund B", 2.5);
        const QString bad = dir.path() + "/bad.tailwise";
        QFile f(bad);
        QVERIFY(f.open(QIODevice::WriteOnly));
        f.write("{\"kind\": \"tailwise-workbook\", \"format\": 1, \"prices\": 3}");
        f.close();
        const QString missing = dir.path() + "/missing.tailwise";
        const QString list = dir.path() + "/list.txt";
        QFile l(list);
        QVERIFY(l.open(QIODevice::WriteOnly));
        l.write(("# tonight's books\n" + a + "\r\n" + bad + "\n\n" + missing + "\n" + b + "\n").toUtf8());
        l.close();
        const QString results = dir.path() + "/results.jsonl";
        const QStringList args{"batch", "--list", list, "--out", results, "-j", "2", "--as-of", "2026-10-30"};
        const Run r = runCli(args);
        QVERIFY2(r.exitCode == 1 && r.err.contains("2 of 4 workbooks failed"), describe(args, r));
        QFile res(results);
        QVERIFY(res.open(QIODevice::ReadOnly));
        const QList<QByteArray> lines = res.readAll().trimmed().split('\n');
        QCOMPARE(lines.size(), 4);
        const QStringList order{a, bad, missing, b};
        for (int i = 0; i < 4; ++i) {
            const QJsonObject o = QJsonDocument::fromJson(lines[i]).object();
            QCOMPARE(o["workbook"].toString(), order[i]);
            if (i == 1 || i == 2) {
                QVERIFY2(o["error"].toString().contains(order[i]), lines[i].constData());
                continue;
            }
            QVERIFY(!o.contains("error"));
            const QStringList single{"var", "--workbook", order[i], "--as-of", "2026-10-30", "--json"};
            const Run s = runCli(single);
            QVERIFY2(s.exitCode == 0, describe(single, s));
            const QJsonObject so = jsonOf(s.out);
            for (const char *key : {"var", "es", "portfolio_value", "input_sha256", "as_of"})
                QCOMPARE(o[key].toVariant(), so[key].toVariant());
        }
        // The CSV: the headline columns, the error on its line.
        const QString csv = dir.path() + "/results.csv";
        const Run c = runCli({"batch", a, bad, b, "--out", csv});
        QCOMPARE(c.exitCode, 1);
        QFile cf(csv);
        QVERIFY(cf.open(QIODevice::ReadOnly));
        const QList<QByteArray> rows = cf.readAll().trimmed().split('\n');
        QCOMPARE(rows.size(), 4);
        QVERIFY(rows[0].startsWith("workbook,as_of,portfolio_value,var,"));
        QVERIFY(rows[2].startsWith(bad.toUtf8() + ",,,"));
        // All good: exit 0.
        QCOMPARE(runCli({"batch", a, b, "--out", csv}).exitCode, 0);
    }

    void recordAndHistory()
    {
        QTemporaryDir dir;
        const QString a = writeWorkbook(dir.path(), "a.tailwise", "Fund A", 1.0);
        const QString b = writeWorkbook(dir.path(), "b.tailwise", "Fund B", 2.0);
        const QString db = dir.path() + "/history.db";
        for (const char *day : {"2026-11-25", "2026-11-26"}) {
            const QStringList args{"batch", a, b, "--as-of", day, "--record", db, "--limit", "var=1%", "--out", dir.path() + "/r.jsonl"};
            const Run r = runCli(args);
            QVERIFY2(r.exitCode == 0, describe(args, r));
        }
        // The same day again: not recorded twice.
        Run again = runCli({"var", "--workbook", a, "--as-of", "2026-11-26", "--limit", "var=1%", "--record", db});
        QCOMPARE(again.exitCode, 0);
        QVERIFY2(again.err.contains("already recorded"), qPrintable(again.err));
        // Another confidence: a change of assumptions.
        again = runCli({"var", "--workbook", a, "--as-of", "2026-11-26", "--confidence", "0.975", "--record", db});
        QCOMPARE(again.exitCode, 0);
        const QStringList args{"history", db, "--workbook", "Fund A", "--json"};
        const Run h = runCli(args);
        QVERIFY2(h.exitCode == 0, describe(args, h));
        const QJsonArray runs = jsonOf(h.out)["runs"].toArray();
        QCOMPARE(runs.size(), 3);
        QCOMPARE(runs[0].toObject()["as_of"].toString(), QString("2026-11-25"));
        QVERIFY(runs[0].toObject()["var_change"].isNull());
        const QJsonObject single = jsonOf(runCli({"var", "--workbook", a, "--as-of", "2026-11-26", "--json"}).out);
        QCOMPARE(runs[1].toObject()["var"].toDouble(), single["var"].toDouble());
        QCOMPARE(runs[1].toObject()["var_change"].toDouble(), runs[1].toObject()["var"].toDouble() - runs[0].toObject()["var"].toDouble());
        QCOMPARE(runs[1].toObject()["changed"].toArray(), QJsonArray{"market data"});
        QCOMPARE(runs[2].toObject()["changed"].toArray(), QJsonArray{"assumptions"});
        QVERIFY(runs[1].toObject()["realised_pnl"].isDouble());
        QCOMPARE(runs[1].toObject()["limits"].toArray()[0].toObject()["measure"].toString(), QString("var"));
        QCOMPARE(runs[1].toObject()["input_sha256"].toString(), single["input_sha256"].toString());
        const Run text = runCli({"history", db});
        QVERIFY(text.out.contains("Fund A") && text.out.contains("Fund B") && text.out.contains("market data"));
        const Run unknown = runCli({"history", db, "--workbook", "Fund C"});
        QVERIFY2(unknown.exitCode == 1 && unknown.err.contains("\"Fund A\", \"Fund B\""), qPrintable(unknown.err));
        const Run csv = runCli({"history", db, "--csv"});
        QCOMPARE(csv.out.trimmed().split('\n').size(), 6); // header + 5 runs
        // A file that is not a history database: refused by name.
        const Run notOurs = runCli({"history", sample});
        QVERIFY2(notOurs.exitCode == 1 && notOurs.err.contains("not a Tailwise history database"), qPrintable(notOurs.err));
    }

    void xlsxOpensWithOpenpyxlWithTheSameNumbers()
    {
        if (runProgram("/usr/bin/python3", {"-c", "import openpyxl"}).exitCode != 0)
            QSKIP("python3-openpyxl is not installed (scripts/setup.sh lists it)");
        QTemporaryDir dir;
        const QString xlsx = dir.path() + "/figures.xlsx";
        const QStringList args{"var", "--workbook", sample, "--json", "--xlsx", xlsx, "--limit", "var=250000"};
        const Run r = runCli(args);
        QVERIFY2(r.exitCode == 0, describe(args, r));
        const QJsonObject j = jsonOf(r.out);
        const Run dump = runProgram("/usr/bin/python3", {TAILWISE_XLSX_DUMP, xlsx});
        QVERIFY2(dump.exitCode == 0, qPrintable(dump.err));
        const QJsonObject book = jsonOf(dump.out);
        QCOMPARE(book.keys(), (QStringList{"Contributions", "Limits", "Summary"}));
        const QJsonObject contributions = book["Contributions"].toObject();
        QCOMPARE(contributions["freeze_panes"].toString(), QString("A2"));
        const QJsonArray rows = contributions["rows"].toArray();
        const QJsonArray expected = j["contributions"].toArray();
        QCOMPARE(rows.size(), expected.size() + 1);
        QCOMPARE(rows[0].toArray()[1].toArray()[0].toString(), QString("exposure"));
        for (qsizetype i = 0; i < expected.size(); ++i) {
            const QJsonArray row = rows[i + 1].toArray();
            QCOMPARE(row[0].toArray()[0].toString(), expected[i].toObject()["asset"].toString());
            const QJsonArray exposure = row[1].toArray();
            QVERIFY(exposure[2].toString() == "float" || exposure[2].toString() == "int"); // a number, not text
            QCOMPARE(exposure[1].toString(), QString("#,##0.00"));
            QCOMPARE(exposure[0].toDouble(), expected[i].toObject()["exposure"].toDouble());
            QCOMPARE(row[4].toArray()[0].toDouble(), expected[i].toObject()["component_var"].toDouble());
            QCOMPARE(row[2].toArray()[1].toString(), QString("0.00%"));
        }
        bool sawVar = false;
        for (const auto &row : book["Summary"].toObject()["rows"].toArray())
            if (row.toArray()[0].toArray()[0].toString() == "Value-at-Risk") {
                QCOMPARE(row.toArray()[1].toArray()[0].toDouble(), j["var"].toDouble());
                sawVar = true;
            }
        QVERIFY(sawVar);
        const QJsonArray limitRow = book["Limits"].toObject()["rows"].toArray()[1].toArray();
        QCOMPARE(limitRow[2].toArray()[0].toDouble(), 250000.0);
        QCOMPARE(limitRow[6].toArray()[0].toString(), j["limits"].toArray()[0].toObject()["state"].toString());

        // The history: dates are dates.
        const QString db = dir.path() + "/h.db";
        QCOMPARE(runCli({"var", "--workbook", sample, "--record", db}).exitCode, 0);
        const QString hx = dir.path() + "/history.xlsx";
        QCOMPARE(runCli({"history", db, "--xlsx", hx}).exitCode, 0);
        const QJsonObject hbook = jsonOf(runProgram("/usr/bin/python3", {TAILWISE_XLSX_DUMP, hx}).out);
        const QJsonArray hrow = hbook["History"].toObject()["rows"].toArray()[1].toArray();
        QCOMPARE(hrow[1].toArray()[0].toString(), QString("2026-11-27"));
        QCOMPARE(hrow[1].toArray()[2].toString(), QString("datetime"));
        QCOMPARE(hrow[3].toArray()[0].toDouble(), j["var"].toDouble());
    }
};

QTEST_GUILESS_MAIN(TestCliDaily)
#include "test_cli_daily.moc"

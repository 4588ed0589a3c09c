// `tailwise-cli report`: writes the sample workbook's PDF report with no display at all (the
// command picks Qt's offscreen platform itself), with the figures `tailwise-cli var --workbook`
// prints for the same workbook; refuses bad usage with status 2 and an unreadable workbook or an
// unwritable PDF with status 1, naming the file.
//
// The reference for the figures is `var --workbook --json` of the same program (checked against
// the CSV path and published values in tests/cli/workbook and tests/core). The PDF's text is read
// with poppler's pdftotext when it is installed; those checks are skipped otherwise.
#include <QFile>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLocale>
#include <QProcess>
#include <QRegularExpression>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>

namespace {

struct Run {
    int exitCode = -1;
    QByteArray out;
    QByteArray err;
};

Run cli(const QStringList &args, bool noDisplay = false)
{
    QProcess p;
    if (noDisplay) {
        QProcessEnvironment env = QProcessEnvironment::systemEnvironment();
        env.remove(QStringLiteral("QT_QPA_PLATFORM"));
        env.remove(QStringLiteral("DISPLAY"));
        env.remove(QStringLiteral("WAYLAND_DISPLAY"));
        env.remove(QStringLiteral("XDG_RUNTIME_DIR")); // as root in a container: Qt must not complain
        p.setProcessEnvironment(env);
    }
    p.start(QStringLiteral(TAILWISE_CLI), args);
    if (!p.waitForFinished(120000))
        qFatal("tailwise-cli did not finish");
    return {p.exitStatus() == QProcess::NormalExit ? p.exitCode() : -1, p.readAllStandardOutput(),
            p.readAllStandardError()};
}

QString sample() { return QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise"); }

#define TW_RUN_OK(run)                                                                                             \
    QVERIFY2((run).exitCode == 0, qPrintable(QStringLiteral("exit %1: %2").arg((run).exitCode).arg(QString::fromUtf8((run).err))))

} // namespace

class TestCliReport : public QObject {
    Q_OBJECT
private slots:
    void writesTheSampleReportWithoutADisplay();
    void refusals();
};

void TestCliReport::writesTheSampleReportWithoutADisplay()
{
    QTemporaryDir dir;
    const QString out = dir.filePath(QStringLiteral("larchmere.pdf"));
    const Run run = cli({"report", sample(), "--out", out}, true);
    TW_RUN_OK(run);
    QVERIFY2(run.out.contains("Wrote"), run.out.constData());
    // Only our own words on stderr (warnings about the inputs), none of Qt's.
    QVERIFY2(!run.err.contains("XDG_RUNTIME_DIR") && !run.err.contains("QStandardPaths"), run.err.constData());
    QFile file(out);
    QVERIFY(file.open(QIODevice::ReadOnly));
    const QByteArray pdf = file.readAll();
    QVERIFY2(pdf.startsWith("%PDF-"), pdf.left(16).constData());
    const auto pages = QRegularExpression(QStringLiteral("/Type\\s*/Pages\\b[^>]*?/Count\\s+(\\d+)")).match(QString::fromLatin1(pdf));
    QVERIFY(pages.hasMatch());
    QVERIFY2(pages.captured(1).toInt() >= 3, qPrintable(pages.captured(1)));
    QVERIFY2(run.out.contains(QStringLiteral("(%1 pages)").arg(pages.captured(1)).toUtf8()), run.out.constData());

    const QString tool = QStandardPaths::findExecutable(QStringLiteral("pdftotext"));
    if (tool.isEmpty())
        QSKIP("pdftotext (poppler-utils) is not installed: the PDF's text is not checked");
    QProcess p;
    p.start(tool, {QStringLiteral("-enc"), QStringLiteral("UTF-8"), out, QStringLiteral("-")});
    QVERIFY(p.waitForFinished(60000));
    const QString text = QString::fromUtf8(p.readAllStandardOutput()).replace(QRegularExpression(QStringLiteral("\\s+")),
                                                                              QStringLiteral(" "));
    // The figures of `var --workbook` for the same file, as the report writes them (two decimals,
    // grouped in the locale the command ran in — the same environment as this test).
    const Run var = cli({"var", "--workbook", sample(), "--json"});
    TW_RUN_OK(var);
    const QJsonObject json = QJsonDocument::fromJson(var.out).object();
    // Under the C locale the command groups thousands all the same (app/cli/guiapplication.h).
    QLocale locale;
    if (locale.language() == QLocale::C)
        locale.setNumberOptions(locale.numberOptions() & ~QLocale::OmitGroupSeparator);
    for (const char *key : {"var", "es"}) {
        const QString figure = locale.toString(json.value(QLatin1String(key)).toDouble(), 'f', 2);
        QVERIFY2(text.contains(figure), qPrintable(QStringLiteral("%1 %2 not in: %3").arg(QLatin1String(key), figure, text.left(1500))));
    }
    // The sample states EUR: the header line says so, and so do the charts' money axes.
    QCOMPARE(json.value(QLatin1String("currency")).toString(), QStringLiteral("EUR"));
    for (const char *s : {"Headline figures", "Assumptions", "Cautions", "VaR is not the worst case", "Backtest",
                          "Page 1 of", "larchmere.tailwise", "Money figures are in EUR.", "(EUR; losses to the left)",
                          "VaR (EUR)"})
        QVERIFY2(text.contains(QLatin1String(s)), s);
}

void TestCliReport::refusals()
{
    QTemporaryDir dir;
    const QString out = dir.filePath(QStringLiteral("x.pdf"));
    Run run = cli({"report", "--out", out});
    QCOMPARE(run.exitCode, 2);
    QVERIFY2(run.err.contains("expected the workbook"), run.err.constData());
    run = cli({"report", sample()});
    QCOMPARE(run.exitCode, 2);
    QVERIFY2(run.err.contains("--out"), run.err.constData());
    run = cli({"report", sample(), "--out", out, "--colour"});
    QCOMPARE(run.exitCode, 2);
    QVERIFY2(run.err.contains("--colour"), run.err.constData());
    run = cli({"report", dir.filePath(QStringLiteral("missing.tailwise")), "--out", out});
    QCOMPARE(run.exitCode, 1);
    QVERIFY2(run.err.contains("missing.tailwise"), run.err.constData());
    run = cli({"report", sample(), "--out", dir.filePath(QStringLiteral("no-such-folder/x.pdf"))});
    QCOMPARE(run.exitCode, 1);
    QVERIFY2(run.err.contains("no-such-folder"), run.err.constData());
    QVERIFY(!QFile::exists(out));
    run = cli({"report", "--help"});
    QCOMPARE(run.exitCode, 0);
    QVERIFY(run.out.contains("--out FILE.pdf"));
}

QTEST_MAIN(TestCliReport)
#include "test_cli_report.moc"

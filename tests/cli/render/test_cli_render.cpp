// `tailwise-cli render` as a user runs it: each chart of the sample workbook (which carries a
// backtest setting) is written with no display at all (no QT_QPA_PLATFORM, no DISPLAY: the
// command picks Qt's offscreen platform itself), in each format, at the size and dpi asked;
// captions are given, generated or left out; on success it says what it wrote and stderr stays
// empty, even with no XDG_RUNTIME_DIR; bad options exit 2 naming the option, a bad
// workbook exits 1 naming the file; and the commands that do not draw still run where no GUI
// platform can start. Format facts: PNG signature (ISO/IEC 15948), PDF header (ISO 32000-1).
#include <QFile>
#include <QImage>
#include <QProcess>
#include <QProcessEnvironment>
#include <QTemporaryDir>
#include <QTest>
#include <QXmlStreamReader>

namespace {

const QString cli = QStringLiteral(TAILWISE_CLI);
const QString sample = QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise");

struct Run {
    int exitCode = -1;
    QString out;
    QString err;
};

// With no display and no platform named, unless `platform` is given.
Run runCli(const QStringList &args, const QString &platform = {})
{
    QProcess p;
    QProcessEnvironment env = QProcessEnvironment::systemEnvironment();
    env.remove(QStringLiteral("QT_QPA_PLATFORM"));
    env.remove(QStringLiteral("DISPLAY"));
    env.remove(QStringLiteral("WAYLAND_DISPLAY"));
    // As root in a container or under cron: no session runtime folder either.
    env.remove(QStringLiteral("XDG_RUNTIME_DIR"));
    if (!platform.isEmpty())
        env.insert(QStringLiteral("QT_QPA_PLATFORM"), platform);
    p.setProcessEnvironment(env);
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
        .arg(r.out.left(400), r.err.left(600));
}

QByteArray readAll(const QString &path)
{
    QFile f(path);
    return f.open(QIODevice::ReadOnly) ? f.readAll() : QByteArray();
}

} // namespace

class TestCliRender : public QObject {
    Q_OBJECT
private slots:
    void everyChartWithoutADisplay_data();
    void everyChartWithoutADisplay();
    void svgAndPdfAtAPreset();
    void customSizeAndDpi();
    void captionGivenGeneratedOrNone();
    void moneyAxesNameTheWorkbooksCurrency();
    void badOptionsExitTwo_data();
    void badOptionsExitTwo();
    void badWorkbookExitsOne();
    void unwritableFileExitsOne();
    void otherCommandsNeedNoGui();
    void help();

private:
    QTemporaryDir m_dir;
};

void TestCliRender::everyChartWithoutADisplay_data()
{
    QTest::addColumn<QString>("chart");
    for (const char *c : {"loss-tail", "tradeoff", "contributions", "backtest", "models"})
        QTest::newRow(c) << QString::fromLatin1(c);
}

void TestCliRender::everyChartWithoutADisplay()
{
    QFETCH(QString, chart);
    const QString out = m_dir.filePath(chart + QStringLiteral(".png"));
    const QStringList args{"render", sample, "--chart", chart, "--out", out, "--preset", "column", "--dpi", "150"};
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    const QByteArray png = readAll(out);
    QVERIFY2(png.startsWith(QByteArray("\x89PNG\r\n\x1a\n", 8)), "PNG signature");
    QImage image;
    QVERIFY(image.loadFromData(png, "PNG"));
    QCOMPARE(image.size(), QSize(502, 443)); // 85 × 75 mm at 150 dpi: round(mm / 25.4 × 150)
    // A script sees only our own words: what was written on stdout, nothing from Qt on stderr.
    QVERIFY2(r.err.isEmpty(), qPrintable(describe(args, r)));
    QVERIFY2(r.out.startsWith(QStringLiteral("Wrote ")) && r.out.contains(out)
                 && r.out.contains(QStringLiteral("PNG, 85 × 75 mm, 502 × 443 px at 150 dpi")),
             qPrintable(describe(args, r)));
}

void TestCliRender::svgAndPdfAtAPreset()
{
    const QString svgPath = m_dir.filePath(QStringLiteral("slide.svg"));
    QStringList args{"render", sample, "--chart", "models", "--out", svgPath, "--preset", "slide"};
    Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    const QByteArray svg = readAll(svgPath);
    QXmlStreamReader xml(svg);
    int texts = 0;
    while (!xml.atEnd())
        if (xml.readNext() == QXmlStreamReader::StartElement && xml.name() == QLatin1String("text"))
            ++texts;
    QVERIFY2(!xml.hasError(), qPrintable(xml.errorString()));
    QVERIFY2(texts > 5, qPrintable(QString::number(texts)));
    QVERIFY2(svg.contains("width=\"254mm\""), svg.left(200).constData());

    const QString pdfPath = m_dir.filePath(QStringLiteral("page.pdf"));
    args = QStringList{"render", sample, "--chart", "backtest", "--out", pdfPath, "--preset", "full-page"};
    r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QVERIFY(readAll(pdfPath).startsWith("%PDF-"));

    // --format wins over the suffix.
    const QString odd = m_dir.filePath(QStringLiteral("picture.out"));
    args = QStringList{"render", sample, "--chart", "loss-tail", "--out", odd, "--format", "pdf"};
    r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QVERIFY(readAll(odd).startsWith("%PDF-"));
}

void TestCliRender::customSizeAndDpi()
{
    const QString out = m_dir.filePath(QStringLiteral("custom.png"));
    const QStringList args{"render", sample, "--chart", "contributions", "--out", out, "--width-mm", "120",
                           "--height-mm", "80", "--dpi", "300"};
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QImage image;
    QVERIFY(image.loadFromData(readAll(out), "PNG"));
    QCOMPARE(image.size(), QSize(1417, 945)); // 120 mm → 1417.3, 80 mm → 944.9 at 300 dpi
    QCOMPARE(qRound(image.dotsPerMeterX() * 0.0254), 300);
}

void TestCliRender::captionGivenGeneratedOrNone()
{
    const QString given = m_dir.filePath(QStringLiteral("given.svg"));
    QStringList args{"render", sample, "--chart", "loss-tail", "--out", given, "--caption", "Quarterly letter, figure 2"};
    Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QVERIFY(readAll(given).contains("Quarterly letter, figure 2"));

    const QString generated = m_dir.filePath(QStringLiteral("generated.svg"));
    args = QStringList{"render", sample, "--chart", "loss-tail", "--out", generated};
    r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QVERIFY2(readAll(generated).contains("not the worst case"), "the generated caption carries its caution");

    const QString none = m_dir.filePath(QStringLiteral("none.svg"));
    args = QStringList{"render", sample, "--chart", "loss-tail", "--out", none, "--no-caption"};
    r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QVERIFY(!readAll(none).contains("not the worst case"));
}

// The sample states EUR (samples/README.md): every chart's money axis names it with no option,
// and --currency names another for this picture only.
void TestCliRender::moneyAxesNameTheWorkbooksCurrency()
{
    for (const char *chart : {"loss-tail", "tradeoff", "contributions", "backtest", "models"}) {
        const QString path = m_dir.filePath(QStringLiteral("eur-%1.svg").arg(QLatin1String(chart)));
        const QStringList args{"render", sample, "--chart", QLatin1String(chart), "--out", path, "--no-caption"};
        const Run r = runCli(args);
        QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
        const QByteArray svg = readAll(path);
        QVERIFY2(svg.contains("(EUR") || svg.contains("EUR)") || svg.contains("EUR;"), chart);
        QVERIFY2(!svg.contains("(money"), chart);
    }
    const QString other = m_dir.filePath(QStringLiteral("gbp.svg"));
    const QStringList args{"render", sample, "--chart", "loss-tail", "--out", other, "--currency", "GBP"};
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 0, qPrintable(describe(args, r)));
    QVERIFY(readAll(other).contains("GBP; losses to the left"));
    QVERIFY(!readAll(other).contains("EUR; losses to the left"));
}

void TestCliRender::badOptionsExitTwo_data()
{
    QTest::addColumn<QStringList>("args");
    QTest::addColumn<QString>("names");
    const QString out = QStringLiteral("/tmp/never-written.png");
    QTest::newRow("unknown chart") << QStringList{"render", sample, "--chart", "pie", "--out", out} << "--chart";
    QTest::newRow("no chart") << QStringList{"render", sample, "--out", out} << "--chart";
    QTest::newRow("no out") << QStringList{"render", sample, "--chart", "models"} << "--out";
    QTest::newRow("unknown suffix") << QStringList{"render", sample, "--chart", "models", "--out", "/tmp/x.gif"} << "--out";
    QTest::newRow("bad format") << QStringList{"render", sample, "--chart", "models", "--out", out, "--format", "bmp"} << "--format";
    QTest::newRow("bad preset") << QStringList{"render", sample, "--chart", "models", "--out", out, "--preset", "poster"} << "--preset";
    QTest::newRow("dpi zero") << QStringList{"render", sample, "--chart", "models", "--out", out, "--dpi", "0"} << "--dpi";
    QTest::newRow("dpi text") << QStringList{"render", sample, "--chart", "models", "--out", out, "--dpi", "high"} << "--dpi";
    QTest::newRow("width text") << QStringList{"render", sample, "--chart", "models", "--out", out, "--width-mm", "wide"} << "--width-mm";
    QTest::newRow("height tiny") << QStringList{"render", sample, "--chart", "models", "--out", out, "--height-mm", "3"} << "--height-mm";
    QTest::newRow("no value") << QStringList{"render", sample, "--chart", "models", "--out"} << "--out";
    QTest::newRow("unknown option") << QStringList{"render", sample, "--chart", "models", "--out", out, "--colour", "red"} << "--colour";
    QTest::newRow("both captions") << QStringList{"render", sample, "--chart", "models", "--out", out, "--caption", "x", "--no-caption"} << "--no-caption";
    QTest::newRow("currency in lower case") << QStringList{"render", sample, "--chart", "models", "--out", out, "--currency", "eur"} << "--currency";
    QTest::newRow("currency a word") << QStringList{"render", sample, "--chart", "models", "--out", out, "--currency", "euros"} << "--currency";
    QTest::newRow("no workbook") << QStringList{"render", "--chart", "models", "--out", out} << "WORKBOOK";
}

void TestCliRender::badOptionsExitTwo()
{
    QFETCH(QStringList, args);
    QFETCH(QString, names);
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 2, qPrintable(describe(args, r)));
    QVERIFY2(r.err.contains(names + QStringLiteral(":")), qPrintable(describe(args, r)));
}

void TestCliRender::badWorkbookExitsOne()
{
    const QString missing = m_dir.filePath(QStringLiteral("nowhere.tailwise"));
    QStringList args{"render", missing, "--chart", "models", "--out", m_dir.filePath("a.png")};
    Run r = runCli(args);
    QVERIFY2(r.exitCode == 1 && r.err.contains(QStringLiteral("nowhere.tailwise")), qPrintable(describe(args, r)));

    const QString broken = m_dir.filePath(QStringLiteral("broken.tailwise"));
    QFile f(broken);
    QVERIFY(f.open(QIODevice::WriteOnly));
    f.write("{\"kind\": \"tailwise-workbook\", \"format\": 1,\n \"holdings\": [");
    f.close();
    args = QStringList{"render", broken, "--chart", "models", "--out", m_dir.filePath("b.png")};
    r = runCli(args);
    QVERIFY2(r.exitCode == 1 && r.err.contains(QStringLiteral("broken.tailwise")), qPrintable(describe(args, r)));
    QVERIFY(!QFile::exists(m_dir.filePath("b.png")));
}

void TestCliRender::unwritableFileExitsOne()
{
    const QString out = m_dir.filePath(QStringLiteral("no-such-folder/chart.png"));
    const QStringList args{"render", sample, "--chart", "loss-tail", "--out", out};
    const Run r = runCli(args);
    QVERIFY2(r.exitCode == 1 && r.err.contains(QStringLiteral("no-such-folder/chart.png")), qPrintable(describe(args, r)));
}

void TestCliRender::otherCommandsNeedNoGui()
{
    // A platform that cannot start: var must not try to make the GUI application.
    const QStringList args{"var", "--workbook", sample};
    const Run r = runCli(args, QStringLiteral("no-such-platform"));
    QVERIFY2(r.exitCode == 0 && r.out.contains(QStringLiteral("VaR")), qPrintable(describe(args, r)));
}

void TestCliRender::help()
{
    const Run r = runCli({"render", "--help"});
    QCOMPARE(r.exitCode, 0);
    for (const char *word : {"loss-tail", "tradeoff", "contributions", "backtest", "models", "--preset", "--dpi",
                             "--width-mm", "--no-caption", "not the worst"})
        QVERIFY2(r.out.contains(QLatin1String(word)), word);
    const Run top = runCli({"--help"});
    QVERIFY(top.out.contains(QStringLiteral("render")));
}

QTEST_MAIN(TestCliRender)
#include "test_cli_render.moc"

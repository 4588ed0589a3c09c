// The PDF report of a workbook: its layout (header, pages, tables kept with their headers) and
// its words (headline figures equal to core's to the digit shown, every assumption, the cautions).
//
// The reference for each figure is core's own result for the same inputs (computeRisk, checked
// against published values in tests/core), formatted as the window formats it; the text is taken
// out of the PDF with poppler's pdftotext when it is installed (scripts/setup.sh installs it),
// and those checks are skipped otherwise. The PDF header ("%PDF-") and the page count are checked
// always.
#include "actions.h"
#include "document/resultsstore.h"
#include "document/workbook.h"
#include "document/workbookfile.h"
#include "mainwindow.h"
#include "export/reportexport.h"
#include "export/reportpdf.h"
#include "export/reportsections.h"
#include "text/numbers.h"
#include "text/version.h"

#include "tailwise/backtest.h"
#include "tailwise/comparison.h"
#include "tailwise/risk.h"
#include "tailwise/date.h"
#include "tailwise/inputhash.h"
#include "tailwise/limits.h"

#include <QAction>
#include <QBuffer>
#include <QMenu>
#include <QMenuBar>
#include <QFile>
#include <QPainter>
#include <QProcess>
#include <QRegularExpression>
#include <QStandardPaths>
#include <QTemporaryDir>
#include <QTest>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

QString samplePath() { return QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise"); }

// The page count as the PDF's page tree states it ("/Type /Pages … /Count n").
int pdfPageCount(const QByteArray &pdf)
{
    const QRegularExpression re(QStringLiteral("/Type\\s*/Pages\\b[^>]*?/Count\\s+(\\d+)"));
    const auto m = re.match(QString::fromLatin1(pdf));
    return m.hasMatch() ? m.captured(1).toInt() : -1;
}

// pdftotext's text of the PDF, or a null string when poppler is not installed.
QString pdfText(const QString &path)
{
    const QString tool = QStandardPaths::findExecutable(QStringLiteral("pdftotext"));
    if (tool.isEmpty())
        return {};
    QProcess p;
    p.start(tool, {QStringLiteral("-enc"), QStringLiteral("UTF-8"), path, QStringLiteral("-")});
    if (!p.waitForFinished(60000))
        return {};
    return QString::fromUtf8(p.readAllStandardOutput());
}

// pdftotext breaks lines where the page does; compare with all white space made single spaces.
QString squeezed(QString s) { return s.replace(QRegularExpression(QStringLiteral("\\s+")), QStringLiteral(" ")); }

} // namespace

class TestReport : public QObject {
    Q_OBJECT
private slots:
    void sampleReportHasItsFiguresAssumptionsAndCautions();
    void longTablesRunOverPagesWithTheirHeader();
    void refusesAnUnwritablePath();
    void reportWithoutFiguresStillHasAssumptionsAndCautions();
    void reportStatesTheMultiDayScaling();
    void windowExportsTheReportFromTheFileMenu();
    void reportCarriesTheRunStamp();
    void reportHasTheLimitsTable();
};

void TestReport::sampleReportHasItsFiguresAssumptionsAndCautions()
{
    auto loaded = loadWorkbook(samplePath());
    QVERIFY2(loaded.ok(), loaded.ok() ? "" : loaded.error().message.c_str());
    const WorkbookContents contents = loaded.value();
    // The reference: core's figures for the same inputs, computed here apart from the report.
    const auto reference = computeRisk(contents.prices, contents.holdings, contents.assumptions);
    QVERIFY(reference.ok());
    const RiskReport &r = reference.value();
    BacktestRequest request{contents.prices, contents.holdings, contents.assumptions};
    request.assumptions.window = contents.backtest->window;
    request.assumptions.model = contents.backtest->models.front();
    request.assumptions.horizonDays = 1;
    const auto backtest = runBacktest(request);
    QVERIFY(backtest.ok());
    const BacktestResult &b = backtest.value();

    const ReportData data = computeReportData(contents);
    QVERIFY(data.results.ok());
    QCOMPARE(data.otherBacktests.size(), contents.backtest->models.size() - 1);
    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("report.pdf"));
    const auto pages = writeReport(data, QStringLiteral("larchmere.tailwise"), path, QDate(2026, 12, 1));
    QVERIFY2(pages.ok(), pages.ok() ? "" : pages.error().message.c_str());
    QFile file(path);
    QVERIFY(file.open(QIODevice::ReadOnly));
    const QByteArray pdf = file.readAll();
    QVERIFY2(pdf.startsWith("%PDF-"), pdf.left(16).constData());
    QCOMPARE(pdfPageCount(pdf), pages.value());
    QVERIFY2(pages.value() >= 4, qPrintable(QString::number(pages.value())));
    if (qEnvironmentVariableIsSet("TAILWISE_KEEP_REPORT")) // to look at the pages: pdftoppm -r 80 -png
        QFile::copy(path, qEnvironmentVariable("TAILWISE_KEEP_REPORT"));

    const QString text = pdfText(path);
    if (text.isNull())
        QSKIP("pdftotext (poppler-utils) is not installed: the PDF's text is not checked");
    const QString flat = squeezed(text);
    auto expect = [&](const QString &needle) {
        QVERIFY2(flat.contains(squeezed(needle)), qPrintable(QStringLiteral("missing \"%1\" in:\n%2").arg(needle, flat)));
    };
    // Headline: core's VaR and ES in money and as % of value, to the digits the report shows.
    expect(moneyText(r.figures.var));
    expect(moneyText(r.figures.es));
    expect(percentText(r.varFraction));
    expect(percentText(r.esFraction));
    expect(moneyText(r.portfolioValue, 0));
    // Every holding in the contributions table, with its component VaR.
    for (const HoldingRisk &h : r.holdings) {
        expect(QString::fromStdString(h.asset));
        expect(moneyText(h.componentVar, 0));
    }
    // The assumptions.
    for (const char *s : {"Price history", "Window", "Returns", "Weighting (estimator)", "Expected gain (mean)",
                          "Model", "Confidence", "Horizon", "Days a year", "Simple (percentage change)", "Equal weights"})
        expect(QString::fromUtf8(s));
    expect(QStringLiteral("the 500 most recent daily returns"));
    expect(QStringLiteral("10 trading days"));
    expect(dateText(r.windowFirst));
    expect(dateText(r.windowLast));
    // The backtest and its tests.
    expect(QStringLiteral("Backtest"));
    expect(QStringLiteral("Kupiec"));
    expect(QStringLiteral("Christoffersen independence"));
    expect(QStringLiteral("%1 exceptions in %2 days").arg(QLocale().toString(b.exceptions), QLocale().toString(b.observations)));
    // The models compared.
    expect(QStringLiteral("The models compared"));
    expect(QStringLiteral("Cornish–Fisher"));
    // The cautions.
    expect(QStringLiteral("VaR is not the worst case"));
    expect(QStringLiteral("Neither figure is a forecast, a guarantee or advice"));
    expect(QStringLiteral("the models your supervisor has approved"));
    expect(QStringLiteral("past window describes the future"));
    // Header and footer on every page.
    expect(QStringLiteral("Page 1 of %1").arg(pages.value()));
    expect(QStringLiteral("Page %1 of %1").arg(pages.value()));
    QCOMPARE(text.count(QStringLiteral("larchmere.tailwise")) >= pages.value(), true);
    QVERIFY2(!flat.contains(QRegularExpression(QStringLiteral("\\b(nan|inf)\\b"), QRegularExpression::CaseInsensitiveOption)),
             qPrintable(flat));
}

void TestReport::longTablesRunOverPagesWithTheirHeader()
{
    report::Document doc;
    doc.workbookName = QStringLiteral("long.tailwise");
    doc.dateText = QStringLiteral("1 December 2026");
    doc.add(report::TextStyle::Heading, QStringLiteral("A long table"));
    report::Table t;
    t.columns = {{QStringLiteral("Row"), false, 1.0}, {QStringLiteral("Amount"), true, 1.0}};
    for (int i = 0; i < 200; ++i)
        t.rows.push_back({QStringLiteral("row %1").arg(i), QString::number(i * 1000)});
    // A name wider than its column is broken inside the cell, not run into the next one.
    t.rows.push_back({QStringLiteral("AN_ASSET_CODE_FAR_TOO_LONG_FOR_HALF_A_PAGE_OF_TABLE_WIDTH_XXXXXXXXXXXXXX"),
                      QStringLiteral("1")});
    doc.add(t);
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    const int pages = report::writePdf(doc, buffer);
    QVERIFY2(pages >= 3, qPrintable(QString::number(pages)));
    QCOMPARE(pdfPageCount(buffer.data()), pages);

    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("long.pdf"));
    QVERIFY(report::writePdf(doc, path).ok());
    const QString text = pdfText(path);
    if (text.isNull())
        QSKIP("pdftotext (poppler-utils) is not installed");
    // Every page after the first repeats the header, marked as continued; no row is lost.
    QCOMPARE(text.count(QStringLiteral("Row (continued)")), pages - 1);
    for (int i : {0, 57, 199})
        QVERIFY2(text.contains(QStringLiteral("row %1\n").arg(i)) || text.contains(QStringLiteral("row %1 ").arg(i)),
                 qPrintable(QString::number(i)));
}

void TestReport::refusesAnUnwritablePath()
{
    report::Document doc;
    doc.add(report::TextStyle::Body, QStringLiteral("x"));
    const auto written = report::writePdf(doc, QStringLiteral("/nonexistent-folder/report.pdf"));
    QVERIFY(!written.ok());
    QVERIFY2(written.error().message.find("/nonexistent-folder/report.pdf") != std::string::npos,
             written.error().message.c_str());
}

void TestReport::reportWithoutFiguresStillHasAssumptionsAndCautions()
{
    WorkbookContents empty;
    report::ReportInputs in;
    in.contents = &empty;
    in.workbookName = QStringLiteral("Untitled");
    in.date = QDate(2026, 12, 1);
    in.report = Error{ErrorKind::InsufficientData, "there is no price history yet", "", 0, 0, "prices"};
    const QString words = report::buildReport(in).plainText();
    QVERIFY2(words.contains(QStringLiteral("there is no price history yet")), qPrintable(words));
    QVERIFY2(words.contains(QStringLiteral("Assumptions")), qPrintable(words));
    QVERIFY2(words.contains(QStringLiteral("VaR is not the worst case")), qPrintable(words));
}

// The multi-day scaling in words (multidayscaling.h), with what it used at the workbook's horizon
// (core's figures for the same inputs), in the headline section and the assumptions table.
void TestReport::reportStatesTheMultiDayScaling()
{
    auto loaded = loadWorkbook(samplePath());
    QVERIFY(loaded.ok());
    WorkbookContents contents = loaded.value();
    contents.assumptions.model = RiskModel::StudentT;
    for (MultiDayScaling scaling : {MultiDayScaling::SquareRoot, MultiDayScaling::Aggregate}) {
        contents.assumptions.scaling = scaling;
        report::ReportInputs in;
        in.contents = &contents;
        in.workbookName = QStringLiteral("larchmere.tailwise");
        in.date = QDate(2026, 12, 1);
        in.report = computeRisk(contents.prices, contents.holdings, contents.assumptions);
        QVERIFY(in.report.ok());
        const RiskReport &r = in.report.value();
        const QString words = report::buildReport(in).plainText();
        QVERIFY2(words.contains(QStringLiteral("Longer horizons")), qPrintable(words));
        if (scaling == MultiDayScaling::SquareRoot) {
            QVERIFY2(words.contains(QStringLiteral("Scale one day by √H")), qPrintable(words));
            QVERIFY2(words.contains(QStringLiteral("One-day figure × √10, with one day's tails.")), qPrintable(words));
        } else {
            QVERIFY2(words.contains(QStringLiteral("Apply the model to the H-day sum")), qPrintable(words));
            const QString used = QStringLiteral("Model applied to the 10-day sum: ν = %1 there (%2 for one day).")
                                     .arg(QLocale().toString(*r.model.horizonDof, 'f', 2),
                                          QLocale().toString(*r.model.dof, 'f', 2));
            QVERIFY2(words.contains(used), qPrintable(used + QStringLiteral("\n") + words));
        }
    }
    // Not for the normal model, which has no such choice.
    contents.assumptions.model = RiskModel::Normal;
    report::ReportInputs in;
    in.contents = &contents;
    in.date = QDate(2026, 12, 1);
    in.report = computeRisk(contents.prices, contents.holdings, contents.assumptions);
    QVERIFY(!report::buildReport(in).plainText().contains(QStringLiteral("Longer horizons")));
}

void TestReport::windowExportsTheReportFromTheFileMenu()
{
    QCoreApplication::setOrganizationName(QStringLiteral("TailwiseTests"));
    QCoreApplication::setApplicationName(QStringLiteral("TailwiseReportTests"));
    MainWindow window;
    QCOMPARE(window.openWorkbookFile(samplePath()), QString());
    window.results().computeNow(Part::Headline);
    // The command is on the File menu.
    QAction *action = window.actions().get(Actions::ExportReport);
    QMenu *file = window.menuBar()->findChild<QMenu *>();
    bool onFileMenu = false;
    for (QMenu *menu : window.menuBar()->findChildren<QMenu *>())
        onFileMenu = onFileMenu || menu->actions().contains(action);
    QVERIFY(file && onFileMenu);

    QTemporaryDir dir;
    const QString path = dir.filePath(QStringLiteral("from-window.pdf"));
    window.exportReportFile(path);
    QVERIFY(!action->isEnabled()); // one report at a time
    QTRY_VERIFY_WITH_TIMEOUT(action->isEnabled(), 60000);
    QFile pdf(path);
    QVERIFY2(pdf.open(QIODevice::ReadOnly), qPrintable(path));
    const QByteArray bytes = pdf.readAll();
    QVERIFY(bytes.startsWith("%PDF-"));
    QVERIFY(pdfPageCount(bytes) >= 3);
    const QString text = pdfText(path);
    if (text.isNull())
        QSKIP("pdftotext (poppler-utils) is not installed");
    // The window's own headline figure is on the report.
    QVERIFY(window.workbook().results().report().has_value());
    QVERIFY2(squeezed(text).contains(moneyText(window.workbook().results().report()->figures.var)), qPrintable(text.left(2000)));
}

// The report names what made it, as the command line's stamp does (tool_version, as_of, seed,
// input_sha256; tailwise/inputhash.h): in its words and in the PDF's XMP metadata (ISO 16684-1),
// so that a figure in a letter can be traced to its inputs.
void TestReport::reportCarriesTheRunStamp()
{
    auto loaded = loadWorkbook(samplePath());
    QVERIFY(loaded.ok());
    WorkbookContents contents = loaded.value();
    const QString digest = QString::fromStdString(inputSha256(contents.prices, contents.holdings, contents.assumptions));
    QCOMPARE(digest.size(), qsizetype(64));
    const QString asOf = QString::fromStdString(toIso(contents.prices.dates.back()));

    ReportData data = computeReportData(contents);
    QBuffer buffer;
    QVERIFY(buffer.open(QIODevice::WriteOnly));
    QVERIFY(writeReport(data, QStringLiteral("larchmere.tailwise"), buffer, QDate(2026, 12, 1)) > 0);
    const QByteArray pdf = buffer.data();
    QVERIFY2(pdf.contains(("input_sha256=" + digest).toLatin1()), "the digest in the PDF's metadata");
    QVERIFY2(pdf.contains(("as_of=" + asOf).toLatin1()), "the as-of date in the PDF's metadata");
    QVERIFY2(pdf.contains(QByteArray("tool_version=") + versionText()), "the version in the PDF's metadata");
    QVERIFY2(pdf.contains("<dc:description>"), "a subject in the PDF's metadata");

    report::ReportInputs in;
    in.contents = &contents;
    in.workbookName = QStringLiteral("larchmere.tailwise");
    in.date = QDate(2026, 12, 1);
    const QString words = report::buildReport(in).plainText();
    QVERIFY2(words.contains(digest) && words.contains(asOf), qPrintable(words.left(800)));
    QVERIFY2(!words.contains(QStringLiteral("seed")), "no seed unless Monte Carlo");

    // A changed confidence changes the digest; Monte Carlo names its seed.
    contents.assumptions.confidence = 0.975;
    contents.assumptions.model = RiskModel::MonteCarlo;
    contents.assumptions.seed = 424242;
    const QString other = report::buildReport(in).plainText();
    QVERIFY(!other.contains(digest));
    QVERIFY2(other.contains(QStringLiteral("seed 424242")), qPrintable(other.left(800)));
}

// The workbook's limits in the report: each one's use (the figure over the limit in money) and
// state in words, from the same definitions as the command line's JSON (tailwise/limits.h:
// use = figure / limit; warning from warning level × limit; breached above the limit).
void TestReport::reportHasTheLimitsTable()
{
    auto loaded = loadWorkbook(samplePath());
    QVERIFY(loaded.ok());
    WorkbookContents contents = loaded.value();
    const auto reference = computeRisk(contents.prices, contents.holdings, contents.assumptions);
    QVERIFY(reference.ok());
    const double var = reference.value().figures.var;
    contents.limits = {parseLimit("var=" + std::to_string(var * 2.0)).value(),  // 50% used: ok
                       parseLimit("var=" + std::to_string(var / 0.9)).value(),  // 90% used: warning
                       parseLimit("es=" + std::to_string(var)).value()};        // ES > VaR: breached
    report::ReportInputs in;
    in.contents = &contents;
    in.workbookName = QStringLiteral("larchmere.tailwise");
    in.date = QDate(2026, 12, 1);
    in.report = reference;
    const report::Document doc = report::buildReport(in);
    const QString words = doc.plainText();
    QVERIFY2(words.contains(QStringLiteral("Limits")), qPrintable(words.left(1500)));
    QVERIFY2(words.contains(percentText(0.5, 1)) && words.contains(percentText(0.9, 1)), qPrintable(words.left(3000)));
    QVERIFY(words.contains(QStringLiteral("BREACHED")) && words.contains(QStringLiteral("warning")));
    QVERIFY(words.contains(QStringLiteral("At least one limit is breached")));

    contents.limits.clear();
    QVERIFY(!report::buildReport(in).plainText().contains(QStringLiteral("Limit in money")));
}

QTEST_MAIN(TestReport)
#include "test_report.moc"

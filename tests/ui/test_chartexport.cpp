// Chart export (ui/export): every chart of the sample workbook in every format is really that
// format — PNG by its signature and its pixel size at the dpi and mm asked for, SVG as XML with
// <text> elements (text stays text), PDF by its header, its one page and its fonts — and the
// captions quote the core's own figures (computed here straight from core, not from the export
// code) and follow a changed assumption. Format facts: the PNG signature and pHYs (ISO/IEC
// 15948), the PDF header "%PDF-" and page objects "/Type /Page" (ISO 32000-1, 7.5.2 and 7.7.3.3).
#include "charts/chartstyle.h"
#include "document/backtestrequest.h"
#include "document/workbookfile.h"
#include "export/captions.h"
#include "export/chartrender.h"
#include "export/plotcheck.h"
#include "export/workbookresults.h"
#include "text/numbers.h"

#include "tailwise/backtest.h"
#include "tailwise/comparison.h"
#include "tailwise/risk.h"

#include <QBuffer>
#include <QImage>
#include <QRegularExpression>
#include <QTest>

#include <qcustomplot.h>
#include <QXmlStreamReader>

#include <algorithm>
#include <limits>
#include <memory>

using namespace tailwise;
using namespace tailwise::ui;

Q_DECLARE_METATYPE(tailwise::ui::ChartKind)
Q_DECLARE_METATYPE(tailwise::ui::ExportFormat)

namespace {

const QString samplePath = QStringLiteral(TAILWISE_SOURCE_DIR "/samples/larchmere.tailwise");

WorkbookContents sample()
{
    auto loaded = loadWorkbook(samplePath);
    if (!loaded)
        qFatal("cannot load the sample: %s", loaded.error().message.c_str());
    return std::move(loaded).value();
}

// The first attribute of an SVG whose value holds a number that is not finite ("inf", "-inf",
// "nan", as Qt writes them), or empty. Attribute values only: text may say anything.
QString svgNonFiniteNumber(const QByteArray &svg)
{
    static const QRegularExpression token(QStringLiteral("(^|[^A-Za-z])-?(inf|nan)($|[^A-Za-z])"),
                                          QRegularExpression::CaseInsensitiveOption);
    QXmlStreamReader xml(svg);
    while (!xml.atEnd()) {
        if (xml.readNext() != QXmlStreamReader::StartElement)
            continue;
        for (const QXmlStreamAttribute &a : xml.attributes())
            if (token.match(a.value()).hasMatch())
                return QStringLiteral("<%1 %2=\"%3\">").arg(xml.name(), a.name(), a.value());
    }
    return {};
}

const WorkbookResults &sampleResults()
{
    static const WorkbookResults results = [] {
        auto r = computeWorkbookResults(sample());
        if (!r)
            qFatal("no results for the sample: %s", r.error().message.c_str());
        return std::move(r).value();
    }();
    return results;
}

QByteArray written(const ChartExportSettings &settings, const WorkbookResults &results, QString *error = nullptr)
{
    QByteArray bytes;
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    const auto status = writeChart(buffer, settings, results);
    if (!status && error)
        *error = QString::fromStdString(status.error().message);
    return status ? bytes : QByteArray();
}

int svgTextElements(const QByteArray &svg, QString *problem)
{
    QXmlStreamReader xml(svg);
    int texts = 0;
    bool sawSvg = false;
    while (!xml.atEnd()) {
        xml.readNext();
        if (xml.isStartElement()) {
            if (xml.name() == QLatin1String("svg"))
                sawSvg = true;
            if (xml.name() == QLatin1String("text"))
                ++texts;
        }
    }
    if (xml.hasError())
        *problem = xml.errorString() + QStringLiteral(" at line %1").arg(xml.lineNumber());
    else if (!sawSvg)
        *problem = QStringLiteral("no <svg> element");
    return texts;
}

int pdfPages(const QByteArray &pdf)
{
    // Page objects: "/Type /Page" not followed by "s" (that is the page tree, "/Type /Pages").
    static const QRegularExpression page(QStringLiteral("/Type\\s*/Page(?!s)"));
    int n = 0;
    for (auto it = page.globalMatch(QString::fromLatin1(pdf)); it.hasNext(); it.next())
        ++n;
    return n;
}

} // namespace

class TestChartExport : public QObject {
    Q_OBJECT
private slots:
    void everyChartInEveryFormat_data();
    void everyChartInEveryFormat();
    void pngPixelsFollowDpiAndMm_data();
    void pngPixelsFollowDpiAndMm();
    void presetsAndNames();
    void badSettingsNameTheField();
    void lossTailCaptionQuotesTheCore();
    void contributionsCaptionQuotesTheCore();
    void backtestCaptionQuotesTheCore();
    void modelsCaptionQuotesTheCore();
    void changedAssumptionChangesTheCaption();
    void missingBacktestIsAPartProblem();
    void modelComparisonChartData();
    void captionIsDrawnAsText();
    void noScreenChrome();
    void plotCheckFindsEveryNonFiniteNumber();
};

void TestChartExport::everyChartInEveryFormat_data()
{
    QTest::addColumn<ChartKind>("kind");
    QTest::addColumn<ExportFormat>("format");
    for (const ChartKind kind : allChartKinds)
        for (const ExportFormat format : {ExportFormat::Png, ExportFormat::Svg, ExportFormat::Pdf})
            QTest::addRow("%s.%s", qPrintable(chartKindName(kind)), qPrintable(exportFormatName(format))) << kind << format;
}

void TestChartExport::everyChartInEveryFormat()
{
    QFETCH(ChartKind, kind);
    QFETCH(ExportFormat, format);
    ChartExportSettings s;
    s.kind = kind;
    s.format = format;
    s.dpi = 150;
    s.print.sizeMm = sizePresetMm(SizePreset::HalfPage);
    s.print.caption = captionFor(kind, sampleResults());
    QString error;
    const QByteArray bytes = written(s, sampleResults(), &error);
    QVERIFY2(!bytes.isEmpty(), qPrintable(error));
    switch (format) {
    case ExportFormat::Png: {
        QVERIFY2(bytes.startsWith(QByteArray("\x89PNG\r\n\x1a\n", 8)), "PNG signature");
        QImage image;
        QVERIFY(image.loadFromData(bytes, "PNG"));
        QCOMPARE(image.size(), QSize(1004, 650)); // 170 × 110 mm at 150 dpi: round(mm / 25.4 × 150)
        break;
    }
    case ExportFormat::Svg: {
        QString problem;
        const int texts = svgTextElements(bytes, &problem);
        QVERIFY2(problem.isEmpty(), qPrintable(problem));
        QVERIFY2(texts >= 5, qPrintable(QStringLiteral("%1 <text> elements, expected at least 5").arg(texts)));
        QVERIFY2(bytes.contains("width=\"170mm\"") || bytes.contains("width=\"170.0"), "SVG width in mm");
        QVERIFY2(svgNonFiniteNumber(bytes).isEmpty(), qPrintable(svgNonFiniteNumber(bytes)));
        break;
    }
    case ExportFormat::Pdf:
        QVERIFY2(bytes.startsWith("%PDF-"), bytes.left(8).constData());
        QCOMPARE(pdfPages(bytes), 1);
        QVERIFY2(bytes.contains("/Font"), "the PDF holds fonts, so its text is text");
        break;
    }
}

void TestChartExport::pngPixelsFollowDpiAndMm_data()
{
    QTest::addColumn<double>("widthMm");
    QTest::addColumn<double>("heightMm");
    QTest::addColumn<int>("dpi");
    QTest::addColumn<QSize>("pixels");
    // round(mm / 25.4 × dpi), worked by hand: 85 mm at 300 dpi = 1003.94 → 1004.
    QTest::newRow("column 150") << 85.0 << 75.0 << 150 << QSize(502, 443);
    QTest::newRow("column 300") << 85.0 << 75.0 << 300 << QSize(1004, 886);
    QTest::newRow("column 600") << 85.0 << 75.0 << 600 << QSize(2008, 1772);
    QTest::newRow("custom 100x50 at 300") << 100.0 << 50.0 << 300 << QSize(1181, 591);
}

void TestChartExport::pngPixelsFollowDpiAndMm()
{
    QFETCH(double, widthMm);
    QFETCH(double, heightMm);
    QFETCH(int, dpi);
    QFETCH(QSize, pixels);
    QCOMPARE(exportPixelSize(QSizeF(widthMm, heightMm), dpi), pixels);
    ChartExportSettings s;
    s.kind = ChartKind::LossTail;
    s.format = ExportFormat::Png;
    s.dpi = dpi;
    s.print.sizeMm = QSizeF(widthMm, heightMm);
    const QByteArray bytes = written(s, sampleResults());
    QImage image;
    QVERIFY(image.loadFromData(bytes, "PNG"));
    QCOMPARE(image.size(), pixels);
    // The resolution is stored (pHYs, in dots per metre) so the picture prints at its size.
    QCOMPARE(qRound(image.dotsPerMeterX() * 0.0254), dpi);
}

void TestChartExport::presetsAndNames()
{
    QCOMPARE(sizePresetMm(SizePreset::Column), QSizeF(85, 75));
    QCOMPARE(sizePresetMm(SizePreset::Slide).width() / sizePresetMm(SizePreset::Slide).height() > 1.77, true); // 16:9
    for (const ChartKind k : allChartKinds)
        QCOMPARE(parseChartKind(chartKindName(k)), std::optional<ChartKind>(k));
    QCOMPARE(parseChartKind(QStringLiteral("pie")), std::nullopt);
    for (const SizePreset p : allSizePresets)
        QCOMPARE(parseSizePreset(sizePresetName(p)), std::optional<SizePreset>(p));
    QCOMPARE(exportFormatForPath(QStringLiteral("/tmp/a.SVG")), std::optional<ExportFormat>(ExportFormat::Svg));
    QCOMPARE(exportFormatForPath(QStringLiteral("/tmp/a.gif")), std::nullopt);
}

void TestChartExport::badSettingsNameTheField()
{
    ChartExportSettings s;
    s.print.sizeMm = QSizeF(5, 60);
    QString error;
    QVERIFY(written(s, sampleResults(), &error).isEmpty());
    QVERIFY2(error.startsWith("width-mm:"), qPrintable(error));
    s.print.sizeMm = QSizeF(85, 60);
    s.dpi = 5000;
    QVERIFY(written(s, sampleResults(), &error).isEmpty());
    QVERIFY2(error.startsWith("dpi:"), qPrintable(error));
}

void TestChartExport::lossTailCaptionQuotesTheCore()
{
    const WorkbookContents c = sample();
    const auto core = computeRisk(c.prices, c.holdings, c.assumptions);
    QVERIFY(core);
    const RiskReport &r = core.value();
    const QString caption = captionFor(ChartKind::LossTail, sampleResults());
    // The same figures, in the chart's own number text (chartstyle.h).
    for (const QString &figure : {chartstyle::money(r.figures.var), chartstyle::money(r.figures.es),
                                  chartstyle::percent(*r.varFraction, 1), chartstyle::percent(*r.esFraction, 1),
                                  chartstyle::confidenceText(r.assumptions.confidence), tradingDaysText(r.assumptions.horizonDays),
                                  dateText(r.windowFirst), dateText(r.windowLast)})
        QVERIFY2(caption.contains(figure), qPrintable(QStringLiteral("\"%1\" not in: %2").arg(figure, caption)));
    // …and they are the figures on the chart's markers.
    QVERIFY(sampleResults().lossTail.varLabel.contains(chartstyle::money(r.figures.var)));
    QVERIFY(caption.contains(QStringLiteral("not the worst case")));
}

void TestChartExport::contributionsCaptionQuotesTheCore()
{
    const WorkbookContents c = sample();
    const auto core = computeRisk(c.prices, c.holdings, c.assumptions);
    QVERIFY(core);
    const RiskReport &r = core.value();
    const auto top = std::max_element(r.holdings.begin(), r.holdings.end(),
                                      [](const HoldingRisk &a, const HoldingRisk &b) { return a.componentVar < b.componentVar; });
    const QString caption = captionFor(ChartKind::Contributions, sampleResults());
    for (const QString &figure : {chartstyle::money(r.figures.var), chartstyle::money(r.undiversifiedVar),
                                  chartstyle::money(r.diversificationBenefit), QString::fromStdString(top->asset),
                                  chartstyle::money(top->componentVar)})
        QVERIFY2(caption.contains(figure), qPrintable(QStringLiteral("\"%1\" not in: %2").arg(figure, caption)));
}

void TestChartExport::backtestCaptionQuotesTheCore()
{
    const WorkbookContents c = sample();
    QVERIFY2(c.backtest.has_value(), "the sample carries backtest settings");
    const auto core = runBacktest(backtestRequestFor(c, *c.backtest, c.backtest->models.front()));
    QVERIFY(core);
    const QString caption = captionFor(ChartKind::Backtest, sampleResults());
    const QLocale locale;
    for (const QString &figure : {locale.toString(core.value().exceptions) + QStringLiteral(" days lost more"),
                                  locale.toString(core.value().observations) + QStringLiteral(" days"),
                                  locale.toString(core.value().window) + QStringLiteral(" returns"),
                                  locale.toString(core.value().expectedExceptions, 'f', 1)})
        QVERIFY2(caption.contains(figure), qPrintable(QStringLiteral("\"%1\" not in: %2").arg(figure, caption)));
}

void TestChartExport::modelsCaptionQuotesTheCore()
{
    const WorkbookContents c = sample();
    const auto rows = compareModels(c.prices, c.holdings, c.assumptions);
    QVERIFY(rows);
    double lo = 1e300, hi = -1e300;
    for (const ModelRow &row : rows.value())
        if (row.figures) {
            lo = std::min(lo, row.figures->var);
            hi = std::max(hi, row.figures->var);
        }
    const QString caption = captionFor(ChartKind::Models, sampleResults());
    QVERIFY2(caption.contains(chartstyle::money(lo)) && caption.contains(chartstyle::money(hi)), qPrintable(caption));
}

void TestChartExport::changedAssumptionChangesTheCaption()
{
    WorkbookContents c = sample();
    c.assumptions.confidence = 0.95;
    c.assumptions.horizonDays = 1;
    const auto changed = computeWorkbookResults(c);
    QVERIFY(changed);
    const auto core = computeRisk(c.prices, c.holdings, c.assumptions);
    QVERIFY(core);
    for (const ChartKind kind : {ChartKind::LossTail, ChartKind::Tradeoff, ChartKind::Contributions, ChartKind::Models}) {
        const QString before = captionFor(kind, sampleResults());
        const QString after = captionFor(kind, changed.value());
        QVERIFY2(before != after, qPrintable(chartKindName(kind)));
        QVERIFY2(after.contains(chartstyle::confidenceText(0.95)), qPrintable(after));
        QVERIFY2(after.contains(chartstyle::money(core.value().figures.var)), qPrintable(after));
    }
}

void TestChartExport::missingBacktestIsAPartProblem()
{
    WorkbookContents c = sample();
    BacktestSettings s;
    s.window = static_cast<int>(c.prices.dayCount()) + 10; // longer than the whole history
    c.backtest = s;
    const auto results = computeWorkbookResults(c);
    QVERIFY2(results, "the other parts still come");
    QVERIFY(!results.value().backtest);
    QVERIFY(!results.value().backtestProblem.isEmpty());
    QVERIFY(results.value().modelsChart.has_value());
    ChartExportSettings e;
    e.kind = ChartKind::Backtest;
    QString error;
    QVERIFY(written(e, results.value(), &error).isEmpty());
    QVERIFY2(error.contains(QStringLiteral("backtest")), qPrintable(error));
    e.kind = ChartKind::LossTail;
    QVERIFY(!written(e, results.value()).isEmpty());
}

void TestChartExport::modelComparisonChartData()
{
    const WorkbookContents c = sample();
    const auto rows = compareModels(c.prices, c.holdings, c.assumptions);
    QVERIFY(rows);
    const auto d = buildModelComparisonChartData(rows.value(), 1000.0, c.assumptions);
    QCOMPARE(d.groups.size(), rows.value().size());
    for (std::size_t i = 0; i < d.groups.size(); ++i) {
        const ModelRow &row = rows.value()[i];
        QCOMPARE(d.groups[i].hasFigures, row.figures.has_value());
        if (row.figures) {
            QCOMPARE(d.groups[i].var, row.figures->var);
            QCOMPARE(d.groups[i].es, row.figures->es);
            QCOMPARE(*d.groups[i].varFraction, row.figures->var / 1000.0);
            QVERIFY(d.yMax > d.groups[i].es);
        }
        QCOMPARE(d.groups[i].current, row.model == c.assumptions.model);
    }
    QVERIFY(!buildModelComparisonChartData(rows.value(), 0.0, c.assumptions).groups.front().varFraction);
}

void TestChartExport::captionIsDrawnAsText()
{
    ChartExportSettings s;
    s.kind = ChartKind::Models;
    s.format = ExportFormat::Svg;
    s.print.caption = QStringLiteral("Zebra caption 12345");
    const QByteArray svg = written(s, sampleResults());
    QVERIFY2(svg.contains("Zebra"), "the caption is text in the SVG");
    s.print.currency = QStringLiteral("EUR");
    QVERIFY2(written(s, sampleResults()).contains("(EUR)"), "the currency on the money axis");
}

void TestChartExport::noScreenChrome()
{
    // Paper cannot be clicked or hovered: the map's "click to use a point" hint and the loss
    // tail's hover read-out ("P&L below …", losstailchartdata.h) are not drawn.
    ChartExportSettings s;
    s.format = ExportFormat::Svg;
    s.kind = ChartKind::Tradeoff;
    const QByteArray tradeoff = written(s, sampleResults());
    QVERIFY(tradeoff.contains("VaR over horizon and confidence"));
    QVERIFY(!tradeoff.contains("click"));
    s.kind = ChartKind::LossTail;
    const QByteArray tail = written(s, sampleResults());
    QVERIFY(!tail.contains("P&amp;L below"));
    QVERIFY(!tail.contains("P&L below"));
    // White background: the first pixel of a PNG is white.
    const QImage image = renderChartImage(ChartKind::Backtest, sampleResults(), ChartPrintOptions{}, 50);
    QCOMPARE(image.pixelColor(0, 0), QColor(Qt::white));
}

// The last guard before SVG and PDF (export/plotcheck.h): an infinite or undefined number
// anywhere a chart paints is found and named, so the chart says why it is not drawn instead of
// writing "inf" into a file. Common practice: SVG 1.1 and PDF 1.7 numbers are finite decimals.
void TestChartExport::plotCheckFindsEveryNonFiniteNumber()
{
    const double inf = std::numeric_limits<double>::infinity();
    const double nan = std::numeric_limits<double>::quiet_NaN();
    const auto fresh = [] {
        auto plot = std::make_unique<QCustomPlot>();
        plot->xAxis->setLabel(QStringLiteral("Loss"));
        QCPGraph *g = plot->addGraph();
        g->setName(QStringLiteral("density"));
        g->setData(QVector<double>{0.0, 1.0, 2.0}, QVector<double>{0.1, 0.4, 0.1});
        auto *line = new QCPItemStraightLine(plot.get());
        line->point1->setCoords(1.0, 0.0);
        line->point2->setCoords(1.0, 1.0);
        return plot;
    };
    QVERIFY(nonFiniteInPlot(*fresh()).isEmpty());
    {
        auto plot = fresh();
        plot->graph(0)->addData(3.0, inf);
        const QString problem = nonFiniteInPlot(*plot);
        QVERIFY2(problem.contains(QStringLiteral("density")) && problem.contains(QStringLiteral("not a finite number")),
                 qPrintable(problem));
    }
    {
        auto plot = fresh();
        auto *text = new QCPItemText(plot.get());
        text->setText(QStringLiteral("VaR"));
        text->position->setCoords(nan, 0.5);
        const QString problem = nonFiniteInPlot(*plot);
        QVERIFY2(problem.contains(QStringLiteral("VaR")), qPrintable(problem));
    }
    {
        auto plot = fresh();
        auto *bars = new QCPBars(plot->xAxis, plot->yAxis);
        bars->setName(QStringLiteral("contributions"));
        bars->setData(QVector<double>{1.0, 2.0}, QVector<double>{5.0, -inf});
        QVERIFY2(nonFiniteInPlot(*plot).contains(QStringLiteral("contributions")), qPrintable(nonFiniteInPlot(*plot)));
    }
}

QTEST_MAIN(TestChartExport)
#include "test_chartexport.moc"

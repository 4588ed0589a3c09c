// The three charts drawn offscreen from real ChartData: they build, paint, read out the pointer
// and emit the map's pick. Set TAILWISE_CHART_PNG_DIR to also save each chart as a PNG to look at.
#include "chartfixture.h"

#include "charts/contributionschart.h"
#include "charts/losstailchart.h"
#include "charts/tradeoffchart.h"

#include <qcustomplot.h>

#include <QFontMetricsF>
#include <QRegularExpression>
#include <QSignalSpy>
#include <QtTest>

#include <algorithm>
#include <vector>

using namespace tailwise;
using namespace tailwise::ui;

namespace {

void grabAndMaybeSave(QWidget &w, const char *name)
{
    w.resize(900, 500);
    w.show();
    QVERIFY(QTest::qWaitForWindowExposed(&w));
    const QPixmap pixmap = w.grab();
    QVERIFY(!pixmap.isNull());
    QCOMPARE(pixmap.size(), QSize(900, 500));
    // Something was drawn: not a blank image.
    const QImage image = pixmap.toImage();
    QSet<QRgb> colours;
    for (int y = 0; y < image.height(); y += 7)
        for (int x = 0; x < image.width(); x += 7)
            colours.insert(image.pixel(x, y));
    QVERIFY2(colours.size() > 8, qPrintable(QStringLiteral("%1 colours").arg(colours.size())));
    const QByteArray dir = qgetenv("TAILWISE_CHART_PNG_DIR");
    if (!dir.isEmpty())
        QVERIFY(pixmap.save(QString::fromLocal8Bit(dir) + QLatin1Char('/') + QLatin1String(name) + QStringLiteral(".png")));
}

// The pixel box of each visible text item of a laid-out plot (as QCPItemText draws it: the text's
// bounding box plus padding, placed by its position alignment) and the plot area it belongs to.
struct TextBox {
    QString text;
    QRectF box;
    QRectF area;
};

std::vector<TextBox> textBoxes(QCustomPlot *plot)
{
    std::vector<TextBox> boxes;
    for (int i = 0; i < plot->itemCount(); ++i) {
        auto *t = qobject_cast<QCPItemText *>(plot->item(i));
        if (!t || !t->visible() || !t->clipAxisRect() || t->position->typeX() != QCPItemPosition::ptPlotCoords
            || t->position->typeY() != QCPItemPosition::ptPlotCoords)
            continue;
        const QSizeF size = QFontMetricsF(t->font()).boundingRect(QRectF(0, 0, 1e6, 1e6), Qt::AlignCenter, t->text()).size()
                            + QSizeF(t->padding().left() + t->padding().right(), t->padding().top() + t->padding().bottom());
        const QPointF at = t->position->pixelPosition();
        const Qt::Alignment a = t->positionAlignment();
        const double x = a & Qt::AlignLeft ? at.x() : a & Qt::AlignRight ? at.x() - size.width() : at.x() - size.width() / 2;
        const double y = a & Qt::AlignTop ? at.y() : a & Qt::AlignBottom ? at.y() - size.height() : at.y() - size.height() / 2;
        boxes.push_back({t->text(), QRectF(QPointF(x, y), size), QRectF(t->clipAxisRect()->rect())});
    }
    return boxes;
}

QString describe(const TextBox &b)
{
    return QStringLiteral("\"%1\" at (%2, %3)–(%4, %5) px; plot area (%6, %7)–(%8, %9)")
        .arg(b.text)
        .arg(b.box.left()).arg(b.box.top()).arg(b.box.right()).arg(b.box.bottom())
        .arg(b.area.left()).arg(b.area.top()).arg(b.area.right()).arg(b.area.bottom());
}

} // namespace

class TestChartWidgets : public QObject {
    Q_OBJECT
private slots:
    // The texts checked below are written in US English number format.
    void initTestCase() { QLocale::setDefault(QLocale(QLocale::English, QLocale::UnitedStates)); }
    void lossTail();
    void lossTailPercentAndZeroSpread();
    void tradeoff();
    void tradeoffWithExpectedGain();
    void contributions();
    void labelsStayInsideTheirPlots_data();
    void labelsStayInsideTheirPlots();
};

void TestChartWidgets::lossTail()
{
    Assumptions a;
    a.horizonDays = 10;
    const RiskReport r = chartfixture::sampleReport(a);
    LossTailChart chart;
    chart.setData(buildLossTailChartData(r));
    grabAndMaybeSave(chart, "losstail");
    QCOMPARE(chart.data().tailBoundary, -r.figures.var);

    // Hover: the mouse over the plot at −VaR reads the model's 1%.
    QCustomPlot *plot = chart.plot();
    plot->replot();
    const QPoint at(qRound(plot->xAxis->coordToPixel(-r.figures.var)), plot->axisRect()->center().y());
    QTest::mouseMove(plot, at);
    QTRY_VERIFY(!chart.pointerText().isEmpty());
    // Within a pixel of −VaR: about 1% (0.9x% or 1.0x%).
    static const QRegularExpression aboutOne(QStringLiteral("(0\\.9\\d|1\\.0\\d)%"));
    QVERIFY2(aboutOne.match(chart.pointerText()).hasMatch(), qPrintable(chart.pointerText()));
    chart.showPointer(-r.figures.var);
    QVERIFY2(chart.pointerText().contains(QStringLiteral("1.00%")), qPrintable(chart.pointerText()));
    chart.clearPointer();
    QVERIFY(chart.pointerText().isEmpty());
}

void TestChartWidgets::lossTailPercentAndZeroSpread()
{
    LossTailChart chart;
    LossTailOptions o;
    o.unit = LossTailUnit::PercentOfValue;
    chart.setData(buildLossTailChartData(chartfixture::sampleReport(), o));
    grabAndMaybeSave(chart, "losstail-percent");

    LossTailChart flat;
    flat.setData(buildLossTailChartData(chartfixture::positionReport(1'000'000.0, 0.0, 0.05)));
    grabAndMaybeSave(flat, "losstail-zero-spread");
    flat.showPointer(0.0);
    QVERIFY(flat.pointerText().isEmpty());
}

void TestChartWidgets::tradeoff()
{
    Assumptions a;
    a.horizonDays = 21;
    a.confidence = 0.99;
    TradeoffChart chart;
    chart.setData(buildTradeoffChartData(chartfixture::sampleReport(a)));
    grabAndMaybeSave(chart, "tradeoff");

    QSignalSpy picked(&chart, &TradeoffChart::assumptionsPicked);
    chart.mapPlot()->replot();
    QTest::mouseClick(chart.mapPlot(), Qt::LeftButton, {}, chart.mapPixel(126, 0.975));
    QCOMPARE(picked.count(), 1);
    const int h = picked.at(0).at(0).toInt();
    const double c = picked.at(0).at(1).toDouble();
    // One pixel is about one day on a 252-day axis some 500 pixels wide.
    QVERIFY2(std::abs(h - 126) <= 1, qPrintable(QString::number(h)));
    QVERIFY2(std::abs(c - 0.975) < 1.5e-3, qPrintable(QString::number(c)));
    // A click outside the map's plot area picks nothing.
    QTest::mouseClick(chart.mapPlot(), Qt::LeftButton, {}, QPoint(2, 2));
    QCOMPARE(picked.count(), 1);
}

void TestChartWidgets::tradeoffWithExpectedGain()
{
    Assumptions a;
    a.horizonDays = 5;
    TradeoffChart chart;
    chart.setData(buildTradeoffChartData(chartfixture::positionReport(1'000'000.0, 0.20, 0.30, a)));
    QVERIFY(!chart.data().ridge.empty());
    grabAndMaybeSave(chart, "tradeoff-gain");
}

void TestChartWidgets::contributions()
{
    ContributionsChart chart;
    chart.setData(buildContributionsChartData(chartfixture::sampleReport()));
    QVERIFY(chart.data().hasHedges);
    grabAndMaybeSave(chart, "contributions");
    ContributionsChart pooled;
    pooled.setData(buildContributionsChartData(chartfixture::sampleReport(), {6}));
    grabAndMaybeSave(pooled, "contributions-pooled");
}

void TestChartWidgets::labelsStayInsideTheirPlots_data()
{
    QTest::addColumn<QSize>("size");
    QTest::newRow("wide") << QSize(900, 500);
    QTest::newRow("its size hint") << QSize(640, 360);
}

// The bars' value labels and the map's contour labels are placed for the laid-out size: none is
// cut by its plot's frame, and no contour label covers the current setting's label.
void TestChartWidgets::labelsStayInsideTheirPlots()
{
    QFETCH(QSize, size);
    ContributionsChart bars;
    bars.setData(buildContributionsChartData(chartfixture::sampleReport()));
    bars.resize(size);
    bars.show();
    QVERIFY(QTest::qWaitForWindowExposed(&bars));
    bars.plot()->replot();
    int inBars = 0;
    for (const TextBox &b : textBoxes(bars.plot())) {
        if (b.area == QRectF(bars.plot()->axisRect(0)->rect()))
            ++inBars;
        QVERIFY2(b.area.adjusted(-0.5, -0.5, 0.5, 0.5).contains(b.box), qPrintable(describe(b)));
    }
    QCOMPARE(inBars, static_cast<int>(bars.data().bars.size()));

    TradeoffChart map;
    map.setData(buildTradeoffChartData(chartfixture::sampleReport()));
    map.resize(size);
    map.show();
    QVERIFY(QTest::qWaitForWindowExposed(&map));
    map.mapPlot()->replot();
    const std::vector<TextBox> labels = textBoxes(map.mapPlot());
    const auto now = std::find_if(labels.begin(), labels.end(), [](const TextBox &b) { return b.text.startsWith(QStringLiteral("now:")); });
    QVERIFY(now != labels.end());
    int contours = 0;
    for (const TextBox &b : labels) {
        QVERIFY2(b.area.adjusted(-0.5, -0.5, 0.5, 0.5).contains(b.box), qPrintable(describe(b)));
        if (&b != &*now && !b.text.startsWith(QStringLiteral("VaR peaks"))) {
            ++contours;
            QVERIFY2(!b.box.intersects(now->box), qPrintable(describe(b) + QStringLiteral(" covers ") + describe(*now)));
        }
    }
    QVERIFY2(contours >= 2, qPrintable(QString::number(contours)));
}

QTEST_MAIN(TestChartWidgets)
#include "test_chartwidgets.moc"

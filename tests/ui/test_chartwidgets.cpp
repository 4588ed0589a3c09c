// The three charts drawn offscreen from real ChartData: they build, paint, read out the pointer
// and emit the map's pick. Set TAILWISE_CHART_PNG_DIR to also save each chart as a PNG to look at.
#include "chartfixture.h"

#include "charts/contributionschart.h"
#include "charts/losstailchart.h"
#include "charts/tradeoffchart.h"

#include <qcustomplot.h>

#include <QRegularExpression>
#include <QSignalSpy>
#include <QtTest>

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

QTEST_MAIN(TestChartWidgets)
#include "test_chartwidgets.moc"

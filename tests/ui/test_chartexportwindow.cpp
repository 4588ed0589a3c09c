// Export from the window: the Export Chart and Copy Chart commands follow the tab in view
// (enabled on the chart tabs, not on trying a trade or stress), the exporter gathers the
// window's own results (the backtest once its run is done, the comparison once it is current)
// and writes files whose caption quotes the headline's figures; the dialog prefills the caption,
// keeps the user's edit when the chart changes, and switches to a custom size when the mm are
// typed; Copy Chart puts a picture and SVG on the clipboard.
#include "windowfixture.h"

#include "actions.h"
#include "charts/chartstyle.h"
#include "charts/contributionschart.h"
#include "charts/tradeoffchart.h"
#include "document/commands.h"
#include "panels/stresspanel.h"
#include "panels/whatifpanel.h"
#include "export/captions.h"
#include "export/chartexportdialog.h"
#include "document/resultsstore.h"
#include "export/chartexporter.h"
#include "panels/backtestview.h"
#include "panels/charttabs.h"
#include "panels/modelcomparisonview.h"

#include <QAction>
#include <QApplication>
#include <QClipboard>
#include <QComboBox>
#include <QDoubleSpinBox>
#include <QFile>
#include <QLabel>
#include <QMimeData>
#include <QPlainTextEdit>
#include <QTabWidget>
#include <QTemporaryDir>

using namespace tailwise;
using namespace tailwise::ui;

class TestChartExportWindow : public QObject {
    Q_OBJECT
private slots:
    void initTestCase() { test::isolateSettings(); }
    void actionsFollowTheTab();
    void exporterWritesTheWindowsResults();
    void dialogPrefillsAndKeepsEdits();
    void copyPutsPictureAndSvg();
};

void TestChartExportWindow::actionsFollowTheTab()
{
    auto window = test::sampleWindow();
    ChartTabs *tabs = window->chartTabs();
    QAction *exportChart = window->actions().get(Actions::ExportChart);
    QAction *copyChart = window->actions().get(Actions::CopyChart);
    const std::pair<QWidget *, std::optional<ChartKind>> pages[] = {
        {tabs->tabs()->widget(0), ChartKind::LossTail}, {tabs->tradeoffChart(), ChartKind::Tradeoff},
        {tabs->contributionsChart(), ChartKind::Contributions}, {tabs->modelComparison(), ChartKind::Models},
        {tabs->backtestView(), ChartKind::Backtest}, {tabs->whatIfPanel(), std::nullopt}, {tabs->stressPanel(), std::nullopt}};
    for (const auto &[page, kind] : pages) {
        tabs->tabs()->setCurrentWidget(page);
        QCOMPARE(tabs->currentChartKind(), kind);
        QCOMPARE(exportChart->isEnabled(), kind.has_value());
        QCOMPARE(copyChart->isEnabled(), kind.has_value());
    }
}

void TestChartExportWindow::exporterWritesTheWindowsResults()
{
    auto window = test::sampleWindow();
    ChartExporter *exporter = window->chartExporter();
    // Not computed yet: the comparison (its tab was never shown) — a reason, not a stale table.
    auto results = exporter->currentResults();
    QVERIFY(results);
    QVERIFY(!results->modelsChart);
    QVERIFY(!chartUnavailableReason(ChartKind::Models, *results).isEmpty());
    window->chartTabs()->modelComparison()->computeNow();
    window->workbook().results().computeNow(Part::Backtest);
    results = exporter->currentResults();
    QVERIFY(results->modelsChart);
    QVERIFY(results->backtestChart);
    const QString caption = captionFor(ChartKind::LossTail, *results);
    QVERIFY2(caption.contains(chartstyle::money(window->workbook().results().report()->figures.var)), qPrintable(caption));
    // The workbook's currency goes with the results the exporter draws, on every money axis.
    QVERIFY(results->lossTail.xLabel.contains(QStringLiteral("(money;")));
    QVERIFY(edit::setCurrency(window->workbook(), QStringLiteral("EUR")).ok());
    results = exporter->currentResults();
    QCOMPARE(results->currency, QStringLiteral("EUR"));
    QVERIFY2(results->lossTail.xLabel.contains(QStringLiteral("(EUR;")), qPrintable(results->lossTail.xLabel));
    QVERIFY(results->backtestChart->yLabel.contains(QStringLiteral("(EUR)")));
    QVERIFY(results->modelsChart->yLabel.contains(QStringLiteral("(EUR)")));

    QTemporaryDir dir;
    for (const ChartKind kind : allChartKinds) {
        ChartExportSettings s;
        s.kind = kind;
        s.format = ExportFormat::Pdf;
        s.print.sizeMm = sizePresetMm(SizePreset::Column);
        s.print.caption = captionFor(kind, *results);
        const QString path = dir.filePath(chartKindName(kind) + QStringLiteral(".pdf"));
        QCOMPARE(exporter->writeFile(path, s), QString());
        QFile f(path);
        QVERIFY(f.open(QIODevice::ReadOnly));
        QVERIFY(f.read(5) == "%PDF-");
    }
}

void TestChartExportWindow::dialogPrefillsAndKeepsEdits()
{
    auto window = test::sampleWindow();
    const auto results = window->chartExporter()->currentResults();
    QVERIFY(results);
    ChartExportSettings last;
    last.print.sizeMm = sizePresetMm(SizePreset::Column);
    ChartExportDialog dialog(*results, ChartKind::Contributions, last);
    QCOMPARE(dialog.settings().kind, ChartKind::Contributions);
    QCOMPARE(dialog.captionEdit()->toPlainText(), captionFor(ChartKind::Contributions, *results));
    QCOMPARE(dialog.settings().print.sizeMm, QSizeF(85, 75));
    QVERIFY(!dialog.preview()->pixmap().isNull());

    // Another chart: its own caption, while the user has not touched it.
    dialog.chartChoice()->setCurrentIndex(dialog.chartChoice()->findData(static_cast<int>(ChartKind::LossTail)));
    QCOMPARE(dialog.captionEdit()->toPlainText(), captionFor(ChartKind::LossTail, *results));
    dialog.captionEdit()->setPlainText(QStringLiteral("Figure 1: our own words"));
    dialog.chartChoice()->setCurrentIndex(dialog.chartChoice()->findData(static_cast<int>(ChartKind::Tradeoff)));
    QCOMPARE(dialog.settings().print.caption, QStringLiteral("Figure 1: our own words"));

    // A preset fills the mm; typed mm make the size custom.
    dialog.sizeChoice()->setCurrentIndex(dialog.sizeChoice()->findData(static_cast<int>(SizePreset::Slide)));
    QCOMPARE(dialog.settings().print.sizeMm, QSizeF(254, 143));
    dialog.widthMm()->setValue(200);
    QCOMPARE(dialog.sizeChoice()->currentData().toInt(), -1);
    QCOMPARE(dialog.settings().print.sizeMm, QSizeF(200, 143));

    dialog.formatChoice()->setCurrentIndex(dialog.formatChoice()->findData(static_cast<int>(ExportFormat::Svg)));
    QVERIFY(!dialog.dpiChoice()->isEnabled()); // a vector drawing has no resolution
    dialog.formatChoice()->setCurrentIndex(dialog.formatChoice()->findData(static_cast<int>(ExportFormat::Png)));
    QVERIFY(dialog.dpiChoice()->isEnabled());
    dialog.dpiChoice()->setCurrentIndex(dialog.dpiChoice()->findData(600));
    QCOMPARE(dialog.settings().dpi, 600);
}

void TestChartExportWindow::copyPutsPictureAndSvg()
{
    auto window = test::sampleWindow();
    window->chartTabs()->tabs()->setCurrentWidget(window->chartTabs()->contributionsChart());
    QApplication::clipboard()->clear();
    window->actions().get(Actions::CopyChart)->trigger();
    const QMimeData *mime = QApplication::clipboard()->mimeData();
    QVERIFY(mime);
    QVERIFY(mime->hasImage());
    const QImage image = qvariant_cast<QImage>(mime->imageData());
    QCOMPARE(image.size(), exportPixelSize(sizePresetMm(SizePreset::HalfPage), 300));
    QVERIFY(mime->data(QStringLiteral("image/svg+xml")).contains("<svg"));
}

QTEST_MAIN(TestChartExportWindow)
#include "test_chartexportwindow.moc"

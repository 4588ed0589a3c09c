#include "export/chartrender.h"

#include "charts/backtestchart.h"
#include "charts/chartstyle.h"
#include "charts/contributionschart.h"
#include "charts/losstailchart.h"
#include "charts/modelcomparisonchart.h"
#include "charts/tradeoffchart.h"
#include "document/savefile.h"
#include "export/plotcheck.h"

#include <qcustomplot.h>

#include <QBuffer>
#include <QCoreApplication>
#include <QFileInfo>
#include <QFontMetricsF>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>
#include <QPicture>
#include <QRegularExpression>
#include <QSvgGenerator>

#include <algorithm>
#include <cmath>
#include <memory>
#include <vector>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("ChartExport", text); }

// Canvas units per inch: the screen pixel the charts' pens, marks and paddings were made for.
constexpr double canvasPerInch = 96.0;
constexpr double mmPerInch = 25.4;

double canvasUnits(double mm) { return mm / mmPerInch * canvasPerInch; }
int pixelsOfPoints(double points) { return std::max(1, static_cast<int>(std::lround(points * canvasPerInch / 72.0))); }

// The fonts of one picture, in canvas pixels (pixel sizes keep text the same size on every device).
struct PrintFonts {
    int label = 11;
    double screenLabelPoints = 9.0; // the screen's label size, to keep the charts' relative sizes
    QFont scaled(const QFont &screen) const
    {
        QFont f = screen;
        const double ratio = screen.pointSizeF() > 0.0 ? screen.pointSizeF() / screenLabelPoints
                                                      : screen.pixelSize() / (screenLabelPoints * 96.0 / 72.0);
        f.setPixelSize(std::max(6, static_cast<int>(std::lround(label * ratio))));
        return f;
    }
    QFont labelFont() const { return scaled(chartstyle::labelFont()); }
    QFont noteFont() const { return scaled(chartstyle::noteFont()); }
};

PrintFonts fontsFor(const QSizeF &sizeMm, double factor = 1.0)
{
    PrintFonts fonts;
    fonts.label = pixelsOfPoints(printLabelPoints(sizeMm) * factor);
    fonts.screenLabelPoints = std::max(1.0, chartstyle::labelFont().pointSizeF());
    return fonts;
}

QString withCurrency(QString label, const QString &currency)
{
    // The charts say "money" on their money axes: they do not know the currency. On paper the
    // reader should see it, so the word is replaced when the exporter was told the currency.
    if (currency.isEmpty())
        return label;
    static const QRegularExpression word(QStringLiteral("\\bmoney\\b"));
    return label.replace(word, currency);
}

void styleAxisForPrint(QCPAxis *axis, const PrintFonts &fonts, const QString &currency)
{
    axis->setLabelFont(fonts.scaled(axis->labelFont()));
    axis->setTickLabelFont(fonts.scaled(axis->tickLabelFont()));
    axis->setLabel(withCurrency(axis->label(), currency));
    axis->setSelectedParts(QCPAxis::spNone);
}

// The legend out of the plot area into a row under it, `columns` entries a row: on paper the
// fonts are larger against the plot than on screen, and a legend inside would cover the marks.
void moveLegendBelow(QCustomPlot *plot, int columns)
{
    QCPLegend *legend = plot->legend;
    if (auto *inset = plot->axisRect()->insetLayout(); inset && inset->elements(false).contains(legend)) {
        inset->take(legend);
        inset->simplify();
    }
    auto *row = new QCPLayoutGrid;
    const int at = plot->plotLayout()->rowCount();
    plot->plotLayout()->addElement(at, 0, row);
    row->setMargins(QMargins(5, 0, 5, 5));
    row->addElement(0, 0, legend);
    legend->setWrap(columns);
    legend->setFillOrder(QCPLegend::foColumnsFirst, true); // re-flows the entries at the new wrap
    plot->plotLayout()->setRowStretchFactor(at, 0.001);
}

// Over the chart's own style: print fonts, the currency, nothing selected, no click hints, and
// no more number ticks than the width holds.
void applyPrintStyle(QCustomPlot *plot, const QSizeF &pane, const PrintFonts &fonts, const QString &currency)
{
    plot->setBackground(Qt::white);
    plot->deselectAll();
    for (QCPAxisRect *rect : plot->axisRects())
        for (QCPAxis *axis : rect->axes())
            styleAxisForPrint(axis, fonts, currency);
    for (QCPLayoutElement *element : plot->plotLayout()->elements(true)) {
        if (auto *scale = qobject_cast<QCPColorScale *>(element))
            styleAxisForPrint(scale->axis(), fonts, currency);
        if (auto *text = qobject_cast<QCPTextElement *>(element))
            text->setFont(fonts.scaled(text->font()));
    }
    // About one number per 1.1 label widths of "1,500,000" along a horizontal axis.
    const double labelWidth = QFontMetricsF(fonts.scaled(chartstyle::tickFont())).horizontalAdvance(QStringLiteral("-1,500,000"));
    for (QCPAxisRect *rect : plot->axisRects()) {
        QCPAxis *bottom = rect->axis(QCPAxis::atBottom);
        if (bottom && bottom->ticker() && !bottom->ticker().dynamicCast<QCPAxisTickerText>()) {
            const double share = plot->axisRects().size() > 1 ? 0.55 : 0.85;
            bottom->ticker()->setTickCount(std::clamp(static_cast<int>(pane.width() * share / (1.1 * labelWidth)), 2, 6));
        }
    }
    // A label along a vertical axis longer than the pane is high loses its ends; smaller, it fits.
    const double room = pane.height() * (plot->axisRects().size() > 1 ? 0.5 : 0.7);
    for (QCPAxisRect *rect : plot->axisRects())
        for (QCPAxis *axis : {rect->axis(QCPAxis::atLeft), rect->axis(QCPAxis::atRight)}) {
            if (!axis || axis->label().isEmpty())
                continue;
            QFont f = axis->labelFont();
            const QStringList lines = axis->label().split(QLatin1Char('\n'));
            const auto longest = [&] {
                double w = 0.0;
                for (const QString &line : lines)
                    w = std::max(w, QFontMetricsF(f).horizontalAdvance(line));
                return w;
            };
            while (f.pixelSize() > 7 && longest() > room)
                f.setPixelSize(f.pixelSize() - 1);
            axis->setLabelFont(f);
        }
    // Legends in the tick size, smaller still until they fit the width (QCPLegend::setFont passes
    // the font on to the items it holds); titles likewise.
    QFont legendFont = fonts.scaled(chartstyle::tickFont());
    plot->legend->setFont(legendFont);
    const int icon = QFontMetrics(legendFont).height();
    plot->legend->setIconSize(2 * icon, icon);
    plot->legend->setRowSpacing(0);
    // Entries too wide for one row go on more rows (each column as wide as its widest entry)
    // before any text is made smaller.
    while (plot->legend->wrap() > 1 && plot->legend->minimumOuterSizeHint().width() > pane.width() - 8.0) {
        plot->legend->setWrap(plot->legend->wrap() - 1);
        plot->legend->setFillOrder(plot->legend->fillOrder(), true);
    }
    while (legendFont.pixelSize() > 7 && plot->legend->minimumOuterSizeHint().width() > pane.width() - 8.0) {
        legendFont.setPixelSize(legendFont.pixelSize() - 1);
        plot->legend->setFont(legendFont);
    }
    for (QCPLayoutElement *element : plot->plotLayout()->elements(true))
        if (auto *text = qobject_cast<QCPTextElement *>(element)) {
            QFont f = text->font();
            while (f.pixelSize() > 7 && QFontMetricsF(f).horizontalAdvance(text->text()) > pane.width() - 24.0)
                f.setPixelSize(f.pixelSize() - 1);
            text->setFont(f);
        }
    for (int i = 0; i < plot->itemCount(); ++i)
        if (auto *text = qobject_cast<QCPItemText *>(plot->item(i)))
            text->setFont(fonts.scaled(text->font()));
}

// One plot of a picture and where it goes on the canvas.
struct Pane {
    QCustomPlot *plot = nullptr;
    QRectF rect;
};

// The chart widgets of one picture, never shown: they live while the picture is painted.
struct PrintCharts {
    std::unique_ptr<QWidget> host = std::make_unique<QWidget>();
    std::vector<Pane> panes;
    QString note; // the chart's own note (shown above it on screen)
};

void buildPanes(PrintCharts &charts, ChartKind kind, const WorkbookResults &results, const ChartPrintOptions &options,
                const QRectF &area)
{
    QWidget *host = charts.host.get();
    switch (kind) {
    case ChartKind::LossTail: {
        auto *chart = new LossTailChart(host);
        if (options.lossTailUnit == LossTailUnit::Money) {
            chart->setData(results.lossTail);
        } else {
            LossTailOptions o;
            o.unit = options.lossTailUnit;
            o.currency = results.currency;
            chart->setData(buildLossTailChartData(results.report, o));
        }
        chart->clearPointer();
        // One entry a row: the entries are sentences that two columns would cut.
        moveLegendBelow(chart->plot(), 1);
        // On paper the VaR and ES labels are placed so that neither crosses a line (below).
        const LossTailChartData &d = chart->data();
        const PrintFonts fonts = fontsFor(options.sizeMm);
        const auto room = [&](double x) { return (x - d.xMin) / std::max(1e-12, d.xMax - d.xMin) * area.width() * 0.8; };
        const std::vector<QCPItemText *> labels{chart->varLabel(), chart->esLabel()};
        // Each label at its own line. Left of its own line VaR's label would cross ES's line
        // wherever the two lines are closer than the label is wide, so on paper it goes right of its
        // line; ES's goes left of its line where it fits, else right of its own line (lower down
        // than VaR's label, so the two never overlap).
        for (QCPItemText *t : labels) {
            const double width = QFontMetricsF(fonts.scaled(t->font())).horizontalAdvance(t->text()) + 12.0;
            const bool es = t == chart->esLabel();
            const double own = es ? d.esMarker : d.tailBoundary;
            const bool fitsLeft = es && width <= room(own);
            t->setPositionAlignment((fitsLeft ? Qt::AlignRight : Qt::AlignLeft) | Qt::AlignVCenter);
            t->position->setCoords(own, es ? 0.12 : 0.3);
        }
        charts.note = chart->data().note;
        charts.panes.push_back({chart->plot(), area});
        break;
    }
    case ChartKind::Tradeoff: {
        auto *chart = new TradeoffChart(host);
        chart->setData(results.tradeoff);
        chart->setForPaper(); // paper cannot be clicked
        charts.note = results.tradeoff.note;
        // On paper the horizon lines' legend goes under them: inside, at print sizes, it covers
        // the lines and is cut by the frame.
        moveLegendBelow(chart->horizonPlot(), 3);
        chart->horizonPlot()->yAxis->ticker()->setTickCount(3);
        const double gap = canvasUnits(3.0);
        if (area.width() < canvasUnits(120.0)) {
            // A column has room for one picture: the map, which holds both the others.
            charts.panes.push_back({chart->mapPlot(), area});
        } else if (area.width() < area.height() * 1.1) {
            // Tall: the three pictures stacked, the map with the most room.
            // (The horizon lines a little more, for their legend under them.)
            const double h = (area.height() - 2.0 * gap) / 4.3;
            charts.panes.push_back({chart->horizonPlot(), QRectF(area.left(), area.top(), area.width(), 1.3 * h)});
            charts.panes.push_back({chart->confidencePlot(), QRectF(area.left(), area.top() + 1.3 * h + gap, area.width(), h)});
            charts.panes.push_back({chart->mapPlot(), QRectF(area.left(), area.top() + 2.3 * h + 2.0 * gap, area.width(), 2.0 * h)});
        } else {
            // Wide: as on screen, the two lines on the left, the map on the right.
            // The horizon lines get the more height: their legend sits under them.
            const double left = (area.width() - gap) * 10.0 / 23.0;
            const double h = (area.height() - gap) * 0.58;
            const double h2 = area.height() - gap - h;
            charts.panes.push_back({chart->horizonPlot(), QRectF(area.left(), area.top(), left, h)});
            charts.panes.push_back({chart->confidencePlot(), QRectF(area.left(), area.top() + h + gap, left, h2)});
            charts.panes.push_back({chart->mapPlot(), QRectF(area.left() + left + gap, area.top(), area.width() - left - gap, area.height())});
        }
        break;
    }
    case ChartKind::Contributions: {
        auto *chart = new ContributionsChart(host);
        // As many bars as the height holds at the print size (one per 1.7 lines of tick text);
        // the smallest are pooled into "other holdings", as on screen beyond 20.
        const double line = QFontMetricsF(fontsFor(options.sizeMm, 0.9).scaled(chartstyle::tickFont())).height();
        ContributionsOptions bars;
        bars.currency = results.currency;
        bars.maxBars = std::clamp(static_cast<int>((area.height() - 6.0 * line) / (1.7 * line)), 3, 20);
        chart->setData(static_cast<int>(results.report.holdings.size()) > bars.maxBars
                           ? buildContributionsChartData(results.report, bars)
                           : results.contributions);
        QCustomPlot *p = chart->plot();
        // On paper: more room for the diversification step, room right of the longest bar for
        // its label, and the step's sentence left to the caption, which says it in full.
        p->plotLayout()->setColumnStretchFactors({1.6, 1.0});
        if (area.width() < canvasUnits(120.0) && p->axisRectCount() > 1) {
            // Too narrow for two panels: the bars alone; the caption gives the diversification.
            QCPAxisRect *step = p->axisRect(1);
            for (int i = p->itemCount() - 1; i >= 0; --i)
                if (p->item(i)->clipAxisRect() == step)
                    p->removeItem(i);
            step->setVisible(false);
            p->plotLayout()->take(step);
            p->plotLayout()->remove(p->plotLayout()->element(0, 1));
            p->plotLayout()->simplify();
        }
        if (QCPAxisRect *bars = p->axisRect(0)) {
            // (The money range is fitted to the labels by the chart itself, once laid out.)
            // Under the bars, where it covers no hedge.
            if (auto *inset = bars->insetLayout(); inset && inset->elements(false).contains(p->legend)) {
                inset->take(p->legend);
                inset->simplify();
            }
            auto *row = new QCPLayoutGrid;
            const int at = p->plotLayout()->rowCount();
            p->plotLayout()->addElement(at, 0, row);
            row->setMargins(QMargins(5, 0, 5, 3));
            row->addElement(0, 0, p->legend);
            p->legend->setWrap(2);
            p->legend->setFillOrder(QCPLegend::foColumnsFirst, true);
            p->plotLayout()->setRowStretchFactor(at, 0.001);
        }
        if (QCPItemText *note = chart->benefitNote())
            p->removeItem(note);
        charts.panes.push_back({chart->plot(), area});
        break;
    }
    case ChartKind::Backtest: {
        auto *chart = new BacktestChart(host);
        chart->setData(*results.backtestChart);
        // Its legend is already under the plot, in one row; on paper it takes two.
        chart->plot()->legend->setWrap(area.width() < canvasUnits(120.0) ? 1 : area.width() < canvasUnits(200.0) ? 2 : 3);
        chart->plot()->legend->setFillOrder(QCPLegend::foColumnsFirst, true);
        charts.note = results.backtestChart->note;
        charts.panes.push_back({chart->plot(), area});
        break;
    }
    case ChartKind::Models: {
        auto *chart = new ModelComparisonChart(host);
        chart->setData(*results.modelsChart);
        const bool narrow = area.width() < canvasUnits(120.0);
        moveLegendBelow(chart->plot(), narrow ? 1 : 2);
        if (narrow) {
            // Model names on two lines and the bar figures smaller, so neighbours do not collide.
            // Only the VaR bars keep their figure (the ES ones would overlap them); the workbook's
            // model is named in the caption rather than under its bars.
            if (auto ticker = chart->plot()->xAxis->ticker().dynamicCast<QCPAxisTickerText>()) {
                QMap<double, QString> ticks;
                const auto &groups = results.modelsChart->groups;
                for (std::size_t i = 0; i < groups.size(); ++i)
                    ticks.insert(static_cast<double>(i + 1), QString(groups[i].model)
                                                                 .replace(QLatin1Char(' '), QLatin1Char('\n'))
                                                                 .replace(QStringLiteral("–"), QStringLiteral("–\n")));
                ticker->setTicks(ticks);
            }
            // The bars' figures are wider than a group here and would run into each other: the
            // caption gives the headline, lowest and highest figures instead. The axis label on
            // two lines keeps a legible size.
            QCustomPlot *p = chart->plot();
            for (int i = p->itemCount() - 1; i >= 0; --i)
                if (auto *t = qobject_cast<QCPItemText *>(p->item(i))) {
                    const double key = t->position->key();
                    if (std::abs(key - std::round(key)) > 0.001) // the figures sit beside their key
                        p->removeItem(t);
                }
            p->yAxis->setLabel(p->yAxis->label().replace(QStringLiteral(" ("), QStringLiteral("\n(")));
            p->yAxis->ticker()->setTickCount(3); // a short axis: fewer, legible numbers
        }
        charts.note = results.modelsChart->note;
        charts.panes.push_back({chart->plot(), area});
        break;
    }
    }
}

// QCustomPlot paints through its own QCPPainter; a QPicture carries those commands (text as
// text, lines as lines) onto whatever painter the caller has, already scaled.
void paintPane(QPainter &painter, const Pane &pane, const PrintFonts &fonts, const QString &currency)
{
    applyPrintStyle(pane.plot, pane.rect.size(), fonts, currency);
    const int w = std::max(1, static_cast<int>(std::lround(pane.rect.width())));
    const int h = std::max(1, static_cast<int>(std::lround(pane.rect.height())));
    QPicture picture;
    {
        QCPPainter qcp(&picture);
        // Vectorised: pens keep their width under the scaling; no cached label pixmaps.
        qcp.setMode(QCPPainter::pmVectorized);
        qcp.setMode(QCPPainter::pmNoCaching);
        pane.plot->toPainter(&qcp, w, h);
    }
    painter.save();
    painter.translate(pane.rect.topLeft());
    painter.setClipRect(QRectF(0, 0, w, h), Qt::IntersectClip);
    // Playing a picture scales it from the picture's resolution to the device's; the canvas is
    // already scaled onto the device, so that step is undone here.
    if (const QPaintDevice *device = painter.device(); device && device->logicalDpiX() > 0 && device->logicalDpiY() > 0)
        painter.scale(double(picture.logicalDpiX()) / device->logicalDpiX(), double(picture.logicalDpiY()) / device->logicalDpiY());
    painter.drawPicture(QPointF(0, 0), picture);
    painter.restore();
}

} // namespace

QString exportFormatName(ExportFormat format)
{
    switch (format) {
    case ExportFormat::Png: return QStringLiteral("png");
    case ExportFormat::Svg: return QStringLiteral("svg");
    case ExportFormat::Pdf: return QStringLiteral("pdf");
    }
    return {};
}

std::optional<ExportFormat> parseExportFormat(const QString &name)
{
    for (const ExportFormat f : {ExportFormat::Png, ExportFormat::Svg, ExportFormat::Pdf})
        if (name.compare(exportFormatName(f), Qt::CaseInsensitive) == 0)
            return f;
    return std::nullopt;
}

std::optional<ExportFormat> exportFormatForPath(const QString &path)
{
    return parseExportFormat(QFileInfo(path).suffix());
}

QString sizePresetName(SizePreset preset)
{
    switch (preset) {
    case SizePreset::Column: return QStringLiteral("column");
    case SizePreset::HalfPage: return QStringLiteral("half-page");
    case SizePreset::FullPage: return QStringLiteral("full-page");
    case SizePreset::Slide: return QStringLiteral("slide");
    }
    return {};
}

std::optional<SizePreset> parseSizePreset(const QString &name)
{
    for (const SizePreset p : allSizePresets)
        if (sizePresetName(p) == name)
            return p;
    return std::nullopt;
}

QSizeF sizePresetMm(SizePreset preset)
{
    switch (preset) {
    case SizePreset::Column: return {85.0, 75.0};
    case SizePreset::HalfPage: return {170.0, 110.0};
    case SizePreset::FullPage: return {170.0, 230.0};
    case SizePreset::Slide: return {254.0, 143.0};
    }
    return {170.0, 110.0};
}

QString sizePresetTitle(SizePreset preset)
{
    const QSizeF mm = sizePresetMm(preset);
    const QString size = tr("%1 × %2 mm").arg(QLocale().toString(mm.width()), QLocale().toString(mm.height()));
    switch (preset) {
    case SizePreset::Column: return tr("A letter's column (%1)").arg(size);
    case SizePreset::HalfPage: return tr("Half a page (%1)").arg(size);
    case SizePreset::FullPage: return tr("A full page (%1)").arg(size);
    case SizePreset::Slide: return tr("A 16:9 slide (%1)").arg(size);
    }
    return size;
}

double printLabelPoints(const QSizeF &sizeMm)
{
    // About 7.7 pt in a column, 9.4 pt on half or a full page, and more beyond a page's width,
    // 12.3 pt on a slide (read from further away).
    const double w = sizeMm.width();
    return w <= 170.0 ? std::max(7.0, 6.0 + 0.02 * w) : std::min(13.0, 9.4 + 0.035 * (w - 170.0));
}

QSize exportPixelSize(const QSizeF &sizeMm, int dpi)
{
    return QSize(static_cast<int>(std::lround(sizeMm.width() / mmPerInch * dpi)),
                 static_cast<int>(std::lround(sizeMm.height() / mmPerInch * dpi)));
}

QString chartUnavailableReason(ChartKind kind, const WorkbookResults &results)
{
    if (kind == ChartKind::Backtest && !results.backtestChart)
        return tr("No backtest chart: %1").arg(results.backtestProblem);
    if (kind == ChartKind::Models && !results.modelsChart)
        return tr("No model comparison chart: %1").arg(results.modelsProblem);
    return {};
}

QString paintChart(QPainter &painter, const QRectF &target, ChartKind kind, const WorkbookResults &given,
                   const ChartPrintOptions &options)
{
    // A currency given for this picture names the money axes in place of the workbook's own.
    std::optional<WorkbookResults> relabelled;
    if (!options.currency.isEmpty() && options.currency != given.currency)
        relabelled = relabelWorkbookResults(given, options.currency);
    const WorkbookResults &results = relabelled ? *relabelled : given;
    const QSizeF canvas(canvasUnits(options.sizeMm.width()), canvasUnits(options.sizeMm.height()));
    if (target.isEmpty() || canvas.isEmpty())
        return tr("The picture has no area to draw on.");
    const PrintFonts fonts = fontsFor(options.sizeMm);
    // The pictures with several panels or many labels get slightly smaller chart text.
    const PrintFonts chartFonts = fontsFor(options.sizeMm, kind == ChartKind::Tradeoff        ? 0.85
                                                           : kind == ChartKind::Contributions ? 0.9
                                                                                              : 1.0);
    painter.save();
    painter.translate(target.topLeft());
    painter.scale(target.width() / canvas.width(), target.height() / canvas.height());
    painter.setRenderHint(QPainter::Antialiasing);
    painter.setRenderHint(QPainter::TextAntialiasing);
    painter.fillRect(QRectF(QPointF(0, 0), canvas), Qt::white);

    const double margin = canvasUnits(1.5);
    QRectF area(margin, margin, canvas.width() - 2.0 * margin, canvas.height() - 2.0 * margin);
    const QString caption = options.caption.trimmed();
    if (!caption.isEmpty()) {
        // The caption takes what it needs at the bottom, in the label size while it fits in 40% of
        // the height, else smaller (down to about 6 pt); the chart keeps at least half the height.
        QFont font = fonts.labelFont();
        const auto needed = [&] {
            return QFontMetricsF(font)
                .boundingRect(QRectF(0, 0, area.width(), 1e6), Qt::TextWordWrap | Qt::AlignLeft, caption)
                .height();
        };
        while (font.pixelSize() > 8 && needed() > 0.4 * area.height())
            font.setPixelSize(font.pixelSize() - 1);
        const double h = std::min(needed(), area.height() / 2.0);
        const QRectF box(area.left(), area.bottom() - h, area.width(), h);
        painter.setFont(font);
        painter.setPen(chartstyle::ink());
        painter.drawText(box, Qt::TextWordWrap | Qt::AlignLeft | Qt::AlignTop, caption);
        area.setBottom(box.top() - canvasUnits(2.0));
    }

    const QString unavailable = chartUnavailableReason(kind, results);
    if (!unavailable.isEmpty()) {
        painter.setFont(fonts.noteFont());
        painter.setPen(chartstyle::ink());
        painter.drawText(area, Qt::TextWordWrap | Qt::AlignCenter, unavailable);
        painter.restore();
        return unavailable;
    }

    PrintCharts charts;
    // The note first, so its height is known before the charts are laid out.
    buildPanes(charts, kind, results, options, area);
    if (!charts.note.isEmpty()) {
        const QFont font = fonts.noteFont();
        const QRectF needed = QFontMetricsF(font).boundingRect(QRectF(0, 0, area.width(), 1e6),
                                                               Qt::TextWordWrap | Qt::AlignLeft, charts.note);
        painter.setFont(font);
        painter.setPen(chartstyle::ink());
        painter.drawText(QRectF(area.left(), area.top(), area.width(), needed.height()),
                         Qt::TextWordWrap | Qt::AlignLeft | Qt::AlignTop, charts.note);
        area.setTop(area.top() + needed.height() + canvasUnits(1.0));
        charts = PrintCharts{};
        buildPanes(charts, kind, results, options, area);
    }
    // The last guard before a file: a number that is not finite would reach SVG or PDF as text
    // ("inf") that other programs reject, so the chart says why it is not drawn instead.
    for (const Pane &pane : charts.panes) {
        if (const QString problem = nonFiniteInPlot(*pane.plot); !problem.isEmpty()) {
            const QString reason = tr("This chart cannot be drawn: %1.").arg(problem);
            painter.setFont(fonts.noteFont());
            painter.setPen(chartstyle::ink());
            painter.drawText(area, Qt::TextWordWrap | Qt::AlignCenter, reason);
            painter.restore();
            return reason;
        }
    }
    for (const Pane &pane : charts.panes)
        paintPane(painter, pane, chartFonts, options.currency);
    painter.restore();
    return {};
}

tailwise::Status checkExportSettings(const ChartExportSettings &settings)
{
    const auto within = [](double mm) { return std::isfinite(mm) && mm >= minExportMm && mm <= maxExportMm; };
    const QString range = tr("expected a size from %1 to %2 mm").arg(minExportMm).arg(maxExportMm);
    if (!within(settings.print.sizeMm.width()))
        return fieldError(ErrorKind::Assumption, "width-mm", range.toStdString());
    if (!within(settings.print.sizeMm.height()))
        return fieldError(ErrorKind::Assumption, "height-mm", range.toStdString());
    if (settings.dpi < 50 || settings.dpi > 1200)
        return fieldError(ErrorKind::Assumption, "dpi", "expected a resolution from 50 to 1200 dots per inch");
    return Done{};
}

QImage renderChartImage(ChartKind kind, const WorkbookResults &results, const ChartPrintOptions &options, int dpi,
                        QString *notDrawn)
{
    const QSize pixels = exportPixelSize(options.sizeMm, dpi);
    QImage image(pixels, QImage::Format_ARGB32_Premultiplied);
    image.fill(Qt::white);
    // The resolution travels in the PNG (pHYs), so the picture prints at the size asked for.
    const int dotsPerMeter = static_cast<int>(std::lround(dpi / 0.0254));
    image.setDotsPerMeterX(dotsPerMeter);
    image.setDotsPerMeterY(dotsPerMeter);
    QPainter painter(&image);
    const QString reason = paintChart(painter, QRectF(QPointF(0, 0), QSizeF(pixels)), kind, results, options);
    painter.end();
    if (notDrawn)
        *notDrawn = reason;
    return image;
}

tailwise::Status writeChart(QIODevice &device, const ChartExportSettings &settings, const WorkbookResults &results)
{
    if (auto ok = checkExportSettings(settings); !ok)
        return ok;
    const QString unavailable = chartUnavailableReason(settings.kind, results);
    if (!unavailable.isEmpty())
        return fieldError(ErrorKind::Value, "chart", unavailable.toStdString());
    const QSizeF mm = settings.print.sizeMm;
    const QString title = results.title.isEmpty() ? chartKindTitle(settings.kind)
                                                  : tr("%1 — %2").arg(chartKindTitle(settings.kind), results.title);
    bool written = false;
    QString notDrawn;
    switch (settings.format) {
    case ExportFormat::Png: {
        const QImage image = renderChartImage(settings.kind, results, settings.print, settings.dpi, &notDrawn);
        written = notDrawn.isEmpty() && image.save(&device, "PNG");
        break;
    }
    case ExportFormat::Svg: {
        QSvgGenerator svg;
        svg.setOutputDevice(&device);
        // The drawing is in canvas units (the viewBox); the declared size is in tenths of a mm
        // (254 per inch), so width and height come out in whole mm as asked (170mm, not the
        // 170.127mm of a whole number of canvas units).
        const QRectF canvas(0, 0, canvasUnits(mm.width()), canvasUnits(mm.height()));
        svg.setResolution(254);
        svg.setSize(QSize(static_cast<int>(std::lround(mm.width() * 10.0)), static_cast<int>(std::lround(mm.height() * 10.0))));
        svg.setViewBox(canvas);
        // QSvgGenerator writes these as they are; "P&L" must reach the XML escaped.
        svg.setTitle(title.toHtmlEscaped());
        svg.setDescription(settings.print.caption.toHtmlEscaped());
        QPainter painter;
        if (painter.begin(&svg)) {
            notDrawn = paintChart(painter, canvas, settings.kind, results, settings.print);
            written = painter.end();
        }
        break;
    }
    case ExportFormat::Pdf: {
        QPdfWriter pdf(&device);
        pdf.setPageSize(QPageSize(mm, QPageSize::Millimeter, QString(), QPageSize::ExactMatch));
        pdf.setPageMargins(QMarginsF(0, 0, 0, 0));
        pdf.setResolution(1200);
        pdf.setTitle(title);
        pdf.setCreator(QStringLiteral("Tailwise"));
        QPainter painter;
        if (painter.begin(&pdf)) {
            notDrawn = paintChart(painter, QRectF(0, 0, pdf.width(), pdf.height()), settings.kind, results, settings.print);
            written = painter.end();
        }
        break;
    }
    }
    if (!notDrawn.isEmpty())
        return fieldError(ErrorKind::Value, "chart", notDrawn.toStdString());
    if (!written)
        return fieldError(ErrorKind::FileUnreadable, "out", "the picture could not be written");
    return Done{};
}

tailwise::Status writeChart(const QString &path, const ChartExportSettings &settings, const WorkbookResults &results)
{
    // Drawn in memory, then written the one checked way (document/savefile.h): a failed write
    // leaves no partial picture and the old file as it was.
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    if (auto status = writeChart(buffer, settings, results); !status)
        return status;
    buffer.close();
    return saveFile(path, buffer.data());
}

} // namespace tailwise::ui

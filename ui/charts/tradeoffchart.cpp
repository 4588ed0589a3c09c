#include "charts/tradeoffchart.h"

#include "charts/chartstyle.h"
#include "charts/localeticker.h"

#include <qcustomplot.h>

#include <QFontMetricsF>
#include <QGridLayout>
#include <QLabel>

#include <algorithm>
#include <cmath>

namespace tailwise::ui {

namespace {

// Confidence axes run on the tail scale −log10(1 − C); ticks at the levels people quote.
QSharedPointer<QCPAxisTickerText> confidenceTicker(std::initializer_list<double> levels = {0.90, 0.95, 0.975, 0.99,
                                                                                           0.995, 0.999})
{
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    for (double c : levels)
        ticker->addTick(confidenceToTailScale(c), chartstyle::confidenceText(c));
    return ticker;
}

QSharedPointer<QCPAxisTickerText> horizonTicker(int daysPerYear)
{
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    const int n = std::max(1, daysPerYear);
    // 1 day, 1 week, 1 month, 1 quarter, half a year, 1 year, in trading days.
    for (int h : {1, 5, std::max(1, n / 12), std::max(1, n / 4), std::max(1, n / 2), n})
        ticker->addTick(h, QLocale().toString(h));
    return ticker;
}

QCPTextElement *addTitle(QCustomPlot *plot, const QString &text)
{
    plot->plotLayout()->insertRow(0);
    auto *title = new QCPTextElement(plot, text, chartstyle::labelFont());
    QFont f = chartstyle::labelFont();
    f.setBold(true);
    title->setFont(f);
    title->setTextColor(chartstyle::ink());
    plot->plotLayout()->addElement(0, 0, title);
    return title;
}

QCustomPlot *makePlot(QWidget *parent)
{
    auto *plot = new QCustomPlot(parent);
    chartstyle::stylePlot(plot);
    plot->xAxis2->setVisible(false);
    plot->yAxis2->setVisible(false);
    plot->yAxis->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
    plot->setMinimumSize(260, 180);
    return plot;
}

void vertical(QCustomPlot *plot, double x, const QPen &pen)
{
    auto *line = new QCPItemStraightLine(plot);
    line->setPen(pen);
    line->point1->setCoords(x, 0.0);
    line->point2->setCoords(x, 1.0);
}

QCPItemText *note(QCustomPlot *plot, const QString &text, Qt::Alignment align)
{
    auto *t = new QCPItemText(plot);
    t->setText(text);
    t->setFont(chartstyle::tickFont());
    t->setColor(chartstyle::ink());
    t->setBrush(QColor(255, 255, 255, 220));
    t->setPadding(QMargins(3, 1, 3, 1));
    t->setPositionAlignment(align);
    return t;
}

// Light to dark with a steady rise in darkness, so the map reads in greyscale too.
QCPColorGradient varGradient()
{
    QCPColorGradient g;
    g.clearColorStops();
    g.setColorStopAt(0.0, QColor(0xf6, 0xf1, 0xe4));
    g.setColorStopAt(0.35, QColor(0xd9, 0xc2, 0x8f));
    g.setColorStopAt(0.65, QColor(0x8a, 0x9f, 0xa8));
    g.setColorStopAt(1.0, QColor(0x2a, 0x3b, 0x4f));
    g.setColorInterpolation(QCPColorGradient::ciRGB);
    return g;
}

} // namespace

TradeoffChart::TradeoffChart(QWidget *parent) : QWidget(parent)
{
    auto *grid = new QGridLayout(this);
    grid->setContentsMargins(0, 0, 0, 0);
    grid->setSpacing(4);
    m_note = new QLabel(this);
    m_note->setWordWrap(true);
    m_note->setFont(chartstyle::noteFont());
    m_note->hide();
    m_horizonPlot = makePlot(this);
    m_confidencePlot = makePlot(this);
    m_mapPlot = makePlot(this);
    grid->addWidget(m_note, 0, 0, 1, 2);
    grid->addWidget(m_horizonPlot, 1, 0);
    grid->addWidget(m_confidencePlot, 2, 0);
    grid->addWidget(m_mapPlot, 1, 1, 2, 1);
    grid->setColumnStretch(0, 10);
    grid->setColumnStretch(1, 13);
    buildHorizonPlot();
    buildConfidencePlot();
    buildMapPlot();
    connect(m_mapPlot, &QCustomPlot::mousePress, this, &TradeoffChart::mapClicked);
    // Labels are placed in pixels, so again at every layout: on screen at each resize, on paper
    // at the print size and fonts.
    connect(m_mapPlot, &QCustomPlot::afterLayout, this, &TradeoffChart::placeContourLabels);
    m_mapPlot->setCursor(Qt::CrossCursor);
    setData(TradeoffChartData{});
}

void TradeoffChart::buildHorizonPlot()
{
    addTitle(m_horizonPlot, tr("VaR against horizon"));
    m_horizonPlot->xAxis->setScaleType(QCPAxis::stLogarithmic);
    m_horizonPlot->xAxis->setLabel(tr("Horizon (trading days, log scale)"));
    m_horizonPlot->yAxis->setLabel(tr("VaR (money)"));
    m_horizonPlot->legend->setVisible(true);
    m_horizonPlot->legend->setFont(chartstyle::tickFont());
    // Two compact rows, so the legend covers little of the lines.
    m_horizonPlot->legend->setFillOrder(QCPLayoutGrid::foColumnsFirst);
    m_horizonPlot->legend->setWrap(3);
    m_horizonPlot->legend->setRowSpacing(0);
    m_horizonPlot->legend->setColumnSpacing(4);
    m_horizonPlot->legend->setIconSize(18, 8);
    m_horizonPlot->axisRect()->insetLayout()->setInsetAlignment(0, Qt::AlignTop | Qt::AlignLeft);
}

void TradeoffChart::buildConfidencePlot()
{
    addTitle(m_confidencePlot, tr("VaR against confidence"));
    m_confidencePlot->xAxis->setTicker(confidenceTicker());
    m_confidencePlot->xAxis->setLabel(tr("Confidence (tail scale)"));
    m_confidencePlot->yAxis->setLabel(tr("VaR (money)"));
}

void TradeoffChart::setForPaper()
{
    m_mapTitle->setText(tr("VaR over horizon and confidence"));
    // At print sizes 97.5% and 99.5% touch their neighbours along the line's horizontal axis.
    m_confidencePlot->xAxis->setTicker(confidenceTicker({0.90, 0.95, 0.99, 0.999}));
}

void TradeoffChart::buildMapPlot()
{
    m_mapTitle = addTitle(m_mapPlot, tr("VaR over horizon and confidence (click to use a point)"));
    m_mapPlot->xAxis->setLabel(tr("Horizon (trading days)"));
    m_mapPlot->yAxis->setLabel(tr("Confidence (tail scale)"));
    m_mapPlot->yAxis->setTicker(confidenceTicker());
    m_mapPlot->axisRect()->setupFullAxesBox(false);
    m_mapPlot->xAxis2->setVisible(false);
    m_mapPlot->yAxis2->setVisible(false);
    m_mapPlot->xAxis->grid()->setVisible(false);
    m_mapPlot->yAxis->grid()->setVisible(false);

    m_map = new QCPColorMap(m_mapPlot->xAxis, m_mapPlot->yAxis);
    m_map->setGradient(varGradient());
    m_map->setInterpolate(true);
    m_scale = new QCPColorScale(m_mapPlot);
    m_mapPlot->plotLayout()->addElement(1, 1, m_scale);
    m_scale->setType(QCPAxis::atRight);
    m_scale->setBarWidth(12);
    m_scale->axis()->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
    m_scale->axis()->setLabel(tr("VaR (money)"));
    chartstyle::styleAxis(m_scale->axis());
    m_map->setColorScale(m_scale);
    // The scale hands its gradient to the map, so the gradient is set on the scale.
    m_scale->setGradient(varGradient());
    // The colour bar lines up with the map's plot area.
    auto *margins = new QCPMarginGroup(m_mapPlot);
    m_mapPlot->axisRect()->setMarginGroup(QCP::msBottom | QCP::msTop, margins);
    m_scale->setMarginGroup(QCP::msBottom | QCP::msTop, margins);
}

void TradeoffChart::setData(const TradeoffChartData &data)
{
    m_data = data;
    m_note->setText(data.note);
    if (!data.varLabel.isEmpty()) { // names the workbook's currency when it has one
        m_horizonPlot->yAxis->setLabel(data.varLabel);
        m_confidencePlot->yAxis->setLabel(data.varLabel);
        m_scale->axis()->setLabel(data.varLabel);
    }
    m_note->setVisible(!data.note.isEmpty());
    fillHorizonPlot();
    fillConfidencePlot();
    fillMapPlot();
}

void TradeoffChart::fillHorizonPlot()
{
    QCustomPlot *p = m_horizonPlot;
    p->clearGraphs();
    p->clearItems();
    const RiskGrid &g = m_data.byHorizon;
    p->xAxis->setTicker(horizonTicker(m_data.daysPerYear));
    p->xAxis->setRange(1.0, std::max(2, m_data.daysPerYear));
    if (!m_data.valid || g.horizons.empty()) {
        p->replot(QCustomPlot::rpQueuedReplot);
        return;
    }
    QVector<double> keys(g.horizons.begin(), g.horizons.end());
    double lo = 0.0, hi = 0.0;
    for (std::size_t c = 0; c < g.confidences.size(); ++c) {
        QVector<double> values(static_cast<qsizetype>(g.horizons.size()));
        for (std::size_t h = 0; h < g.horizons.size(); ++h) {
            values[static_cast<qsizetype>(h)] = g.varAt(h, c);
            lo = std::min(lo, g.varAt(h, c));
            hi = std::max(hi, g.varAt(h, c));
        }
        QCPGraph *graph = p->addGraph();
        const int series = static_cast<int>(c);
        graph->setPen(QPen(chartstyle::seriesColor(series), 1.8, chartstyle::seriesPenStyle(series)));
        graph->setName(chartstyle::confidenceText(g.confidences[c]));
        graph->setData(keys, values, true);
    }
    if (!m_data.lineTurns.empty()) {
        QCPGraph *turns = p->addGraph();
        turns->setLineStyle(QCPGraph::lsNone);
        turns->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssDiamond, chartstyle::rust(), Qt::white, 8));
        turns->setName(tr("VaR peak"));
        for (const TurningPoint &t : m_data.lineTurns)
            turns->addData(t.horizonDays, t.var);
    }
    vertical(p, m_data.horizonDays, QPen(chartstyle::slate(), 1, Qt::DotLine));
    p->yAxis->setRange(std::min(0.0, lo * 1.05), hi > 0.0 ? hi * 1.08 : 1.0);
    p->replot(QCustomPlot::rpQueuedReplot);
}

void TradeoffChart::fillConfidencePlot()
{
    QCustomPlot *p = m_confidencePlot;
    p->clearGraphs();
    p->clearItems();
    const RiskGrid &g = m_data.byConfidence;
    if (auto *title = qobject_cast<QCPTextElement *>(p->plotLayout()->element(0, 0)))
        title->setText(m_data.horizonDays == 1 ? tr("VaR against confidence at 1 trading day")
                                                : tr("VaR against confidence at %1 trading days").arg(m_data.horizonDays));
    const double t0 = confidenceToTailScale(0.90), t1 = confidenceToTailScale(0.999);
    // A hair of room at both ends keeps the end ticks (90%, 99.9%) from being dropped by rounding.
    p->xAxis->setRange((g.confidences.empty() ? t0 : confidenceToTailScale(g.confidences.front())) - 1e-6,
                       (g.confidences.empty() ? t1 : confidenceToTailScale(g.confidences.back())) + 0.04);
    if (!m_data.valid || g.confidences.empty() || g.horizons.empty()) {
        p->replot(QCustomPlot::rpQueuedReplot);
        return;
    }
    QVector<double> keys, values;
    double lo = 0.0, hi = 0.0;
    for (std::size_t c = 0; c < g.confidences.size(); ++c) {
        keys.push_back(confidenceToTailScale(g.confidences[c]));
        values.push_back(g.varAt(0, c));
        lo = std::min(lo, values.back());
        hi = std::max(hi, values.back());
    }
    QCPGraph *graph = p->addGraph();
    graph->setPen(QPen(chartstyle::slate(), 2));
    graph->setData(keys, values, true);
    const double x = confidenceToTailScale(m_data.confidence);
    vertical(p, x, QPen(chartstyle::slate(), 1, Qt::DotLine));
    QCPGraph *now = p->addGraph();
    now->setLineStyle(QCPGraph::lsNone);
    now->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssCircle, chartstyle::rust(), Qt::white, 8));
    now->addData(x, m_data.currentVar);
    QCPItemText *label = note(p, tr("%1: %2").arg(chartstyle::confidenceText(m_data.confidence), chartstyle::money(m_data.currentVar)),
                              Qt::AlignRight | Qt::AlignBottom);
    label->position->setCoords(x, m_data.currentVar);
    if (x < 0.5 * (p->xAxis->range().lower + p->xAxis->range().upper))
        label->setPositionAlignment(Qt::AlignLeft | Qt::AlignBottom);
    p->yAxis->setRange(std::min(0.0, lo * 1.05), hi > 0.0 ? hi * 1.1 : 1.0);
    p->replot(QCustomPlot::rpQueuedReplot);
}

void TradeoffChart::fillMapPlot()
{
    QCustomPlot *p = m_mapPlot;
    // Everything but the colour map itself is rebuilt.
    for (int i = p->plottableCount() - 1; i >= 0; --i)
        if (p->plottable(i) != m_map)
            p->removePlottable(i);
    p->clearItems();
    m_contourLabels.clear();
    m_fixedLabels.clear();
    const RiskGrid &g = m_data.map;
    const int nx = static_cast<int>(g.horizons.size());
    const int ny = static_cast<int>(g.confidences.size());
    const double n = std::max(2, m_data.daysPerYear);
    const double t0 = m_data.mapTail.empty() ? 1.0 : m_data.mapTail.front();
    const double t1 = m_data.mapTail.empty() ? 3.0 : m_data.mapTail.back();
    p->xAxis->setRange(1.0, n);
    p->yAxis->setRange(t0 - 1e-6, t1 + 1e-6);
    if (!m_data.valid || nx < 2 || ny < 2) {
        m_map->data()->clear();
        m_map->setVisible(false);
        p->replot(QCustomPlot::rpQueuedReplot);
        return;
    }
    m_map->setVisible(true);
    m_map->data()->setSize(nx, ny);
    m_map->data()->setRange(QCPRange(g.horizons.front(), g.horizons.back()), QCPRange(t0, t1));
    for (int i = 0; i < nx; ++i)
        for (int j = 0; j < ny; ++j)
            m_map->data()->setCell(i, j, g.varAt(static_cast<std::size_t>(i), static_cast<std::size_t>(j)));
    m_map->setDataRange(m_data.varMax > m_data.varMin ? QCPRange(m_data.varMin, m_data.varMax)
                                                      : QCPRange(m_data.varMin - 1.0, m_data.varMin + 1.0));

    const QColor lineInk(0x1d, 0x26, 0x2f);
    for (std::size_t k = 0; k < m_data.contours.size(); ++k) {
        const ContourLevel &level = m_data.contours[k];
        for (const ContourLine &line : level.lines) {
            auto *curve = new QCPCurve(p->xAxis, p->yAxis);
            curve->setPen(QPen(lineInk, 1));
            curve->removeFromLegend();
            QVector<double> xs, ys;
            for (const ContourPoint &pt : line) {
                xs.push_back(pt.x);
                ys.push_back(pt.y);
            }
            curve->setData(xs, ys);
        }
        QCPItemText *label = note(p, level.label, Qt::AlignCenter);
        label->setBrush(QColor(255, 255, 255, 190));
        label->position->setCoords(level.labelAt.x, level.labelAt.y);
        m_contourLabels.emplace_back(label, k);
    }

    if (!m_data.ridge.empty()) {
        auto *ridge = new QCPCurve(p->xAxis, p->yAxis);
        ridge->setPen(QPen(chartstyle::rust(), 2.2, Qt::DashLine));
        QVector<double> xs, ys;
        for (const ContourPoint &pt : m_data.ridge) {
            xs.push_back(pt.x);
            ys.push_back(pt.y);
        }
        ridge->setData(xs, ys);
        const ContourPoint mid = m_data.ridge[m_data.ridge.size() / 2];
        QCPItemText *label = note(p, tr("VaR peaks here:\nlonger horizons add more\nexpected gain than spread"),
                                  (mid.x > 0.45 * n ? Qt::AlignRight : Qt::AlignLeft) | Qt::AlignVCenter);
        label->setColor(chartstyle::rust().darker(140));
        label->position->setCoords(mid.x + (mid.x > 0.45 * n ? -4.0 : 4.0), mid.y);
        m_fixedLabels.push_back(label);
    }

    // The current setting: a ring with a cross, readable on light and dark cells.
    auto *now = new QCPGraph(p->xAxis, p->yAxis);
    now->setLineStyle(QCPGraph::lsNone);
    now->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssCrossCircle, QPen(Qt::white, 3), Qt::NoBrush, 13));
    now->addData(m_data.horizonDays, confidenceToTailScale(m_data.confidence));
    auto *nowInk = new QCPGraph(p->xAxis, p->yAxis);
    nowInk->setLineStyle(QCPGraph::lsNone);
    nowInk->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssCrossCircle, QPen(chartstyle::rust().darker(130), 1.6), Qt::NoBrush, 13));
    nowInk->addData(m_data.horizonDays, confidenceToTailScale(m_data.confidence));
    const QString days = m_data.horizonDays == 1 ? tr("1 day") : tr("%1 days").arg(m_data.horizonDays);
    QCPItemText *label = note(p, tr("now: %1, %2").arg(days, chartstyle::confidenceText(m_data.confidence)),
                              (m_data.horizonDays > 0.6 * n ? Qt::AlignRight : Qt::AlignLeft) | Qt::AlignBottom);
    label->position->setCoords(m_data.horizonDays + (m_data.horizonDays > 0.6 * n ? -3.0 : 3.0),
                               confidenceToTailScale(m_data.confidence) + 0.03);
    m_fixedLabels.push_back(label);
    p->replot(QCustomPlot::rpQueuedReplot);
}

namespace {

// The pixel box a text item fills at a pixel anchor, padding included.
QRectF textBox(const QCPItemText *t, const QPointF &anchor)
{
    const QSizeF text = QFontMetricsF(t->font()).boundingRect(QRectF(0, 0, 1e6, 1e6), Qt::AlignCenter, t->text()).size();
    const QMargins m = t->padding();
    QRectF box(QPointF(0, 0), QSizeF(text.width() + m.left() + m.right(), text.height() + m.top() + m.bottom()));
    const Qt::Alignment a = t->positionAlignment();
    const double x = a & Qt::AlignLeft ? anchor.x() : a & Qt::AlignRight ? anchor.x() - box.width() : anchor.x() - box.width() / 2.0;
    const double y = a & Qt::AlignTop ? anchor.y() : a & Qt::AlignBottom ? anchor.y() - box.height() : anchor.y() - box.height() / 2.0;
    box.moveTopLeft(QPointF(x, y));
    return box;
}

// Pixels between two boxes (0 when they touch or overlap).
double gapBetween(const QRectF &a, const QRectF &b)
{
    const double dx = std::max({0.0, a.left() - b.right(), b.left() - a.right()});
    const double dy = std::max({0.0, a.top() - b.bottom(), b.top() - a.bottom()});
    return std::hypot(dx, dy);
}

} // namespace

void TradeoffChart::placeContourLabels()
{
    QCustomPlot *p = m_mapPlot;
    const QRectF plotArea = QRectF(p->axisRect()->rect()).adjusted(2, 2, -2, -2);
    if (m_contourLabels.empty() || plotArea.width() < 10.0 || plotArea.height() < 10.0)
        return;
    // Kept clear: the marker of the current setting, its label and the ridge's note, then each
    // contour label as it is placed.
    std::vector<QRectF> taken;
    const QPointF marker(p->xAxis->coordToPixel(m_data.horizonDays), p->yAxis->coordToPixel(confidenceToTailScale(m_data.confidence)));
    taken.emplace_back(marker - QPointF(9, 9), QSizeF(18, 18));
    for (const QCPItemText *t : m_fixedLabels)
        taken.push_back(textBox(t, t->position->pixelPosition()));
    // Each label at the point of its lines that lies inside the plot with the most room around it
    // (from the frame and from what is kept clear); a level with no such point goes unlabelled
    // rather than cut or covering another label (the colour scale still gives its value).
    for (auto &[label, k] : m_contourLabels) {
        double best = -1.0;
        QPointF bestAt;
        QRectF bestBox;
        for (const ContourLine &line : m_data.contours[k].lines)
            for (const ContourPoint &pt : line) {
                const QPointF at(p->xAxis->coordToPixel(pt.x), p->yAxis->coordToPixel(pt.y));
                const QRectF box = textBox(label, at);
                double room = std::min({box.left() - plotArea.left(), plotArea.right() - box.right(),
                                        box.top() - plotArea.top(), plotArea.bottom() - box.bottom()});
                for (const QRectF &other : taken)
                    room = std::min(room, box.intersects(other) ? -1.0 : gapBetween(box, other));
                if (room > best) {
                    best = room;
                    bestAt = at;
                    bestBox = box;
                }
            }
        label->setVisible(best >= 0.0);
        if (best >= 0.0) {
            label->position->setPixelPosition(bestAt);
            taken.push_back(bestBox);
        }
    }
}

QPoint TradeoffChart::mapPixel(int horizonDays, double confidence) const
{
    return QPoint(qRound(m_mapPlot->xAxis->coordToPixel(horizonDays)),
                  qRound(m_mapPlot->yAxis->coordToPixel(confidenceToTailScale(confidence))));
}

void TradeoffChart::mapClicked(QMouseEvent *event)
{
    if (!m_data.valid || event->button() != Qt::LeftButton)
        return;
    if (!m_mapPlot->axisRect()->rect().contains(event->position().toPoint()))
        return;
    const double x = m_mapPlot->xAxis->pixelToCoord(event->position().x());
    const double y = m_mapPlot->yAxis->pixelToCoord(event->position().y());
    const TradeoffPick pick = pickOnMap(x, y, m_data.daysPerYear);
    emit assumptionsPicked(pick.horizonDays, pick.confidence);
}

} // namespace tailwise::ui

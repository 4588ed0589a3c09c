#include "charts/losstailchart.h"

#include "charts/chartstyle.h"
#include "charts/localeticker.h"

#include <qcustomplot.h>

#include <QEvent>
#include <QLabel>
#include <QMouseEvent>
#include <QVBoxLayout>

namespace tailwise::ui {

namespace {

// The y axis shows probability in percent per a round slice of the x axis (see densityDisplayPer).
double yFactor(const LossTailChartData &d) { return d.densityDisplayPer * 100.0; }

QVector<double> scaled(const QVector<double> &v, double factor)
{
    QVector<double> out(v.size());
    for (int i = 0; i < v.size(); ++i)
        out[i] = v[i] * factor;
    return out;
}

QCPItemText *makeLabel(QCustomPlot *plot, const QColor &colour)
{
    auto *t = new QCPItemText(plot);
    t->setFont(chartstyle::labelFont());
    t->setColor(colour);
    t->setBrush(QColor(255, 255, 255, 215));
    t->setPadding(QMargins(4, 2, 4, 2));
    t->position->setTypeX(QCPItemPosition::ptPlotCoords);
    t->position->setTypeY(QCPItemPosition::ptAxisRectRatio);
    return t;
}

QCPItemStraightLine *makeMarker(QCustomPlot *plot, const QPen &pen)
{
    auto *l = new QCPItemStraightLine(plot);
    l->setPen(pen);
    return l;
}

void placeVertical(QCPItemStraightLine *line, double x)
{
    line->point1->setCoords(x, 0.0);
    line->point2->setCoords(x, 1.0);
}

} // namespace

LossTailChart::LossTailChart(QWidget *parent) : QWidget(parent)
{
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    layout->setSpacing(2);
    m_note = new QLabel(this);
    m_note->setWordWrap(true);
    m_note->setFont(chartstyle::noteFont());
    m_note->setContentsMargins(8, 4, 8, 4);
    m_note->hide();
    layout->addWidget(m_note);
    m_plot = new QCustomPlot(this);
    m_plot->setMouseTracking(true);
    m_plot->installEventFilter(this);
    layout->addWidget(m_plot, 1);
    build();
    setData(LossTailChartData{});
}

void LossTailChart::build()
{
    QCustomPlot *p = m_plot;
    chartstyle::stylePlot(p);
    p->xAxis2->setVisible(false);
    p->yAxis2->setVisible(false);

    m_history = new QCPBars(p->xAxis, p->yAxis);
    m_history->setPen(QPen(chartstyle::sand().darker(130), 1));
    m_history->setBrush(chartstyle::sand());

    m_tail = p->addGraph();
    // Outlined as well as filled: the tail holds little area, so its edge carries it.
    m_tail->setPen(QPen(chartstyle::rust(), 2.5));
    QColor tailFill = chartstyle::rust();
    tailFill.setAlpha(150);
    m_tail->setBrush(QBrush(tailFill));

    m_curve = p->addGraph();
    m_curve->setPen(QPen(chartstyle::ink(), 2));

    m_varLine = makeMarker(p, QPen(chartstyle::rust().darker(120), 1.5, Qt::SolidLine));
    m_esLine = makeMarker(p, QPen(chartstyle::ink(), 1.5, Qt::DashLine));
    m_varText = makeLabel(p, chartstyle::rust().darker(130));
    m_esText = makeLabel(p, chartstyle::ink());

    m_pointerLine = makeMarker(p, QPen(chartstyle::slate(), 1, Qt::DotLine));
    m_pointerText = makeLabel(p, chartstyle::slate());
    m_pointerText->setPen(QPen(chartstyle::mist().darker(120)));
    m_pointerLine->setVisible(false);
    m_pointerText->setVisible(false);

    p->legend->setVisible(true);
    p->axisRect()->insetLayout()->setInsetAlignment(0, Qt::AlignTop | Qt::AlignRight);
    p->xAxis->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
    p->yAxis->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
}

void LossTailChart::setData(const LossTailChartData &data)
{
    m_data = data;
    QCustomPlot *p = m_plot;
    const double f = yFactor(data);

    m_curve->setName(data.curveLegend);
    m_tail->setName(data.tailLegend);
    m_history->setName(data.histogramLegend);
    m_curve->setData(data.x, scaled(data.density, f), true);
    m_tail->setData(data.tailX, scaled(data.tailDensity, f), true);
    m_history->setData(data.binCenters, scaled(data.binDensity, f), true);
    m_history->setWidth(data.binWidth);
    m_history->setVisible(data.hasHistogram);
    m_curve->setVisible(data.hasCurve);
    m_tail->setVisible(data.hasCurve);

    for (QCPGraph *g : m_overlays)
        p->removeGraph(g);
    m_overlays.clear();
    int model = 0;
    for (const LossTailOverlay &o : data.overlays) {
        if (!data.hasCurve)
            break;
        QCPGraph *g = p->addGraph();
        if (o.ghost) {
            // Faint and dashed: the picture before the trades, behind the current one.
            QColor c = chartstyle::slate();
            c.setAlpha(150);
            g->setPen(QPen(c, 2, Qt::DashLine));
        } else {
            g->setPen(QPen(chartstyle::seriesColor(++model), 1.8, Qt::DashDotLine));
        }
        g->setName(o.legend);
        g->setData(data.x, scaled(o.density, f), true);
        m_overlays.push_back(g);
    }

    p->legend->clearItems();
    if (data.hasCurve) {
        m_curve->addToLegend();
        m_tail->addToLegend();
        for (QCPGraph *g : m_overlays)
            g->addToLegend();
    }
    if (data.hasHistogram)
        m_history->addToLegend();
    p->legend->setVisible(p->legend->itemCount() > 0);

    placeVertical(m_varLine, data.tailBoundary);
    placeVertical(m_esLine, data.esMarker);
    m_varText->setText(data.varLabel);
    m_esText->setText(data.esLabel);
    // ES's label left of its line (further out), VaR's right of its own: left of it, VaR's label
    // would cross ES's line wherever the two lines are close. Both sit below the legend's height.
    m_varText->position->setCoords(data.tailBoundary, 0.36);
    m_varText->setPositionAlignment(Qt::AlignLeft | Qt::AlignVCenter);
    m_esText->position->setCoords(data.esMarker, 0.27);
    m_esText->setPositionAlignment(Qt::AlignRight | Qt::AlignVCenter);
    // Without a spread VaR and ES coincide at the one certain P&L: one marker says it.
    m_esLine->setVisible(data.hasCurve);
    m_esText->setVisible(data.hasCurve);

    p->xAxis->setTicker(QSharedPointer<QCPAxisTicker>(
        new LocaleTicker(data.unit == LossTailUnit::PercentOfValue ? QLocale().percent() : QString())));
    p->xAxis->setLabel(data.xLabel);
    p->yAxis->setLabel(data.yLabel);
    p->xAxis->setRange(data.xMin, data.xMax);
    p->yAxis->setRange(0.0, data.densityMax > 0.0 ? data.densityMax * f * 1.35 : 1.0);

    m_note->setText(data.note);
    m_note->setVisible(!data.note.isEmpty());
    clearPointer();
    p->replot(QCustomPlot::rpQueuedReplot);
}

void LossTailChart::showPointer(double x)
{
    const QString text = lossTailHoverText(m_data, x);
    if (text.isEmpty()) {
        clearPointer();
        return;
    }
    placeVertical(m_pointerLine, x);
    m_pointerText->setText(text);
    m_pointerText->position->setCoords(x, 0.04);
    // Keep the read-out inside the plot: to the right of the pointer in the left half, else left.
    const bool leftHalf = x < 0.5 * (m_data.xMin + m_data.xMax);
    m_pointerText->setPositionAlignment((leftHalf ? Qt::AlignLeft : Qt::AlignRight) | Qt::AlignTop);
    m_pointerLine->setVisible(true);
    m_pointerText->setVisible(true);
    m_plot->replot(QCustomPlot::rpQueuedReplot);
}

void LossTailChart::clearPointer()
{
    m_pointerLine->setVisible(false);
    m_pointerText->setVisible(false);
    m_pointerText->setText({});
    m_plot->replot(QCustomPlot::rpQueuedReplot);
}

QString LossTailChart::pointerText() const
{
    return m_pointerText->visible() ? m_pointerText->text() : QString();
}

bool LossTailChart::eventFilter(QObject *watched, QEvent *event)
{
    if (watched == m_plot) {
        if (event->type() == QEvent::MouseMove) {
            const auto *me = static_cast<QMouseEvent *>(event);
            if (m_plot->axisRect()->rect().contains(me->position().toPoint()))
                showPointer(m_plot->xAxis->pixelToCoord(me->position().x()));
            else
                clearPointer();
        } else if (event->type() == QEvent::Leave) {
            clearPointer();
        }
    }
    return QWidget::eventFilter(watched, event);
}

} // namespace tailwise::ui

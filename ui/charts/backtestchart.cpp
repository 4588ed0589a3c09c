#include "charts/backtestchart.h"

#include "charts/chartstyle.h"
#include "charts/localeticker.h"

#include <qcustomplot.h>

#include <QLabel>
#include <QLocale>
#include <QTimeZone>
#include <QVBoxLayout>

namespace tailwise::ui {

BacktestChart::BacktestChart(QWidget *parent) : QWidget(parent)
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
    layout->addWidget(m_plot, 1);

    QCustomPlot *p = m_plot;
    chartstyle::stylePlot(p);
    p->xAxis2->setVisible(false);
    p->yAxis2->setVisible(false);
    // Month names in the user's language.
    p->setLocale(QLocale());

    // P&L: thin bars from zero (impulses), in a light slate so the line and the marks stay on top.
    m_pnl = p->addGraph();
    QColor pnlColour = chartstyle::slate();
    pnlColour.setAlpha(150);
    m_pnl->setPen(QPen(pnlColour, 1.2));
    m_pnl->setLineStyle(QCPGraph::lsImpulse);

    // −VaR: a dark step line (the forecast holds for the whole day).
    m_var = p->addGraph();
    m_var->setPen(QPen(chartstyle::ink(), 1.6));
    m_var->setLineStyle(QCPGraph::lsStepCenter);

    // Exceptions: no line, a large filled downward triangle in rust with a dark edge.
    m_exceptions = p->addGraph();
    m_exceptions->setLineStyle(QCPGraph::lsNone);
    m_exceptions->setScatterStyle(QCPScatterStyle(QCPScatterStyle::ssTriangleInverted, QPen(chartstyle::ink(), 1.2),
                                                  QBrush(chartstyle::rust()), 11));

    auto dates = QSharedPointer<QCPAxisTickerDateTime>::create();
    dates->setDateTimeFormat(QStringLiteral("MMM yyyy"));
    dates->setTimeZone(QTimeZone::utc());
    dates->setTickCount(6);
    p->xAxis->setTicker(dates);
    p->yAxis->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));
    p->yAxis->grid()->setZeroLinePen(QPen(chartstyle::ink().lighter(250), 1));

    // The legend in a row under the plot: inside, it would cover either the gains or the losses.
    p->legend->setVisible(true);
    auto *legendRow = new QCPLayoutGrid;
    p->plotLayout()->addElement(1, 0, legendRow);
    legendRow->setMargins(QMargins(5, 0, 5, 5));
    legendRow->addElement(0, 0, p->legend);
    p->legend->setFillOrder(QCPLegend::foColumnsFirst);
    p->plotLayout()->setRowStretchFactor(1, 0.001);
    setData(BacktestChartData{});
}

void BacktestChart::setData(const BacktestChartData &data)
{
    m_data = data;
    QCustomPlot *p = m_plot;
    m_pnl->setName(data.pnlLegend);
    m_var->setName(data.varLegend);
    m_exceptions->setName(data.exceptionLegend);
    m_pnl->setData(data.keys, data.pnl, true);
    m_var->setData(data.keys, data.negVar, true);
    m_exceptions->setData(data.exceptionKeys, data.exceptionPnl, true);

    p->legend->clearItems();
    if (!data.keys.isEmpty()) {
        m_pnl->addToLegend();
        m_var->addToLegend();
        m_exceptions->addToLegend();
    }
    p->legend->setVisible(p->legend->itemCount() > 0);

    p->yAxis->setLabel(data.yLabel);
    p->xAxis->setRange(data.xMin, data.xMax);
    p->yAxis->setRange(data.yMin, data.yMax);
    m_note->setText(data.note);
    m_note->setVisible(!data.note.isEmpty());
    p->replot(QCustomPlot::rpQueuedReplot);
}

} // namespace tailwise::ui

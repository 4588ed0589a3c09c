#include "charts/modelcomparisonchart.h"

#include "charts/chartstyle.h"
#include "charts/localeticker.h"

#include <qcustomplot.h>

#include <QVBoxLayout>

namespace tailwise::ui {

namespace {

QCPItemText *barLabel(QCustomPlot *plot, const QString &text, double key, double value)
{
    auto *t = new QCPItemText(plot);
    t->setText(text);
    t->setFont(chartstyle::tickFont());
    t->setColor(chartstyle::ink());
    t->setPositionAlignment(Qt::AlignHCenter | Qt::AlignBottom);
    t->setPadding(QMargins(1, 0, 1, 2));
    t->position->setCoords(key, value);
    return t;
}

} // namespace

ModelComparisonChart::ModelComparisonChart(QWidget *parent) : QWidget(parent)
{
    auto *layout = new QVBoxLayout(this);
    layout->setContentsMargins(0, 0, 0, 0);
    m_plot = new QCustomPlot(this);
    layout->addWidget(m_plot);
    QCustomPlot *p = m_plot;
    p->plotLayout()->insertRow(0);
    auto *title = new QCPTextElement(p, QString());
    QFont f = chartstyle::labelFont();
    f.setBold(true);
    title->setFont(f);
    title->setTextColor(chartstyle::ink());
    p->plotLayout()->addElement(0, 0, title);
    chartstyle::stylePlot(p);
    p->xAxis2->setVisible(false);
    p->yAxis2->setVisible(false);
    p->xAxis->grid()->setVisible(false);
    p->xAxis->setTickLength(0, 0);
    p->xAxis->setSubTicks(false);
    p->yAxis->setTicker(QSharedPointer<QCPAxisTicker>(new LocaleTicker));

    auto *group = new QCPBarsGroup(p);
    group->setSpacingType(QCPBarsGroup::stAbsolute);
    group->setSpacing(2);
    m_var = new QCPBars(p->xAxis, p->yAxis);
    m_var->setBrush(chartstyle::slate());
    m_var->setPen(QPen(chartstyle::slate().darker(130), 1));
    m_var->setWidth(0.34);
    m_var->setBarsGroup(group);
    m_es = new QCPBars(p->xAxis, p->yAxis);
    m_es->setBrush(chartstyle::sand());
    m_es->setPen(QPen(chartstyle::ink(), 1));
    m_es->setWidth(0.34);
    m_es->setBarsGroup(group);

    p->legend->setVisible(true);
    p->axisRect()->insetLayout()->setInsetAlignment(0, Qt::AlignTop | Qt::AlignLeft);
    setData(ModelComparisonChartData{});
}

void ModelComparisonChart::setData(const ModelComparisonChartData &data)
{
    m_data = data;
    QCustomPlot *p = m_plot;
    p->clearItems();
    if (auto *title = qobject_cast<QCPTextElement *>(p->plotLayout()->element(0, 0)))
        title->setText(data.title);
    m_var->setName(data.varLegend);
    m_es->setName(data.esLegend);
    QSharedPointer<QCPAxisTickerText> ticker(new QCPAxisTickerText);
    QVector<double> keys, vars, ess;
    const int n = static_cast<int>(data.groups.size());
    // Each bar's share of the group (0.34 of a key unit) and the 2 px gap put the bars' centres
    // about 0.17 either side of the key.
    constexpr double half = 0.175;
    for (int i = 0; i < n; ++i) {
        const ModelComparisonGroup &g = data.groups[static_cast<std::size_t>(i)];
        const double key = i + 1;
        ticker->addTick(key, g.current ? tr("%1\n(the workbook's model)").arg(g.model) : g.model);
        if (!g.hasFigures) {
            auto *t = barLabel(p, g.note, key, 0.02 * data.yMax);
            t->setFont(chartstyle::noteFont());
            t->setPositionAlignment(Qt::AlignHCenter | Qt::AlignBottom);
            continue;
        }
        keys << key;
        vars << g.var;
        ess << g.es;
        barLabel(p, chartstyle::money(g.var), key - half, g.var);
        barLabel(p, chartstyle::money(g.es), key + half, g.es);
    }
    m_var->setData(keys, vars, true);
    m_es->setData(keys, ess, true);
    p->xAxis->setTicker(ticker);
    p->xAxis->setRange(0.4, n + 0.6);
    p->yAxis->setRange(0.0, data.yMax);
    p->yAxis->setLabel(data.yLabel);
    p->legend->clearItems();
    if (!keys.isEmpty()) {
        m_var->addToLegend();
        m_es->addToLegend();
    }
    p->legend->setVisible(p->legend->itemCount() > 0);
    p->replot(QCustomPlot::rpQueuedReplot);
}

} // namespace tailwise::ui

#include "plotcheck.h"

#include <qcustomplot.h>

#include <QCoreApplication>

#include <cmath>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("ChartExport", text); }

bool finite(double v) { return std::isfinite(v); }
bool finite(const QCPRange &r) { return finite(r.lower) && finite(r.upper); }

QString named(const QString &kind, const QString &name)
{
    return name.isEmpty() ? kind : tr("%1 “%2”").arg(kind, name);
}

QString notFinite(const QString &part) { return tr("%1 has a value that is not a finite number").arg(part); }

template <typename Container, typename Check>
bool allOf(const Container &data, Check check)
{
    for (auto it = data.constBegin(); it != data.constEnd(); ++it)
        if (!check(*it))
            return false;
    return true;
}

QString checkPlottable(QCPAbstractPlottable *p)
{
    const QString what = named(tr("the series"), p->name());
    if (auto *g = qobject_cast<QCPGraph *>(p)) {
        if (!allOf(*g->data(), [](const QCPGraphData &d) { return finite(d.key) && finite(d.value); }))
            return notFinite(what);
    } else if (auto *c = qobject_cast<QCPCurve *>(p)) {
        if (!allOf(*c->data(), [](const QCPCurveData &d) { return finite(d.t) && finite(d.key) && finite(d.value); }))
            return notFinite(what);
    } else if (auto *b = qobject_cast<QCPBars *>(p)) {
        if (!allOf(*b->data(), [](const QCPBarsData &d) { return finite(d.key) && finite(d.value); })
            || !finite(b->width()) || !finite(b->baseValue()))
            return notFinite(what);
    } else if (auto *m = qobject_cast<QCPColorMap *>(p)) {
        QCPColorMapData *d = m->data(); // cell() is not const in QCustomPlot
        if (!finite(d->keyRange()) || !finite(d->valueRange()) || !finite(m->dataRange()))
            return notFinite(what);
        for (int x = 0; x < d->keySize(); ++x)
            for (int y = 0; y < d->valueSize(); ++y)
                if (!finite(d->cell(x, y)))
                    return notFinite(what);
    }
    return {};
}

} // namespace

QString nonFiniteInPlot(const QCustomPlot &plot)
{
    // QCustomPlot's accessors are not const; nothing here changes the plot.
    auto &p = const_cast<QCustomPlot &>(plot);
    for (QCPAxisRect *rect : p.axisRects())
        for (QCPAxis *axis : rect->axes())
            if (!finite(axis->range()))
                return tr("%1 has a range that is not a finite number").arg(named(tr("the axis"), axis->label()));
    for (int i = 0; i < p.plottableCount(); ++i)
        if (p.plottable(i)->visible())
            if (QString problem = checkPlottable(p.plottable(i)); !problem.isEmpty())
                return problem;
    for (int i = 0; i < p.itemCount(); ++i) {
        QCPAbstractItem *item = p.item(i);
        if (!item->visible())
            continue; // not painted
        for (QCPItemPosition *position : item->positions()) {
            const QPointF at = position->coords();
            if (!finite(at.x()) || !finite(at.y())) {
                QString label;
                if (auto *text = qobject_cast<QCPItemText *>(item))
                    label = text->text();
                return tr("%1 is placed at a position that is not a finite number").arg(named(tr("a mark"), label));
            }
        }
    }
    return {};
}

} // namespace tailwise::ui

#include "charts/modelcomparisonchartdata.h"

#include "charts/chartstyle.h"
#include "text/assumptionlabels.h"

#include <QCoreApplication>
#include <QLocale>

#include <algorithm>
#include <cmath>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("ModelComparisonChart", text); }

} // namespace

ModelComparisonChartData buildModelComparisonChartData(const std::vector<ModelRow> &rows, double portfolioValue,
                                                       const Assumptions &assumptions, const QString &currency)
{
    ModelComparisonChartData d;
    d.horizonDays = assumptions.horizonDays;
    d.confidence = assumptions.confidence;
    double top = 0.0;
    for (const ModelRow &r : rows) {
        ModelComparisonGroup g;
        g.asked = r.model;
        g.model = r.used != r.model ? tr("%1 (as %2)").arg(modelLabel(r.model),
                                                            modelLabel(r.used))
                                    : modelLabel(r.model);
        g.current = r.model == assumptions.model;
        if (r.figures && std::isfinite(r.figures->var) && std::isfinite(r.figures->es)) {
            g.hasFigures = true;
            g.var = r.figures->var;
            g.es = r.figures->es;
            if (portfolioValue > 0.0) {
                g.varFraction = g.var / portfolioValue;
                g.esFraction = g.es / portfolioValue;
            }
            top = std::max({top, g.var, g.es});
            if (r.varStandardError && std::isfinite(*r.varStandardError))
                g.note = tr("VaR ± %1 (standard error)").arg(chartstyle::money(*r.varStandardError));
        } else {
            g.note = r.error.empty() ? tr("no figure") : QString::fromStdString(r.error);
        }
        d.groups.push_back(std::move(g));
    }
    d.yMax = top > 0.0 ? top * 1.22 : 1.0;
    const QString days = d.horizonDays == 1 ? tr("1 trading day") : tr("%1 trading days").arg(QLocale().toString(d.horizonDays));
    const QString conf = chartstyle::confidenceText(d.confidence);
    d.varLegend = tr("VaR %1").arg(conf);
    d.esLegend = tr("ES %1 (average loss beyond VaR)").arg(conf);
    d.yLabel = tr("Loss over %1 (%2)").arg(days, chartstyle::moneyUnit(currency));
    d.title = tr("VaR and ES under each model, same holdings and window");
    if (top <= 0.0)
        d.note = tr("No model gave a figure at these assumptions.");
    return d;
}

} // namespace tailwise::ui

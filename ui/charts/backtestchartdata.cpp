#include "charts/backtestchartdata.h"

#include "charts/chartstyle.h"

#include <QCoreApplication>
#include <QLocale>

#include <algorithm>
#include <cmath>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("BacktestChart", text); }

} // namespace

double backtestDateKey(Date date)
{
    return static_cast<double>(date.serial) * 86400.0;
}

BacktestChartData buildBacktestChartData(const BacktestResult &result, const QString &modelName, const QString &currency)
{
    BacktestChartData d;
    d.keys.reserve(static_cast<qsizetype>(result.days.size()));
    d.pnl.reserve(d.keys.capacity());
    d.negVar.reserve(d.keys.capacity());
    double lo = 0.0, hi = 0.0;
    for (const BacktestDay &day : result.days) {
        if (!std::isfinite(day.pnl) || !std::isfinite(day.var)) {
            ++d.skippedDays;
            continue;
        }
        const double key = backtestDateKey(day.date);
        if (day.exception) {
            d.exceptionDays.append(static_cast<int>(d.keys.size()));
            d.exceptionKeys.append(key);
            d.exceptionPnl.append(day.pnl);
        }
        d.keys.append(key);
        d.pnl.append(day.pnl);
        d.negVar.append(-day.var);
        lo = std::min({lo, day.pnl, -day.var});
        hi = std::max({hi, day.pnl, -day.var});
    }
    if (!d.keys.isEmpty()) {
        d.xMin = d.keys.front() - 43200.0;
        d.xMax = d.keys.back() + 43200.0;
    }
    const double span = hi - lo;
    if (span > 0.0) {
        d.yMin = lo - 0.06 * span;
        d.yMax = hi + 0.06 * span;
    }

    const QString confidence = chartstyle::confidenceText(result.assumptions.confidence);
    d.pnlLegend = tr("Daily P&L of the holdings");
    d.varLegend = modelName.isEmpty() ? tr("−VaR forecast (%1, one day)").arg(confidence)
                                      : tr("−VaR forecast (%1, one day, %2)").arg(confidence, modelName);
    d.exceptionLegend = tr("Exception: loss beyond VaR (%1)").arg(QLocale().toString(static_cast<int>(d.exceptionDays.size())));
    d.yLabel = tr("P&L per day (%1)").arg(chartstyle::moneyUnit(currency));
    if (d.keys.isEmpty())
        d.note = tr("No tested days to draw.");
    else if (d.skippedDays > 0)
        d.note = tr("%1 days without a finite figure are not drawn.").arg(d.skippedDays);
    return d;
}

} // namespace tailwise::ui

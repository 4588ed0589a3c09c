#include "charts/tradeoffchartdata.h"

#include "charts/chartstyle.h"
#include "document/gridaxes.h"
#include "text/assumptionlabels.h"

#include "tailwise/modelgrid.h"

#include <QCoreApplication>

#include <algorithm>
#include <cmath>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("TradeoffChart", text); }

QString modelWords(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal: return tr("normal");
    case RiskModel::StudentT: return tr("Student-t");
    case RiskModel::CornishFisher: return tr("Cornish–Fisher");
    case RiskModel::Historical: return tr("historical-simulation");
    case RiskModel::MonteCarlo: return tr("Monte Carlo");
    }
    return tr("normal");
}

} // namespace

double confidenceToTailScale(double confidence) { return -std::log10(1.0 - confidence); }
double tailScaleToConfidence(double tail) { return 1.0 - std::pow(10.0, -tail); }

std::vector<double> roundLevels(double lo, double hi, int target)
{
    std::vector<double> levels;
    if (!std::isfinite(lo) || !std::isfinite(hi) || !(hi > lo))
        return levels;
    const double step = chartstyle::niceStep(hi - lo, std::max(1, target));
    for (double level = std::ceil(lo / step) * step; level < hi; level += step)
        if (level > lo)
            levels.push_back(std::abs(level) < 1e-9 * step ? 0.0 : level);
    return levels;
}

TradeoffPick pickOnMap(double x, double y, int daysPerYear, const TradeoffOptions &options)
{
    TradeoffPick pick;
    const double days = std::isfinite(x) ? std::round(x) : 1.0;
    pick.horizonDays = static_cast<int>(std::clamp(days, 1.0, static_cast<double>(std::max(1, daysPerYear))));
    const double c = std::isfinite(y) ? tailScaleToConfidence(y) : options.maxConfidence;
    pick.confidence = std::clamp(std::round(c * 1000.0) / 1000.0, options.minConfidence, options.maxConfidence);
    return pick;
}

namespace {

// The map's rows: evenly spaced in the tail scale, the ends set exactly so the range reads
// 90% … 99.9% and not 99.899999…%.
std::vector<double> mapConfidences(const TradeoffOptions &options)
{
    const int steps = std::max(2, options.confidenceSteps);
    const double t0 = confidenceToTailScale(options.minConfidence);
    const double t1 = confidenceToTailScale(options.maxConfidence);
    std::vector<double> confidences;
    for (int k = 0; k < steps; ++k) {
        const double t = t0 + (t1 - t0) * k / (steps - 1);
        confidences.push_back(k == 0 ? options.minConfidence : k == steps - 1 ? options.maxConfidence : tailScaleToConfidence(t));
    }
    return confidences;
}

} // namespace

std::vector<double> tradeoffGridConfidences(const TradeoffOptions &options)
{
    std::vector<double> all = mapConfidences(options);
    all.insert(all.end(), options.lineConfidences.begin(), options.lineConfidences.end());
    return all;
}

Result<RiskGrid> computeTradeoffGrid(const RiskReport &report, const TradeoffOptions &options)
{
    return modelRiskGrid(report, gridHorizons(report), tradeoffGridConfidences(options));
}

TradeoffChartData buildTradeoffChartData(const RiskReport &report, const TradeoffOptions &options)
{
    return buildTradeoffChartData(report, computeTradeoffGrid(report, options), options);
}

TradeoffChartData buildTradeoffChartData(const RiskReport &report, const Result<RiskGrid> &all,
                                         const TradeoffOptions &options)
{
    TradeoffChartData d;
    const Assumptions &a = report.assumptions;
    d.horizonDays = a.horizonDays;
    d.confidence = a.confidence;
    d.currentVar = report.figures.var;
    d.daysPerYear = std::max(1, a.daysPerYear);
    d.horizonLabel = tr("Horizon (trading days)");
    d.confidenceLabel = tr("Confidence");
    d.varLabel = tr("VaR (%1)").arg(chartstyle::moneyUnit(options.currency));

    const HorizonMoments oneDay = report.oneDay;
    if (!std::isfinite(oneDay.sd) || !std::isfinite(oneDay.mean) || oneDay.sd < 0.0) {
        d.note = tr("No finite one-day P&L spread: nothing to draw.");
        return d;
    }
    const RiskModel model = report.model.used;
    // Which model every cell follows, then anything else to say.
    d.note = tr("Every figure here is under the %1 model, as the headline.").arg(modelWords(model));
    if (modelHasScaling(model))
        d.note += QLatin1Char(' ') + scalingNote(a.scaling);
    if (oneDay.sd == 0.0)
        d.note += QLatin1Char(' ')
                + tr("The P&L has no spread over this window: VaR is the expected loss alone at every confidence.");

    const int lastHorizon = gridLastHorizon(report);
    std::vector<int> horizons(static_cast<std::size_t>(lastHorizon));
    for (int h = 1; h <= lastHorizon; ++h)
        horizons[static_cast<std::size_t>(h - 1)] = h;

    const int steps = std::max(2, options.confidenceSteps);
    const double t0 = confidenceToTailScale(options.minConfidence);
    const double t1 = confidenceToTailScale(options.maxConfidence);
    d.mapTail.clear();
    for (int k = 0; k < steps; ++k)
        d.mapTail.push_back(t0 + (t1 - t0) * k / (steps - 1));
    const std::vector<double> confidences = mapConfidences(options);

    // One grid over every horizon and every confidence the three pictures need (so Monte Carlo
    // draws once), then each picture is a slice of it: a cell depends on its (H, C) alone. Its
    // rows are gridHorizons(report), its columns tradeoffGridConfidences(options).
    const bool currentInside = d.horizonDays >= 1 && d.horizonDays <= lastHorizon;
    const std::size_t columns = confidences.size() + options.lineConfidences.size();
    bool finite = all.ok() && all.value().horizons == gridHorizons(report) && all.value().confidences.size() == columns
                  && all.value().var.size() == all.value().horizons.size() * columns
                  && all.value().es.size() == all.value().var.size();
    if (finite)
        for (std::size_t k = 0; k < all.value().var.size(); ++k)
            finite = finite && std::isfinite(all.value().var[k]) && std::isfinite(all.value().es[k]);
    if (!finite) {
        d.note += QLatin1Char(' ') + tr("It gives no figures across horizons and confidences here.");
        return d;
    }
    const RiskGrid &g = all.value();
    auto slice = [&](const std::vector<std::size_t> &rows, std::size_t firstColumn, std::size_t columns) {
        RiskGrid out;
        for (std::size_t row : rows)
            out.horizons.push_back(g.horizons[row]);
        out.confidences.assign(g.confidences.begin() + static_cast<std::ptrdiff_t>(firstColumn),
                               g.confidences.begin() + static_cast<std::ptrdiff_t>(firstColumn + columns));
        for (std::size_t row : rows)
            for (std::size_t c = firstColumn; c < firstColumn + columns; ++c) {
                out.var.push_back(g.varAt(row, c));
                out.es.push_back(g.esAt(row, c));
            }
        return out;
    };
    std::vector<std::size_t> horizonRows(horizons.size());
    for (std::size_t k = 0; k < horizons.size(); ++k)
        horizonRows[k] = k;
    const std::size_t currentRow = currentInside ? static_cast<std::size_t>(d.horizonDays - 1) : horizons.size();
    d.valid = true;
    d.byHorizon = slice(horizonRows, confidences.size(), options.lineConfidences.size());
    d.byConfidence = slice({currentRow}, 0, confidences.size());
    d.map = slice(horizonRows, 0, confidences.size());

    const auto [lo, hi] = std::minmax_element(d.map.var.cbegin(), d.map.var.cend());
    d.varMin = *lo;
    d.varMax = *hi;

    std::vector<double> xs(horizons.begin(), horizons.end());
    for (double level : roundLevels(d.varMin, d.varMax, options.contourTarget)) {
        ContourLevel c;
        c.level = level;
        c.label = chartstyle::money(level);
        c.lines = contourLines(xs, d.mapTail, d.map.var, level);
        if (c.lines.empty())
            continue;
        // Label each level at the point of its lines farthest from the map's edges (in units of
        // the axis spans), so the label is never cut off by the frame.
        const double x0 = xs.front(), x1 = xs.back(), y0 = d.mapTail.front(), y1 = d.mapTail.back();
        double best = -1.0;
        for (const ContourLine &line : c.lines)
            for (const ContourPoint &pt : line) {
                const double room = std::min({(pt.x - x0) / (x1 - x0), (x1 - pt.x) / (x1 - x0),
                                              (pt.y - y0) / (y1 - y0), (y1 - pt.y) / (y1 - y0)});
                if (room > best) {
                    best = room;
                    c.labelAt = pt;
                }
            }
        d.contours.push_back(std::move(c));
    }

    if (model != RiskModel::Normal)
        return d; // the turning horizon below is the normal model's
    for (double c : options.lineConfidences) {
        const auto h = normalVarTurningHorizon(oneDay, c);
        if (h && *h >= 1.0 && *h <= d.daysPerYear)
            // The peak VaR is core's figure at the (fractional) turning horizon.
            d.lineTurns.push_back({c, *h, normalVarEs({*h * oneDay.mean, std::sqrt(*h) * oneDay.sd}, c).var});
    }
    for (std::size_t k = 0; k < confidences.size(); ++k) {
        const auto h = normalVarTurningHorizon(oneDay, confidences[k]);
        if (h && *h >= 1.0 && *h <= d.daysPerYear)
            d.ridge.push_back({*h, d.mapTail[k]});
    }
    if (!d.ridge.empty())
        d.ridgeLabel = tr("VaR peaks here: at longer horizons the expected gain outgrows the √H spread");
    return d;
}

} // namespace tailwise::ui

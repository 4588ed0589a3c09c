#include "charts/tradeoffchartdata.h"

#include "charts/chartstyle.h"

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

TradeoffChartData buildTradeoffChartData(const RiskReport &report, const TradeoffOptions &options)
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
    d.modelText = tr("Every figure here is under the %1 model, as the headline.").arg(modelWords(model));
    if (oneDay.sd == 0.0)
        d.note = tr("The P&L has no spread over this window: VaR is the expected loss alone at every confidence.");

    int lastHorizon = d.daysPerYear;
    if (model == RiskModel::Historical && a.historicalHorizon == HistoricalHorizon::Overlapping)
        lastHorizon = std::max(1, std::min(lastHorizon, report.windowReturns - 1));
    std::vector<int> horizons(static_cast<std::size_t>(lastHorizon));
    for (int h = 1; h <= lastHorizon; ++h)
        horizons[static_cast<std::size_t>(h - 1)] = h;

    auto grid = [&](std::vector<int> hs, std::vector<double> cs) -> std::optional<RiskGrid> {
        auto g = modelRiskGrid(report, std::move(hs), std::move(cs));
        if (!g)
            return std::nullopt;
        for (double v : g.value().var)
            if (!std::isfinite(v))
                return std::nullopt;
        for (double v : g.value().es)
            if (!std::isfinite(v))
                return std::nullopt;
        return std::move(g).value();
    };
    auto byHorizon = grid(horizons, options.lineConfidences);
    if (!byHorizon) {
        d.note = tr("The %1 model gives no figures across horizons and confidences here.").arg(modelWords(model));
        return d;
    }
    d.valid = true;
    d.byHorizon = std::move(*byHorizon);

    const int steps = std::max(2, options.confidenceSteps);
    const double t0 = confidenceToTailScale(options.minConfidence);
    const double t1 = confidenceToTailScale(options.maxConfidence);
    std::vector<double> confidences;
    d.mapTail.clear();
    for (int k = 0; k < steps; ++k) {
        const double t = t0 + (t1 - t0) * k / (steps - 1);
        d.mapTail.push_back(t);
        // The ends are set exactly, so the range reads 90% … 99.9% and not 99.899999…%.
        confidences.push_back(k == 0 ? options.minConfidence : k == steps - 1 ? options.maxConfidence : tailScaleToConfidence(t));
    }
    auto byConfidence = grid({d.horizonDays}, confidences);
    auto map = grid(horizons, confidences);
    if (!byConfidence || !map) {
        d.valid = false;
        d.note = tr("The %1 model gives no figures across horizons and confidences here.").arg(modelWords(model));
        return d;
    }
    d.byConfidence = std::move(*byConfidence);
    d.map = std::move(*map);

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

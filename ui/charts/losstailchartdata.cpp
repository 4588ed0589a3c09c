#include "charts/losstailchartdata.h"

#include "charts/chartstyle.h"

#include "tailwise/modeldensity.h"

#include <QCoreApplication>
#include <QLocale>

#include <algorithm>
#include <cmath>
#include <vector>

namespace tailwise::ui {

namespace {

QString tr(const char *text, const char *disambiguation = nullptr, int n = -1)
{
    return QCoreApplication::translate("LossTailChart", text, disambiguation, n);
}

bool finite(double v) { return std::isfinite(v); }

// Freedman–Diaconis bin width 2·IQR·n^(−1/3) (Freedman & Diaconis 1981), as a bin count.
int chooseBins(std::vector<double> sorted, double span)
{
    const std::size_t n = sorted.size();
    if (n < 4 || !(span > 0.0))
        return 12;
    const double q1 = sorted[n / 4];
    const double q3 = sorted[(3 * n) / 4];
    const double width = 2.0 * (q3 - q1) / std::cbrt(static_cast<double>(n));
    if (!(width > 0.0))
        return 12;
    return std::clamp(static_cast<int>(std::ceil(span / width)), 12, 80);
}

void fillHistogram(const RiskReport &report, const LossTailOptions &options, double scale, LossTailChartData &d)
{
    const Eigen::MatrixXd &r = report.windowReturnsMatrix;
    if (r.rows() < 2 || r.cols() != report.exposures.size())
        return;
    const Eigen::VectorXd pnl = r * report.exposures;
    std::vector<double> values;
    values.reserve(static_cast<std::size_t>(pnl.size()));
    const double root = std::sqrt(static_cast<double>(report.assumptions.horizonDays));
    for (Eigen::Index t = 0; t < pnl.size(); ++t) {
        const double v = pnl(t) * root / scale;
        if (finite(v))
            values.push_back(v);
    }
    if (values.size() < 2)
        return;
    std::sort(values.begin(), values.end());
    const double lo = values.front();
    const double hi = values.back();
    if (!(hi > lo))
        return; // every day the same: no spread to draw
    const int bins = options.histogramBins > 0 ? options.histogramBins : chooseBins(values, hi - lo);
    const double width = (hi - lo) / bins;
    QVector<double> counts(bins, 0.0);
    for (double v : values)
        counts[std::min(bins - 1, static_cast<int>((v - lo) / width))] += 1.0;
    const double n = static_cast<double>(values.size());
    d.binCenters.resize(bins);
    d.binDensity.resize(bins);
    for (int b = 0; b < bins; ++b) {
        d.binCenters[b] = lo + (b + 0.5) * width;
        d.binDensity[b] = counts[b] / (n * width);
    }
    d.binWidth = width;
    d.historyCount = static_cast<int>(values.size());
    d.hasHistogram = true;
}

// A report's density at the chart's x (x units), or nullopt when it has none or a value is not finite.
std::optional<QVector<double>> densityAt(const RiskReport &report, const LossTailChartData &d, bool normalFallback)
{
    std::vector<double> money(static_cast<std::size_t>(d.x.size()));
    for (qsizetype i = 0; i < d.x.size(); ++i)
        money[static_cast<std::size_t>(i)] = d.x[i] * d.moneyPerUnit;
    std::optional<std::vector<double>> f = modelPnlDensity(report, money);
    if (!f && normalFallback && report.horizon.sd > 0.0) {
        f.emplace();
        for (double x : money)
            f->push_back(normalPnlDensity(report.horizon, x));
    }
    if (!f)
        return std::nullopt;
    QVector<double> out;
    out.reserve(d.x.size());
    for (double v : *f) {
        const double y = v * d.moneyPerUnit; // per money → per x unit
        if (!finite(y))
            return std::nullopt;
        out.push_back(y);
    }
    return out;
}

} // namespace

LossTailChartData buildLossTailChartData(const RiskReport &report, const LossTailOptions &options)
{
    LossTailChartData d;
    d.confidence = report.assumptions.confidence;
    d.horizonDays = report.assumptions.horizonDays;
    d.tailProbability = 1.0 - d.confidence;

    d.unit = options.unit;
    if (d.unit == LossTailUnit::PercentOfValue && !(report.portfolioValue > 0.0 && finite(report.portfolioValue))) {
        d.unit = LossTailUnit::Money;
        d.note = tr("The portfolio's net value is not positive, so P&L is shown in money, not as a share of it.");
    }
    const double scale = d.unit == LossTailUnit::Money ? 1.0 : report.portfolioValue / 100.0;
    d.moneyPerUnit = scale;
    d.model = HorizonMoments{report.horizon.mean / scale, report.horizon.sd / scale};
    // The boundary is VaR itself, not a re-derived quantile, so it matches the headline exactly.
    d.tailBoundary = d.unit == LossTailUnit::Money ? -report.figures.var : -report.figures.var / scale;
    d.esMarker = d.unit == LossTailUnit::Money ? -report.figures.es : -report.figures.es / scale;

    const QString conf = chartstyle::confidenceText(d.confidence);
    const QString days = tr("%n-day", nullptr, d.horizonDays);
    d.varLabel = tr("VaR %1: %2").arg(conf, chartstyle::money(report.figures.var));
    d.esLabel = tr("ES %1: %2").arg(conf, chartstyle::money(report.figures.es));
    if (d.unit == LossTailUnit::PercentOfValue && report.varFraction && report.esFraction) {
        d.varLabel += QStringLiteral(" (") + chartstyle::percent(*report.varFraction, 2) + QStringLiteral(")");
        d.esLabel += QStringLiteral(" (") + chartstyle::percent(*report.esFraction, 2) + QStringLiteral(")");
    }
    d.xLabel = d.unit == LossTailUnit::Money ? tr("%1 P&L (%2; losses to the left)").arg(days, chartstyle::moneyUnit(options.currency))
                                             : tr("%1 P&L (% of portfolio value; losses to the left)").arg(days);
    if (report.assumptions.model == RiskModel::Normal) {
        d.curveLegend = tr("Model: normal P&L density");
        d.tailLegend = tr("Loss beyond VaR (%1 chance under the model)").arg(chartstyle::percent(d.tailProbability, 2));
    } else {
        // Other models give VaR and ES from another distribution; the curve is only the normal one
        // with the same mean and spread, so the shaded area need not hold exactly 1 − C.
        d.curveLegend = tr("Normal curve with the portfolio's mean and spread");
        d.tailLegend = tr("Loss beyond the model's VaR");
        d.note = tr("VaR and ES come from the chosen model; the curve is the normal distribution with the same "
                    "mean and spread, drawn for orientation.");
    }

    if (options.showHistory)
        fillHistogram(report, options, scale, d);
    if (d.hasHistogram) {
        d.histogramLegend = d.horizonDays == 1
                                ? tr("History: %n daily P&L on today's holdings", nullptr, d.historyCount)
                                : tr("History: %n daily P&L on today's holdings × √%1 (scaled to the horizon)",
                                     nullptr, d.historyCount).arg(d.horizonDays);
    }

    d.hasCurve = d.model.sd > 0.0 && finite(d.model.sd) && finite(d.model.mean) && finite(d.tailBoundary)
                 && finite(d.esMarker);
    if (d.hasCurve) {
        d.xMin = d.model.mean - options.spanSd * d.model.sd;
        d.xMax = d.model.mean + options.spanSd * d.model.sd;
        d.xMin = std::min(d.xMin, d.esMarker - 0.5 * d.model.sd);
    } else {
        const double centre = finite(d.model.mean) ? d.model.mean : 0.0;
        const double half = std::max(1.0, 0.5 * std::abs(centre));
        d.xMin = centre - half;
        d.xMax = centre + half;
        d.note = tr("The P&L has no spread over this window, so there is no distribution to draw: the model expects "
                    "a P&L of %1 over the horizon for certain, and VaR is %2.")
                     .arg(chartstyle::signedMoney(report.horizon.mean), chartstyle::money(report.figures.var));
        d.tailBoundary = finite(d.tailBoundary) ? d.tailBoundary : 0.0;
        d.esMarker = finite(d.esMarker) ? d.esMarker : 0.0;
    }
    if (d.hasHistogram) {
        d.xMin = std::min(d.xMin, d.binCenters.front() - d.binWidth);
        d.xMax = std::max(d.xMax, d.binCenters.back() + d.binWidth);
    }

    if (d.hasCurve) {
        const int n = std::max(3, options.curvePoints);
        d.x.reserve(n);
        d.density.reserve(n);
        const double step = (d.xMax - d.xMin) / (n - 1);
        for (int i = 0; i < n; ++i) {
            const double x = d.xMin + i * step;
            d.x.push_back(x);
            d.density.push_back(normalPnlDensity(d.model, x));
        }
        // The tail polygon ends exactly on the boundary, so the shading stops at −VaR.
        for (int i = 0; i < n && d.x[i] < d.tailBoundary; ++i) {
            d.tailX.push_back(d.x[i]);
            d.tailDensity.push_back(d.density[i]);
        }
        if (d.tailBoundary >= d.xMin) {
            d.tailX.push_back(d.tailBoundary);
            d.tailDensity.push_back(normalPnlDensity(d.model, d.tailBoundary));
        }
        d.densityMax = *std::max_element(d.density.cbegin(), d.density.cend());
        if (options.ghost) {
            if (auto f = densityAt(*options.ghost, d, true))
                d.overlays.push_back({options.ghostLegend.isEmpty() ? tr("Before the trades") : options.ghostLegend,
                                      std::move(*f), true});
        }
        for (const auto &[legend, other] : options.overlays) {
            if (!other)
                continue;
            if (auto f = densityAt(*other, d, false))
                d.overlays.push_back({legend, std::move(*f), false});
        }
        for (const LossTailOverlay &o : d.overlays)
            d.densityMax = std::max(d.densityMax, *std::max_element(o.density.cbegin(), o.density.cend()));
    }
    for (double b : d.binDensity)
        d.densityMax = std::max(d.densityMax, b);

    // Densities per x unit are tiny in money (1e-6 per unit of currency); show probability per a
    // round slice of the axis instead, which reads as a plain number.
    d.densityDisplayPer = chartstyle::niceStep(d.xMax - d.xMin, 100);
    const QString per = d.unit == LossTailUnit::Money ? chartstyle::money(d.densityDisplayPer, d.densityDisplayPer < 1 ? 2 : 0)
                                                      : QLocale().toString(d.densityDisplayPer, 'g', 3) + QLocale().percent();
    // Two short lines: along the axis one long line is cut or shrunk on small pictures.
    d.yLabel = tr("Probability (%)\nper %1 of P&L").arg(per);
    return d;
}

std::optional<double> lossTailProbabilityBelow(const LossTailChartData &data, double x)
{
    if (!data.hasCurve || !std::isfinite(x))
        return std::nullopt;
    return normalPnlProbabilityBelow(data.model, x);
}

QString lossTailHoverText(const LossTailChartData &data, double x)
{
    const auto p = lossTailProbabilityBelow(data, x);
    if (!p)
        return {};
    const double money = x * data.moneyPerUnit;
    QString amount = chartstyle::money(std::abs(money));
    if (data.unit == LossTailUnit::PercentOfValue)
        amount += QStringLiteral(" (") + QLocale().toString(std::abs(x), 'f', 2) + QLocale().percent() + QStringLiteral(")");
    const int decimals = *p < 0.001 ? 3 : (*p < 0.1 ? 2 : 1);
    const QString chance = chartstyle::percent(*p, decimals);
    return money < 0 ? tr("Chance of losing more than %1: %2 (model)").arg(amount, chance)
                     : tr("Chance of gaining less than %1: %2 (model)").arg(amount, chance);
}

} // namespace tailwise::ui

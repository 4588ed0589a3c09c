#include "tailwise/grid.h"
#include "tailwise/modelgrid.h"

#include "tailwise/allocation.h"
#include "tailwise/cornishfisher.h"
#include "tailwise/historical.h"
#include "tailwise/risk.h"
#include "tailwise/simulate.h"
#include "tailwise/studentt.h"

#include <algorithm>
#include <span>

#include <cmath>

namespace tailwise {

RiskGrid normalRiskGrid(HorizonMoments oneDay, std::vector<int> horizons, std::vector<double> confidences)
{
    RiskGrid grid;
    grid.horizons = std::move(horizons);
    grid.confidences = std::move(confidences);
    grid.var.reserve(grid.horizons.size() * grid.confidences.size());
    grid.es.reserve(grid.var.capacity());
    // The factors depend on the confidence only: found once per column, not once per cell (a
    // year × 60 confidences is 15,000 cells). Each cell is then exactly normalVarEs's expression.
    std::vector<double> z, tail;
    z.reserve(grid.confidences.size());
    tail.reserve(grid.confidences.size());
    for (double c : grid.confidences) {
        z.push_back(normalQuantile(c));
        tail.push_back(normalTailMeanFactor(c));
    }
    for (int h : grid.horizons) {
        const HorizonMoments m{oneDay.mean * h, oneDay.sd * std::sqrt(static_cast<double>(h))};
        for (std::size_t k = 0; k < grid.confidences.size(); ++k) {
            grid.var.push_back(z[k] * m.sd - m.mean);
            grid.es.push_back(tail[k] * m.sd - m.mean);
        }
    }
    return grid;
}

namespace {

RiskGrid emptyGrid(std::vector<int> horizons, std::vector<double> confidences)
{
    RiskGrid g;
    g.horizons = std::move(horizons);
    g.confidences = std::move(confidences);
    g.var.reserve(g.horizons.size() * g.confidences.size());
    g.es.reserve(g.var.capacity());
    return g;
}

// Cells k_V σ_h − μ_h with factors that depend on (H, C) through `factors(h, c)` → VarEs.
template <class Factors>
RiskGrid factorGrid(HorizonMoments oneDay, std::vector<int> horizons, std::vector<double> confidences, Factors factors)
{
    RiskGrid g = emptyGrid(std::move(horizons), std::move(confidences));
    for (int h : g.horizons) {
        // As risk.cpp's horizon moments: {H μ_1, √H σ_1}.
        const HorizonMoments m{static_cast<double>(h) * oneDay.mean, std::sqrt(static_cast<double>(h)) * oneDay.sd};
        for (std::size_t k = 0; k < g.confidences.size(); ++k) {
            const VarEs f = factors(h, k);
            g.var.push_back(f.var * m.sd - m.mean);
            g.es.push_back(f.es * m.sd - m.mean);
        }
    }
    return g;
}

Result<RiskGrid> historicalGrid(const RiskReport &r, std::vector<int> horizons, std::vector<double> confidences)
{
    const auto &a = r.assumptions;
    RiskGrid g = emptyGrid(std::move(horizons), std::move(confidences));
    const Eigen::Index days = r.windowReturnsMatrix.rows();
    if (a.historicalHorizon == HistoricalHorizon::Overlapping) {
        for (int h : g.horizons) {
            if (days - h + 1 < 2)
                return fieldError(ErrorKind::InsufficientData, "horizon",
                                  "overlapping " + std::to_string(h) + "-day sums need at least " + std::to_string(h + 1)
                                      + " daily returns in the window, found " + std::to_string(days));
            const Eigen::VectorXd losses =
                -historicalScenarioPnl(r.windowReturnsMatrix, r.exposures, h, a.historicalHorizon).rowwise().sum();
            const std::span<const double> span(losses.data(), static_cast<std::size_t>(losses.size()));
            for (double c : g.confidences) {
                const VarEs f = empiricalVarEs(span, c); // the H-day sums: no further scaling
                g.var.push_back(f.var);
                g.es.push_back(f.es);
            }
        }
        return g;
    }
    const Eigen::VectorXd losses =
        -historicalScenarioPnl(r.windowReturnsMatrix, r.exposures, 1, HistoricalHorizon::SquareRoot).rowwise().sum();
    const std::span<const double> span(losses.data(), static_cast<std::size_t>(losses.size()));
    std::vector<VarEs> oneDay;
    for (double c : g.confidences)
        oneDay.push_back(empiricalVarEs(span, c));
    for (int h : g.horizons) {
        const double scale = std::sqrt(static_cast<double>(h));
        for (const VarEs &f : oneDay) {
            g.var.push_back(f.var * scale);
            g.es.push_back(f.es * scale);
        }
    }
    return g;
}

Result<RiskGrid> monteCarloGrid(const RiskReport &r, std::vector<int> horizons, std::vector<double> confidences,
                                const RunControl &control)
{
    const auto &a = r.assumptions;
    SimulationSettings settings{a.simulations, a.seed, r.model.dof, false};
    auto draws = simulateStandardPnl(r.exposures, r.moments.covariance, settings, control);
    if (!draws)
        return draws.error();
    // Losses of the standard draws, sorted once; the type 7 quantile and the tail mean per C.
    std::vector<double> sorted(static_cast<std::size_t>(draws.value().size()));
    for (std::size_t k = 0; k < sorted.size(); ++k)
        sorted[k] = -draws.value()(static_cast<Eigen::Index>(k));
    std::sort(sorted.begin(), sorted.end());
    std::vector<double> suffix(sorted.size() + 1, 0.0); // suffix[j] = Σ_{k ≥ j} sorted[k]
    for (std::size_t k = sorted.size(); k-- > 0;)
        suffix[k] = suffix[k + 1] + sorted[k];
    std::vector<VarEs> unit;
    for (double c : confidences) {
        const double hq = static_cast<double>(sorted.size() - 1) * c;
        const auto j = static_cast<std::size_t>(std::floor(hq));
        const double q = j + 1 < sorted.size() ? sorted[j] + (hq - std::floor(hq)) * (sorted[j + 1] - sorted[j]) : sorted.back();
        const auto first = static_cast<std::size_t>(std::lower_bound(sorted.begin(), sorted.end(), q) - sorted.begin());
        unit.push_back(VarEs{q, suffix[first] / static_cast<double>(sorted.size() - first)});
    }
    const double drift = r.exposures.dot(r.moments.mean);
    RiskGrid g = emptyGrid(std::move(horizons), std::move(confidences));
    for (int h : g.horizons) {
        const double rootH = std::sqrt(static_cast<double>(h));
        const double mean = static_cast<double>(h) * drift;
        for (const VarEs &f : unit) {
            g.var.push_back(rootH * f.var - mean);
            g.es.push_back(rootH * f.es - mean);
        }
    }
    return g;
}

} // namespace

Result<RiskGrid> modelRiskGrid(const RiskReport &r, std::vector<int> horizons, std::vector<double> confidences,
                               const RunControl &control)
{
    const MultiDayScaling scaling = r.assumptions.scaling;
    const bool aggregate = scaling == MultiDayScaling::Aggregate;
    switch (r.model.used) {
    case RiskModel::Normal:
        break;
    case RiskModel::StudentT: {
        const double nu = *r.model.dof;
        std::vector<VarEs> daily;
        for (double c : confidences)
            daily.push_back(VarEs{studentTVarFactor(nu, c), studentTEsFactor(nu, c)});
        return factorGrid(r.oneDay, std::move(horizons), confidences, [&](int h, std::size_t k) {
            if (!aggregate || h == 1)
                return daily[k];
            const double nuH = aggregateDof(nu, h);
            return VarEs{studentTVarFactor(nuH, confidences[k]), studentTEsFactor(nuH, confidences[k])};
        });
    }
    case RiskModel::CornishFisher: {
        const Shape shape = *r.model.shape;
        std::vector<VarEs> daily;
        for (double c : confidences) {
            const CornishFisherFactors f = cornishFisherFactors(c, shape);
            daily.push_back(VarEs{f.var, f.es});
        }
        return factorGrid(r.oneDay, std::move(horizons), confidences, [&](int h, std::size_t k) {
            if (!aggregate || h == 1)
                return daily[k];
            const CornishFisherFactors f = cornishFisherFactors(confidences[k], scaledShape(shape, h, scaling));
            return VarEs{f.var, f.es};
        });
    }
    case RiskModel::Historical:
        return historicalGrid(r, std::move(horizons), std::move(confidences));
    case RiskModel::MonteCarlo:
        return monteCarloGrid(r, std::move(horizons), std::move(confidences), control);
    }
    return normalRiskGrid(r.oneDay, std::move(horizons), std::move(confidences));
}

std::optional<double> normalVarTurningHorizon(HorizonMoments oneDay, double confidence)
{
    if (!(oneDay.mean > 0.0) || !(oneDay.sd > 0.0) || !(confidence > 0.5 && confidence < 1.0))
        return std::nullopt;
    const double root = normalQuantile(confidence) * oneDay.sd / (2.0 * oneDay.mean);
    const double h = root * root;
    if (!std::isfinite(h))
        return std::nullopt;
    return h;
}

} // namespace tailwise

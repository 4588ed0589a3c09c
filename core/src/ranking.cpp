#include "tailwise/ranking.h"

#include <boost/math/distributions/normal.hpp>

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numeric>

namespace tailwise {

double fz0Score(double loss, double var, double es, double alpha)
{
    assert(es > 0.0 && alpha > 0.0 && alpha < 1.0);
    const double hit = loss >= var ? (loss - var) / (alpha * es) : 0.0;
    return hit + var / es + std::log(es) - 1.0;
}

int neweyWestLag(int t)
{
    int lag = 0;
    while (static_cast<long long>(lag + 1) * (lag + 1) * (lag + 1) <= t)
        ++lag;
    return lag;
}

DieboldMariano dieboldMariano(std::span<const double> d)
{
    assert(!d.empty());
    DieboldMariano out;
    const int n = static_cast<int>(d.size());
    out.lag = neweyWestLag(n);
    const double mean = std::accumulate(d.begin(), d.end(), 0.0) / n;
    auto gamma = [&](int l) {
        double s = 0.0;
        for (int t = l; t < n; ++t)
            s += (d[static_cast<std::size_t>(t)] - mean) * (d[static_cast<std::size_t>(t - l)] - mean);
        return s / n;
    };
    double v = gamma(0);
    for (int l = 1; l <= out.lag; ++l)
        v += 2.0 * (1.0 - static_cast<double>(l) / (out.lag + 1)) * gamma(l);
    if (!(v > 0.0) || !std::isfinite(v))
        return out;
    out.statistic = mean / std::sqrt(v / n);
    out.pValue = 2.0 * boost::math::cdf(boost::math::complement(boost::math::normal(), std::abs(out.statistic)));
    return out;
}

Result<std::vector<RankingRow>> rankByFz0(std::span<const RankingInput> models, double confidence)
{
    if (models.empty())
        return fieldError(ErrorKind::Assumption, "compare", "no model to rank");
    const double alpha = 1.0 - confidence;
    const std::size_t days = models.front().losses.size();
    std::vector<std::vector<double>> scores;
    for (const auto &m : models) {
        if (m.losses.size() != days || m.vars.size() != days || m.ess.size() != days || days == 0)
            return fieldError(ErrorKind::Assumption, "compare",
                              "the models were not backtested over the same days (" + m.model + ")");
        std::vector<double> s(days);
        for (std::size_t t = 0; t < days; ++t) {
            if (!(m.ess[t] > 0.0))
                return fieldError(ErrorKind::Assumption, "compare",
                                  "the " + m.model + " model's ES on tested day " + std::to_string(t + 1)
                                      + " is not positive, so its FZ0 score (which takes ln ES) is not defined");
            s[t] = fz0Score(m.losses[t], m.vars[t], m.ess[t], alpha);
        }
        scores.push_back(std::move(s));
    }
    std::vector<RankingRow> rows(models.size());
    std::size_t best = 0;
    for (std::size_t k = 0; k < models.size(); ++k) {
        rows[k].model = models[k].model;
        rows[k].fz0 = std::accumulate(scores[k].begin(), scores[k].end(), 0.0) / static_cast<double>(days);
        if (rows[k].fz0 < rows[best].fz0)
            best = k;
    }
    std::vector<double> d(days);
    for (std::size_t k = 0; k < models.size(); ++k) {
        if (k == best)
            continue;
        for (std::size_t t = 0; t < days; ++t)
            d[t] = scores[k][t] - scores[best][t];
        const DieboldMariano dm = dieboldMariano(d);
        rows[k].dmStatistic = dm.statistic;
        rows[k].dmPValue = dm.pValue;
    }
    std::vector<std::size_t> order(models.size());
    std::iota(order.begin(), order.end(), 0);
    std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return rows[a].fz0 < rows[b].fz0; });
    std::vector<RankingRow> sorted;
    for (std::size_t k : order)
        sorted.push_back(rows[k]);
    return sorted;
}

} // namespace tailwise

#include "tailwise/historical.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <vector>

namespace tailwise {

double empiricalQuantile(std::span<const double> sample, double p)
{
    assert(!sample.empty() && p >= 0.0 && p <= 1.0);
    std::vector<double> x(sample.begin(), sample.end());
    std::sort(x.begin(), x.end());
    const double h = static_cast<double>(x.size() - 1) * p;
    const double lower = std::floor(h);
    const auto j = static_cast<std::size_t>(lower);
    if (j + 1 >= x.size())
        return x.back();
    const double g = h - lower;
    return x[j] + g * (x[j + 1] - x[j]);
}

double tailMean(std::span<const double> sample, double threshold)
{
    double sum = 0.0;
    int count = 0;
    for (double v : sample)
        if (v >= threshold) {
            sum += v;
            ++count;
        }
    assert(count > 0);
    return sum / count;
}

VarEs empiricalVarEs(std::span<const double> losses, double confidence)
{
    const double var = empiricalQuantile(losses, confidence);
    return VarEs{var, tailMean(losses, var)};
}

Eigen::VectorXd overlappingSums(const Eigen::VectorXd &x, int days)
{
    const Eigen::Index n = x.size() - days + 1;
    Eigen::VectorXd out(std::max<Eigen::Index>(n, 0));
    for (Eigen::Index k = 0; k < n; ++k)
        out(k) = x.segment(k, days).sum();
    return out;
}

Result<HistoricalFigures> historicalVarEs(const Eigen::VectorXd &pnl, int horizonDays, double confidence,
                                          HistoricalHorizon method)
{
    HistoricalFigures out;
    Eigen::VectorXd losses;
    if (method == HistoricalHorizon::Overlapping && horizonDays > 1) {
        if (pnl.size() - horizonDays + 1 < 2)
            return fieldError(ErrorKind::InsufficientData, "horizon",
                              "overlapping " + std::to_string(horizonDays) + "-day sums need at least "
                                  + std::to_string(horizonDays + 1) + " daily returns in the window, found "
                                  + std::to_string(pnl.size()));
        losses = -overlappingSums(pnl, horizonDays);
        out.warnings.push_back("historical " + std::to_string(horizonDays)
                               + "-day losses come from overlapping sums of daily P&L: neighbouring sums share "
                                 "most of their days, so the sample holds far fewer independent observations than "
                               + std::to_string(losses.size()));
    } else {
        if (pnl.size() < 2)
            return fieldError(ErrorKind::InsufficientData, "window", "historical simulation needs at least 2 daily returns");
        losses = -pnl;
    }
    out.scenarios = static_cast<int>(losses.size());
    out.figures = empiricalVarEs(std::span<const double>(losses.data(), static_cast<std::size_t>(losses.size())), confidence);
    if (method == HistoricalHorizon::SquareRoot && horizonDays > 1) {
        const double root = std::sqrt(static_cast<double>(horizonDays));
        out.figures.var *= root;
        out.figures.es *= root;
    }
    const double tailCount = (1.0 - confidence) * static_cast<double>(losses.size());
    if (tailCount < 5.0)
        out.warnings.push_back("only about " + std::to_string(static_cast<int>(std::floor(tailCount)))
                               + " of the " + std::to_string(losses.size())
                               + " historical losses lie beyond the VaR: the historical ES rests on very few days");
    return out;
}

} // namespace tailwise

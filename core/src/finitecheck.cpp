#include "tailwise/finitecheck.h"

#include <cmath>
#include <optional>

namespace tailwise {

namespace {

bool finite(double v) { return std::isfinite(v); }
bool finite(const std::optional<double> &v) { return !v || std::isfinite(*v); }

// Every entry finite iff Σ 0·x is 0: 0·x is 0 for a finite x and NaN for an infinite or NaN one,
// and a NaN survives the sum (IEEE 754). A vectorised sum reads a large window several times
// faster than allFinite's entry-by-entry test, which matters on every edit of a large book.
template <class Derived>
bool finite(const Eigen::DenseBase<Derived> &m)
{
    return m.size() == 0 || (m.derived().array() * 0.0).sum() == 0.0;
}

Error tooLarge(const std::string &what)
{
    return fieldError(ErrorKind::Numerical, "figures",
                      what + " is too large to compute (beyond about 1e308): check the prices and the quantities");
}

} // namespace

Status requireFiniteInputs(const Eigen::MatrixXd &heldReturns, const Eigen::VectorXd &exposures,
                           const Holdings &holdings, const std::string &pricesSource)
{
    for (Eigen::Index i = 0; i < exposures.size() && i < static_cast<Eigen::Index>(holdings.size()); ++i) {
        const std::string &asset = holdings[static_cast<std::size_t>(i)].asset;
        if (!std::isfinite(exposures(i)))
            return fieldError(ErrorKind::Numerical, "holding " + std::to_string(i + 1),
                              "the exposure of \"" + asset
                                  + "\" (quantity × price) is too large to compute (beyond about 1e308): check its "
                                    "quantity and price");
        if (i < heldReturns.cols() && !finite(heldReturns.col(i))) {
            const std::string place = pricesSource.empty() ? std::string("prices") : pricesSource;
            return fileError(ErrorKind::Numerical, pricesSource, 0, 0,
                             "the daily returns of \"" + asset
                                 + "\" are too large to compute: its prices change by a factor beyond about 1e308 "
                                   "from one day to the next; check the prices in " + place);
        }
    }
    return Done{};
}

Status requireFiniteReport(const RiskReport &r)
{
    if (!finite(r.portfolioValue) || !finite(r.exposures))
        return tooLarge("the portfolio's value");
    if (!finite(r.figures.var) || !finite(r.figures.es) || !finite(r.horizon.mean) || !finite(r.horizon.sd)
        || !finite(r.oneDay.mean) || !finite(r.oneDay.sd) || !finite(r.varFraction) || !finite(r.esFraction))
        return tooLarge("the portfolio's VaR or ES");
    if (!finite(r.undiversifiedVar) || !finite(r.diversificationBenefit))
        return tooLarge("the undiversified VaR");
    for (const auto &h : r.holdings) {
        if (!finite(h.quantity) || !finite(h.price) || !finite(h.exposure) || !finite(h.weight)
            || !finite(h.dailyVolatility) || !finite(h.marginalVar) || !finite(h.componentVar)
            || !finite(h.componentShare) || !finite(h.componentEs) || !finite(h.standaloneVar)
            || !finite(h.standaloneEs))
            return tooLarge("the contribution of \"" + h.asset + "\"");
    }
    if (!finite(r.moments.mean) || !finite(r.moments.covariance) || !finite(r.windowReturnsMatrix))
        return tooLarge("the mean or covariance of the returns");
    const auto &m = r.model;
    if (!finite(m.dof) || !finite(m.varStandardError) || !finite(m.esStandardError)
        || (m.shape && (!finite(m.shape->skewness) || !finite(m.shape->excessKurtosis))))
        return tooLarge("a detail of the " + std::string(toName(r.assumptions.model)) + " model");
    return Done{};
}

} // namespace tailwise

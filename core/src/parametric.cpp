#include "tailwise/parametric.h"

#include <boost/math/distributions/normal.hpp>

#include <cassert>
#include <cmath>

namespace tailwise {

double normalQuantile(double confidence)
{
    assert(confidence > 0.0 && confidence < 1.0);
    const boost::math::normal standard;
    // Upper-tail complement: accurate when 1 − C is small.
    return boost::math::quantile(boost::math::complement(standard, 1.0 - confidence));
}

double normalTailMeanFactor(double confidence)
{
    const boost::math::normal standard;
    return boost::math::pdf(standard, normalQuantile(confidence)) / (1.0 - confidence);
}

VarEs normalVarEs(HorizonMoments m, double confidence)
{
    return VarEs{normalQuantile(confidence) * m.sd - m.mean, normalTailMeanFactor(confidence) * m.sd - m.mean};
}

double normalPnlDensity(HorizonMoments m, double pnl)
{
    assert(m.sd > 0.0);
    return boost::math::pdf(boost::math::normal(m.mean, m.sd), pnl);
}

double normalPnlProbabilityBelow(HorizonMoments m, double pnl)
{
    assert(m.sd > 0.0);
    return boost::math::cdf(boost::math::normal(m.mean, m.sd), pnl);
}

Result<HorizonMoments> singlePositionMoments(const SinglePosition &p, int horizonDays, int daysPerYear)
{
    if (!std::isfinite(p.value))
        return fieldError(ErrorKind::Assumption, "value", "expected a finite money value");
    if (!(p.annualVolatility >= 0.0) || !std::isfinite(p.annualVolatility))
        return fieldError(ErrorKind::Assumption, "volatility", "expected an annual volatility of zero or more (e.g. 0.2 for 20%)");
    if (!std::isfinite(p.annualDrift))
        return fieldError(ErrorKind::Assumption, "drift", "expected a finite annual drift (e.g. 0.05 for 5%)");
    if (horizonDays < 1)
        return fieldError(ErrorKind::Assumption, "horizon", "expected a whole number of trading days of at least 1");
    if (daysPerYear < 1)
        return fieldError(ErrorKind::Assumption, "days-per-year", "expected a whole number of trading days a year of at least 1");
    const double fraction = static_cast<double>(horizonDays) / static_cast<double>(daysPerYear);
    // A short position (V < 0) has the same spread and the opposite drift.
    return HorizonMoments{p.annualDrift * fraction * p.value, p.annualVolatility * std::sqrt(fraction) * std::abs(p.value)};
}

} // namespace tailwise

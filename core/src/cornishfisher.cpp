#include "tailwise/cornishfisher.h"

#include <boost/math/distributions/normal.hpp>
#include <boost/math/quadrature/gauss_kronrod.hpp>

#include <cassert>
#include <cmath>
#include <limits>

namespace tailwise {

double cornishFisherZ(double z, Shape s)
{
    const double z2 = z * z;
    const double z3 = z2 * z;
    const double S = s.skewness, K = s.excessKurtosis;
    return z + (z2 - 1.0) * S / 6.0 + (z3 - 3.0 * z) * K / 24.0 - (2.0 * z3 - 5.0 * z) * S * S / 36.0;
}

bool cornishFisherMonotone(Shape s)
{
    const double S = s.skewness, K = s.excessKurtosis;
    const double a = K / 8.0 - S * S / 6.0;
    const double b = S / 3.0;
    const double c = 1.0 - K / 8.0 + 5.0 * S * S / 36.0;
    if (a == 0.0)
        return b == 0.0 && c > 0.0;
    return a > 0.0 && b * b <= 4.0 * a * c;
}

CornishFisherFactors cornishFisherFactors(double confidence, Shape s)
{
    assert(confidence > 0.0 && confidence < 1.0);
    const double alpha = 1.0 - confidence;
    const boost::math::normal standard;
    const double a = boost::math::quantile(standard, alpha);
    auto integrand = [&](double z) { return cornishFisherZ(z, s) * boost::math::pdf(standard, z); };
    const double tail = boost::math::quadrature::gauss_kronrod<double, 61>::integrate(
        integrand, -std::numeric_limits<double>::infinity(), a, 15, 1e-12);
    CornishFisherFactors f{-cornishFisherZ(a, s), -tail / alpha, cornishFisherMonotone(s)};
    // Outside the monotone domain the tail average can fall below the quantile; ES is then given
    // as VaR (the stated fallback, see the header), never below it.
    if (!f.monotone && f.es < f.var)
        f.es = f.var;
    return f;
}

VarEs cornishFisherVarEs(HorizonMoments m, double confidence, Shape s)
{
    const CornishFisherFactors f = cornishFisherFactors(confidence, s);
    return VarEs{f.var * m.sd - m.mean, f.es * m.sd - m.mean};
}

} // namespace tailwise

#include "tailwise/studentt.h"

#include <boost/math/distributions/students_t.hpp>

#include <cassert>
#include <cmath>

namespace tailwise {

double studentTScale(double dof)
{
    assert(dof > 2.0);
    return std::sqrt((dof - 2.0) / dof);
}

namespace {
double upperQuantile(const boost::math::students_t &t, double confidence)
{
    return boost::math::quantile(boost::math::complement(t, 1.0 - confidence));
}
} // namespace

double studentTVarFactor(double dof, double confidence)
{
    assert(confidence > 0.0 && confidence < 1.0);
    const boost::math::students_t t(dof);
    return studentTScale(dof) * upperQuantile(t, confidence);
}

double studentTEsFactor(double dof, double confidence)
{
    assert(confidence > 0.0 && confidence < 1.0);
    const boost::math::students_t t(dof);
    const double q = upperQuantile(t, confidence);
    return studentTScale(dof) * (dof + q * q) / (dof - 1.0) * boost::math::pdf(t, q) / (1.0 - confidence);
}

VarEs studentTVarEs(HorizonMoments m, double dof, double confidence)
{
    return VarEs{studentTVarFactor(dof, confidence) * m.sd - m.mean, studentTEsFactor(dof, confidence) * m.sd - m.mean};
}

std::optional<double> fitDofByKurtosis(double k)
{
    if (!(k > 0.0) || !std::isfinite(k))
        return std::nullopt;
    const double nu = 4.0 + 6.0 / k;
    // A tiny K gives a huge ν: the t is then the normal to working precision; cap it so that
    // Boost's t stays well inside its domain.
    return std::min(nu, 1e6);
}

} // namespace tailwise

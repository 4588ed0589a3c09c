#include "tailwise/modeldensity.h"

#include "tailwise/cornishfisher.h"
#include "tailwise/studentt.h"

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/students_t.hpp>

#include <cmath>

namespace tailwise {

namespace {

double cornishFisherSlope(double z, Shape s)
{
    const double S = s.skewness, K = s.excessKurtosis;
    return 1.0 + z * S / 3.0 + (3.0 * z * z - 3.0) * K / 24.0 - (6.0 * z * z - 5.0) * S * S / 36.0;
}

// z with z_cf(z) = u, for an increasing z_cf.
double invertCornishFisher(double u, Shape s)
{
    double lo = -40.0, hi = 40.0;
    for (int i = 0; i < 200 && hi - lo > 1e-13; ++i) {
        const double mid = 0.5 * (lo + hi);
        (cornishFisherZ(mid, s) < u ? lo : hi) = mid;
    }
    return 0.5 * (lo + hi);
}

} // namespace

std::optional<std::vector<double>> modelPnlDensity(const RiskReport &report, std::span<const double> points)
{
    const double mu = report.horizon.mean;
    const double sigma = report.horizon.sd;
    if (!(sigma > 0.0))
        return std::nullopt;
    const ModelDetails &m = report.model;
    std::vector<double> out;
    out.reserve(points.size());
    const boost::math::normal standard;
    switch (m.used) {
    case RiskModel::Normal:
        for (double x : points)
            out.push_back(boost::math::pdf(standard, (x - mu) / sigma) / sigma);
        break;
    case RiskModel::StudentT: {
        const double nu = m.horizonDof.value_or(*m.dof);
        const double scale = studentTScale(nu) * sigma;
        const boost::math::students_t t(nu);
        for (double x : points)
            out.push_back(boost::math::pdf(t, (x - mu) / scale) / scale);
        break;
    }
    case RiskModel::CornishFisher: {
        if (!m.cornishFisherMonotone.value_or(false))
            return std::nullopt;
        const Shape shape = m.horizonShape.value_or(*m.shape);
        for (double x : points) {
            const double z = invertCornishFisher((x - mu) / sigma, shape);
            out.push_back(boost::math::pdf(standard, z) / (sigma * cornishFisherSlope(z, shape)));
        }
        break;
    }
    case RiskModel::Historical:
    case RiskModel::MonteCarlo:
        return std::nullopt;
    }
    for (double v : out)
        if (!std::isfinite(v) || v < 0.0)
            return std::nullopt;
    return out;
}

} // namespace tailwise

#include "tailwise/shape.h"

#include <cmath>

namespace tailwise {

std::optional<Shape> momentShape(std::span<const double> x)
{
    const std::size_t n = x.size();
    if (n < 2)
        return std::nullopt;
    double mean = 0.0;
    for (double v : x)
        mean += v;
    mean /= static_cast<double>(n);
    double m2 = 0.0, m3 = 0.0, m4 = 0.0;
    for (double v : x) {
        const double d = v - mean;
        const double d2 = d * d;
        m2 += d2;
        m3 += d2 * d;
        m4 += d2 * d2;
    }
    m2 /= static_cast<double>(n);
    m3 /= static_cast<double>(n);
    m4 /= static_cast<double>(n);
    // A sample whose spread is lost in rounding has no measurable shape either.
    if (!(m2 > 0.0) || !std::isfinite(m4) || m2 <= 1e-28 * mean * mean)
        return std::nullopt;
    return Shape{m3 / std::pow(m2, 1.5), m4 / (m2 * m2) - 3.0};
}

Eigen::VectorXd dailyPnl(const Eigen::MatrixXd &returns, const Eigen::VectorXd &exposures)
{
    return returns * exposures;
}

} // namespace tailwise

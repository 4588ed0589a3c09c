#include "tailwise/contributions.h"

#include "tailwise/parametric.h"

#include <cmath>

namespace tailwise {

Contributions normalContributions(const Eigen::VectorXd &e, const Eigen::MatrixXd &cov, const Eigen::VectorXd &mean,
                                  int horizonDays, double confidence)
{
    const double z = normalQuantile(confidence);
    const double esFactor = normalTailMeanFactor(confidence);
    const double rootH = std::sqrt(static_cast<double>(horizonDays));
    const double h = static_cast<double>(horizonDays);
    const Eigen::VectorXd sigmaE = cov * e;
    const double sigmaP = std::sqrt(std::max(0.0, e.dot(sigmaE)));
    const Eigen::VectorXd direction = sigmaP > 0.0 ? Eigen::VectorXd(sigmaE / sigmaP) : Eigen::VectorXd::Zero(e.size());

    Contributions c;
    c.marginalVar = z * rootH * direction - h * mean;
    const Eigen::VectorXd marginalEs = esFactor * rootH * direction - h * mean;
    c.componentVar = e.cwiseProduct(c.marginalVar);
    c.componentEs = e.cwiseProduct(marginalEs);
    const Eigen::VectorXd sd = cov.diagonal().cwiseMax(0.0).cwiseSqrt();
    const Eigen::VectorXd spread = rootH * sd.cwiseProduct(e.cwiseAbs());
    const Eigen::VectorXd drift = h * mean.cwiseProduct(e);
    c.standaloneVar = z * spread - drift;
    c.standaloneEs = esFactor * spread - drift;
    const double var = z * rootH * sigmaP - h * mean.dot(e);
    c.undiversifiedVar = c.standaloneVar.sum();
    c.diversificationBenefit = c.undiversifiedVar - var;
    return c;
}

} // namespace tailwise

// Euler allocation of normal VaR and ES to holdings.
//
// With exposures e, daily covariance Σ, daily means μ, horizon H and z = Φ⁻¹(C):
//   σ_p         = √(eᵀΣe)                           daily P&L standard deviation, money
//   marginal_i  = z √H (Σe)_i / σ_p − H μ_i          ∂VaR/∂e_i, per unit of money exposure
//   component_i = e_i · marginal_i                   Σ_i component_i = VaR (Euler's theorem:
//                                                    VaR is homogeneous of degree one in e)
//   share_i     = component_i / VaR
//   standalone_i = z √H σ_i |e_i| − H μ_i e_i        VaR of the holding on its own
//   undiversified VaR = Σ standalone_i;  diversification benefit = undiversified − VaR
// The ES analogues use φ(z)/(1−C) in place of z.
// (Jorion, Value at Risk, "VaR tools"; McNeil, Frey & Embrechts (2005) §6.3 Euler allocation.)
// When σ_p = 0 the volatility term of the marginal is zero (the limit along any direction where
// the portfolio stays riskless is not defined; a warning says so).
#pragma once

#include <Eigen/Core>

#include <optional>

namespace tailwise {

struct Contributions {
    Eigen::VectorXd marginalVar;   // per unit of money exposure
    Eigen::VectorXd componentVar;  // money; sums to VaR
    Eigen::VectorXd componentEs;   // money; sums to ES
    Eigen::VectorXd standaloneVar; // money
    Eigen::VectorXd standaloneEs;  // money
    double undiversifiedVar = 0.0;
    double diversificationBenefit = 0.0;
};

Contributions normalContributions(const Eigen::VectorXd &exposures, const Eigen::MatrixXd &covariance,
                                  const Eigen::VectorXd &mean, int horizonDays, double confidence);

} // namespace tailwise

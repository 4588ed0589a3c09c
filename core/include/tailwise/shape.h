// Moment estimates of the shape of a sample: skewness and excess kurtosis.
//
// With n observations x_t, mean x̄ and central moments m_k = (1/n) Σ_t (x_t − x̄)^k (divide by n,
// not n − 1: the plain moment estimators):
//   skewness          S = m_3 / m_2^{3/2}
//   excess kurtosis   K = m_4 / m_2² − 3
// (the moment coefficients g₁ and g₂ of e.g. Joanes & Gill (1998), "Comparing measures of sample
// skewness and kurtosis", The Statistician 47(1), 183–189 (mem); equal to scipy.stats.skew and
// scipy.stats.kurtosis with their default bias=True).
// Used on the window's daily portfolio P&L p_t = Σ_i e_i r_{i,t} by the Cornish–Fisher model and
// by the moment fit of the Student-t degrees of freedom.
// Undefined (nullopt) when n < 2 or m_2 = 0 (a constant sample has no shape).
#pragma once

#include <Eigen/Core>

#include <optional>
#include <span>

namespace tailwise {

struct Shape {
    double skewness = 0.0;       // S
    double excessKurtosis = 0.0; // K (0 for a normal)
};

std::optional<Shape> momentShape(std::span<const double> sample);

// Daily portfolio P&L of each window day with today's exposures: p = R e (money).
Eigen::VectorXd dailyPnl(const Eigen::MatrixXd &returns, const Eigen::VectorXd &exposures);

} // namespace tailwise

// Daily mean and covariance of returns over a window.
//
// Sample mean:        μ = (1/n) Σ_t r_t
// Sample covariance:  Σ = (1/(n−1)) Σ_t (r_t − μ̂)(r_t − μ̂)ᵀ  (unbiased; always demeaned)
// EWMA covariance:    Σ = Σ_{k=0}^{n−1} (1−λ) λ^k r_{T−k} r_{T−k}ᵀ / (1−λ^n)
//                     zero-mean, normalised so the weights sum to one over the finite window;
//                     r_T the newest return (J.P. Morgan/Reuters, RiskMetrics Technical Document,
//                     4th ed. 1996, the exponentially weighted estimator; normalisation for a
//                     finite window as stated).
// Mean used for risk: zero (MeanModel::Zero) or the sample mean (MeanModel::Sample), whichever
// estimator gives the covariance.
//
// Positive definiteness is checked with a Cholesky factorisation. When it fails, the matrix is
// repaired by eigenvalue clipping — eigenvalues below a floor (1e-12 × the largest, or zero for an
// all-zero matrix) are raised to it and the matrix rebuilt — and a warning says so.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/result.h"

#include <Eigen/Core>

namespace tailwise {

struct Moments {
    Eigen::VectorXd mean;       // daily mean used for risk (zero when MeanModel::Zero)
    Eigen::MatrixXd covariance; // daily covariance, symmetric positive semi-definite
    bool repaired = false;      // eigenvalue clipping was applied
    Warnings warnings;
};

Eigen::VectorXd sampleMean(const Eigen::MatrixXd &returns);
Eigen::MatrixXd sampleCovariance(const Eigen::MatrixXd &returns);
// Precondition: 0 < lambda < 1 and returns.rows() ≥ 1; the last row is the newest.
Eigen::MatrixXd ewmaCovariance(const Eigen::MatrixXd &returns, double lambda);

// Precondition: returns.rows() ≥ 2.
Moments estimateMoments(const Eigen::MatrixXd &returns, CovarianceEstimator estimator,
                        double lambda, MeanModel mean);

// True when `matrix` has a Cholesky factor (positive definite to working precision).
bool isPositiveDefinite(const Eigen::MatrixXd &matrix);
// Eigenvalue clipping as described above; returns the repaired matrix.
Eigen::MatrixXd clipEigenvalues(const Eigen::MatrixXd &matrix, double relativeFloor = 1e-12);

} // namespace tailwise

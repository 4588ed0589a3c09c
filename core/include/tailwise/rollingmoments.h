// Daily mean and covariance over a window of W returns that slides forward one day at a time,
// updated incrementally (add the newest return, drop the oldest) instead of refitted each day.
// The estimates are those of estimate.h over the current window:
//
// Sample mean and covariance, by a centred (Welford-style) update. With μ, M = Σ (r−μ)(r−μ)ᵀ over
// the W returns, dropping the oldest y and then adding the newest x:
//   drop:  M ← M − W/(W−1) (y−μ)(y−μ)ᵀ,  μ ← μ + (μ−y)/(W−1)        (W−1 returns left)
//   add:   δ = x − μ,  M ← M + (W−1)/W δδᵀ,  μ ← μ + δ/W            (W returns again)
//   Σ = M/(W−1)
// (B. P. Welford 1962, "Note on a method for calculating corrected sums of squares and products",
// Technometrics 4(3), 419–420 (mem), run in both directions; the removal step is its exact inverse.)
// Working about the running mean keeps the cancellation small; rounding still accumulates slowly
// in the removal step, in proportion to the largest state seen since the last exact computation.
// So the state is recomputed exactly from the window every `resyncEvery` steps (by default every
// max(W, 250) steps, at most doubling the cost of the updates), and at once when its trace has
// fallen below 1/1000 of that largest value (a wild spell has left the window), where the
// accumulated rounding would otherwise be large relative to the small estimate.
//
// Finite-window EWMA (estimate.h): with the unnormalised sum S_t = Σ_{k=0}^{W−1} λ^k r_{t−k} r_{t−k}ᵀ,
//   S_{t+1} = λ S_t + r_{t+1} r_{t+1}ᵀ − λ^W r_{t+1−W} r_{t+1−W}ᵀ,   Σ = (1−λ)/(1−λ^W) · S,
// which is exact algebra; old rounding errors are damped by λ each day, and the same periodic
// exact recomputation applies.
//
// The mean used for risk is zero (MeanModel::Zero) or the window's sample mean, which is kept by
// the same update whatever the covariance estimator.
//
// Only the lower triangle of the state is updated (symmetric rank-one updates, O(n²) a day); a
// one-day VaR needs only eᵀΣe, which portfolioVariance() forms from it without building Σ.
// Unlike estimateMoments(), no eigenvalue repair is made: eᵀΣe of a positive semi-definite
// estimate is ≥ 0 for every e, and a value that rounds below zero is returned as zero.
//
// Preconditions (asserted): 2 ≤ W ≤ returns.rows(), 0 < λ < 1 for the EWMA. The returns matrix
// (rows = days oldest first, columns = assets) is not copied and must outlive this object.
#pragma once

#include "tailwise/assumptions.h"

#include <Eigen/Core>

namespace tailwise {

class RollingMoments {
public:
    // Starts with the window over rows [0, W).
    RollingMoments(const Eigen::MatrixXd &returns, int window, CovarianceEstimator estimator, double lambda,
                   MeanModel mean, int resyncEvery = 0);

    int window() const { return m_window; }
    // The window covers rows [start(), start() + window()).
    int start() const { return m_start; }
    bool canAdvance() const { return m_start + m_window < m_returns->rows(); }
    // Slides the window one day forward. Precondition: canAdvance().
    void advance();

    // The returns in the current window, oldest first (a view into the matrix given).
    Eigen::Block<const Eigen::MatrixXd> windowReturns() const;
    // Daily mean for risk: zero vector when MeanModel::Zero.
    const Eigen::VectorXd &mean() const { return m_useMean ? m_mean : m_zero; }
    // The window's sample mean, whatever MeanModel says.
    const Eigen::VectorXd &sampleMean() const { return m_mean; }
    // eᵀΣe, ≥ 0.
    double portfolioVariance(const Eigen::VectorXd &exposures) const;
    // The full symmetric covariance (O(n²) copy; for models that need the matrix, and tests).
    Eigen::MatrixXd covariance() const;

private:
    void recompute();

    const Eigen::MatrixXd *m_returns;
    int m_window;
    CovarianceEstimator m_estimator;
    double m_lambda;
    double m_lambdaPowWindow; // λ^W
    double m_scale;           // Σ = m_scale · state: 1/(W−1), or (1−λ)/(1−λ^W)
    bool m_useMean;
    int m_resyncEvery;
    int m_start = 0;
    int m_sinceResync = 0;
    double m_peakSize = 0.0; // largest trace of the state since the last exact computation
    Eigen::VectorXd m_mean;
    Eigen::VectorXd m_zero;
    Eigen::MatrixXd m_state; // M (sample) or S (EWMA); lower triangle valid
    Eigen::VectorXd m_work;  // scratch for the update vectors
};

} // namespace tailwise

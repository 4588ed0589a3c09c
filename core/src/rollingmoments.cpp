#include "tailwise/rollingmoments.h"

#include <algorithm>
#include <cassert>
#include <cmath>

namespace tailwise {

namespace {
// Recompute when the state's trace falls below this share of its peak since the last exact fit.
constexpr double shrinkLimit = 1e-3;
} // namespace

RollingMoments::RollingMoments(const Eigen::MatrixXd &returns, int window, CovarianceEstimator estimator,
                               double lambda, MeanModel mean, int resyncEvery)
    : m_returns(&returns), m_window(window), m_estimator(estimator), m_lambda(lambda),
      m_useMean(mean == MeanModel::Sample), m_resyncEvery(resyncEvery > 0 ? resyncEvery : std::max(window, 250))
{
    assert(window >= 2 && window <= returns.rows());
    const double w = static_cast<double>(window);
    if (estimator == CovarianceEstimator::Ewma) {
        assert(lambda > 0.0 && lambda < 1.0);
        m_lambdaPowWindow = std::pow(lambda, w);
        m_scale = (1.0 - lambda) / -std::expm1(w * std::log(lambda)); // (1−λ)/(1−λ^W)
    } else {
        m_lambdaPowWindow = 0.0;
        m_scale = 1.0 / (w - 1.0);
    }
    m_zero = Eigen::VectorXd::Zero(returns.cols());
    m_work.resize(returns.cols());
    recompute();
}

Eigen::Block<const Eigen::MatrixXd> RollingMoments::windowReturns() const
{
    return m_returns->middleRows(m_start, m_window);
}

void RollingMoments::recompute()
{
    const Eigen::Block<const Eigen::MatrixXd> rows = windowReturns();
    const Eigen::Index n = rows.cols();
    m_mean = rows.colwise().mean().transpose();
    m_state = Eigen::MatrixXd::Zero(n, n);
    if (m_estimator == CovarianceEstimator::Ewma) {
        // Row t (0 = oldest) is k = W−1−t days old and enters S with weight λ^k.
        Eigen::MatrixXd weighted(rows.rows(), n);
        for (Eigen::Index t = 0; t < rows.rows(); ++t)
            weighted.row(t) = std::pow(m_lambda, 0.5 * static_cast<double>(m_window - 1 - t)) * rows.row(t);
        m_state.selfadjointView<Eigen::Lower>().rankUpdate(weighted.transpose(), 1.0);
    } else {
        const Eigen::MatrixXd centred = rows.rowwise() - m_mean.transpose();
        m_state.selfadjointView<Eigen::Lower>().rankUpdate(centred.transpose(), 1.0);
    }
    m_sinceResync = 0;
    m_peakSize = m_state.diagonal().sum();
}

void RollingMoments::advance()
{
    assert(canAdvance());
    const Eigen::Index dropped = m_start;
    const Eigen::Index added = m_start + m_window;
    ++m_start;
    if (++m_sinceResync >= m_resyncEvery) {
        recompute();
        return;
    }
    const double w = static_cast<double>(m_window);
    if (m_estimator == CovarianceEstimator::Ewma) {
        m_state.triangularView<Eigen::Lower>() *= m_lambda;
        m_work = m_returns->row(added).transpose();
        m_state.selfadjointView<Eigen::Lower>().rankUpdate(m_work, 1.0);
        m_work = m_returns->row(dropped).transpose();
        m_state.selfadjointView<Eigen::Lower>().rankUpdate(m_work, -m_lambdaPowWindow);
    }
    // The sample mean (and, for the sample estimator, M) by the centred drop-then-add update.
    m_work = m_returns->row(dropped).transpose() - m_mean;
    if (m_estimator == CovarianceEstimator::Sample)
        m_state.selfadjointView<Eigen::Lower>().rankUpdate(m_work, -w / (w - 1.0));
    m_mean -= m_work / (w - 1.0);
    m_work = m_returns->row(added).transpose() - m_mean;
    if (m_estimator == CovarianceEstimator::Sample)
        m_state.selfadjointView<Eigen::Lower>().rankUpdate(m_work, (w - 1.0) / w);
    m_mean += m_work / w;

    // Rounding in the updates is relative to the largest state seen since the last exact
    // computation; when the state has since shrunk by orders of magnitude (a wild spell has left
    // the window), that error would dominate, so recompute.
    const double size = m_state.diagonal().sum();
    m_peakSize = std::max(m_peakSize, size);
    if (size < shrinkLimit * m_peakSize)
        recompute();
}

double RollingMoments::portfolioVariance(const Eigen::VectorXd &exposures) const
{
    const double quadratic = exposures.dot(m_state.selfadjointView<Eigen::Lower>() * exposures);
    return std::max(0.0, m_scale * quadratic);
}

Eigen::MatrixXd RollingMoments::covariance() const
{
    Eigen::MatrixXd full = m_state.selfadjointView<Eigen::Lower>();
    return m_scale * full;
}

} // namespace tailwise

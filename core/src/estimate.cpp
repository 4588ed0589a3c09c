#include "tailwise/estimate.h"

#include <Eigen/Cholesky>
#include <Eigen/Eigenvalues>

#include <cmath>
#include <cstdio>

namespace tailwise {

Eigen::VectorXd sampleMean(const Eigen::MatrixXd &returns)
{
    return returns.colwise().mean().transpose();
}

Eigen::MatrixXd sampleCovariance(const Eigen::MatrixXd &returns)
{
    const Eigen::Index n = returns.rows();
    assert(n >= 2);
    const Eigen::MatrixXd centred = returns.rowwise() - returns.colwise().mean();
    // One symmetric rank-k update: only the lower triangle is computed, then mirrored.
    Eigen::MatrixXd cov = Eigen::MatrixXd::Zero(returns.cols(), returns.cols());
    cov.selfadjointView<Eigen::Lower>().rankUpdate(centred.transpose(), 1.0 / static_cast<double>(n - 1));
    cov.triangularView<Eigen::StrictlyUpper>() = cov.transpose();
    return cov;
}

Eigen::MatrixXd ewmaCovariance(const Eigen::MatrixXd &returns, double lambda)
{
    const Eigen::Index n = returns.rows();
    assert(n >= 1 && lambda > 0.0 && lambda < 1.0);
    // Row t (0 = oldest) is k = n−1−t days old and has weight (1−λ)λ^k / (1−λ^n).
    const double norm = -std::expm1(static_cast<double>(n) * std::log(lambda)); // 1 − λ^n
    Eigen::VectorXd sqrtWeight(n);
    for (Eigen::Index t = 0; t < n; ++t) {
        const double k = static_cast<double>(n - 1 - t);
        sqrtWeight(t) = std::sqrt((1.0 - lambda) * std::pow(lambda, k) / norm);
    }
    const Eigen::MatrixXd weighted = sqrtWeight.asDiagonal() * returns;
    Eigen::MatrixXd cov = Eigen::MatrixXd::Zero(returns.cols(), returns.cols());
    cov.selfadjointView<Eigen::Lower>().rankUpdate(weighted.transpose(), 1.0);
    cov.triangularView<Eigen::StrictlyUpper>() = cov.transpose();
    return cov;
}

bool isPositiveDefinite(const Eigen::MatrixXd &matrix)
{
    Eigen::LLT<Eigen::MatrixXd> llt(matrix);
    return llt.info() == Eigen::Success;
}

Eigen::MatrixXd clipEigenvalues(const Eigen::MatrixXd &matrix, double relativeFloor)
{
    Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> solver(matrix);
    Eigen::VectorXd values = solver.eigenvalues();
    const double largest = values.size() > 0 ? std::max(0.0, values.maxCoeff()) : 0.0;
    const double floor = largest * relativeFloor;
    values = values.cwiseMax(floor);
    Eigen::MatrixXd repaired = solver.eigenvectors() * values.asDiagonal() * solver.eigenvectors().transpose();
    return 0.5 * (repaired + repaired.transpose());
}

Moments estimateMoments(const Eigen::MatrixXd &returns, CovarianceEstimator estimator, double lambda, MeanModel mean)
{
    Moments m;
    m.covariance = estimator == CovarianceEstimator::Ewma ? ewmaCovariance(returns, lambda) : sampleCovariance(returns);
    m.mean = mean == MeanModel::Sample ? sampleMean(returns) : Eigen::VectorXd::Zero(returns.cols());
    if (m.covariance.size() > 0 && !isPositiveDefinite(m.covariance)) {
        if (m.covariance.cwiseAbs().maxCoeff() == 0.0) {
            m.warnings.push_back("every return in the window is zero: the covariance is zero and VaR reflects the mean only");
        } else {
            Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> solver(m.covariance, Eigen::EigenvaluesOnly);
            const double lowest = solver.eigenvalues().minCoeff();
            m.covariance = clipEigenvalues(m.covariance);
            m.repaired = true;
            char buffer[200];
            std::snprintf(buffer, sizeof buffer,
                          "the covariance was not positive definite (lowest eigenvalue %.3g): eigenvalues were "
                          "raised to a small floor to repair it",
                          lowest);
            m.warnings.push_back(buffer);
        }
    }
    return m;
}

} // namespace tailwise

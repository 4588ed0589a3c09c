#include "tailwise/estimate.h"

#include <Eigen/Cholesky>
#include <Eigen/Eigenvalues>

#include <algorithm>
#include <atomic>
#include <cassert>
#include <cmath>
#include <cstdio>
#include <thread>
#include <vector>

namespace tailwise {

Eigen::VectorXd sampleMean(const Eigen::MatrixXd &returns)
{
    return returns.colwise().mean().transpose();
}

namespace {

// scale · AᵀA for the n × k matrix A, symmetric: only the lower triangle is computed (a symmetric
// rank-k update), then mirrored. A large product is cut into column panels of about equal work,
// each its diagonal block (a rank update) and the block below it (one matrix product), shared
// among the hardware threads. The panels depend on k alone, not on the thread count, so the
// figures are the same however many threads there are.
Eigen::MatrixXd scaledCrossProduct(const Eigen::MatrixXd &a, double scale)
{
    const Eigen::Index k = a.cols();
    Eigen::MatrixXd out = Eigen::MatrixXd::Zero(k, k);
    // Below about 2·10⁷ multiply-adds a thread costs more than it saves (common practice: a
    // thread start is tens of microseconds).
    const double work = static_cast<double>(a.rows()) * static_cast<double>(k) * static_cast<double>(k) / 2.0;
    const int threads = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
    if (work < 2e7 || k < 64) {
        out.selfadjointView<Eigen::Lower>().rankUpdate(a.transpose(), scale);
    } else {
        // Panel p covers columns [edge[p], edge[p+1]); the lower triangle to the right of column c
        // holds (k − c)²/2 entries, so equal work means edges at k(1 − √(1 − p/P)).
        constexpr int panels = 8;
        std::vector<Eigen::Index> edge(panels + 1);
        for (int p = 0; p <= panels; ++p)
            edge[static_cast<std::size_t>(p)] = static_cast<Eigen::Index>(
                std::llround(static_cast<double>(k) * (1.0 - std::sqrt(1.0 - static_cast<double>(p) / panels))));
        std::atomic<int> next{0};
        auto worker = [&] {
            for (int p; (p = next.fetch_add(1)) < panels;) {
                const Eigen::Index c0 = edge[static_cast<std::size_t>(p)];
                const Eigen::Index width = edge[static_cast<std::size_t>(p) + 1] - c0;
                if (width == 0)
                    continue;
                const auto panel = a.middleCols(c0, width);
                out.block(c0, c0, width, width).selfadjointView<Eigen::Lower>().rankUpdate(panel.transpose(), scale);
                const Eigen::Index below = k - c0 - width;
                if (below > 0)
                    out.block(c0 + width, c0, below, width).noalias() = scale * (a.rightCols(below).transpose() * panel);
            }
        };
        std::vector<std::jthread> pool;
        for (int t = 1; t < std::min(threads, panels); ++t)
            pool.emplace_back(worker);
        worker();
    } // the pool joins before the mirror below
    out.triangularView<Eigen::StrictlyUpper>() = out.transpose();
    return out;
}

} // namespace

Eigen::MatrixXd sampleCovariance(const Eigen::MatrixXd &returns)
{
    const Eigen::Index n = returns.rows();
    assert(n >= 2);
    const Eigen::MatrixXd centred = returns.rowwise() - returns.colwise().mean();
    return scaledCrossProduct(centred, 1.0 / static_cast<double>(n - 1));
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
    return scaledCrossProduct(weighted, 1.0);
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

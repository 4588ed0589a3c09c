// Benchmark of the backtest (backtest.h): 5,000 tested days × 100 assets, normal model with sample
// and EWMA covariance (the figure issue 5 asks for), then the other backtested models once each. Prints figures; it is not a pass/fail test (timings depend on the machine).
// Prices are invented: a seeded one-factor random walk (no real data, nothing to check here).
#include "tailwise/backtest.h"
#include "tailwise/estimate.h"
#include "tailwise/returns.h"

#include <chrono>
#include <cstdio>
#include <random>
#include <string>

using namespace tailwise;

namespace {

BacktestRequest makeRequest(int testedDays, int assets, int window)
{
    BacktestRequest request;
    PriceHistory &p = request.prices;
    const int days = testedDays + window + 1;
    p.prices.resize(days, assets);
    std::mt19937_64 rng(42);
    std::normal_distribution<double> normal;
    for (int i = 0; i < assets; ++i) {
        std::string name = "A";
        name += std::to_string(i);
        p.assets.push_back(name);
        p.prices(0, i) = 100.0;
    }
    for (int t = 0; t < days; ++t)
        p.dates.push_back(Date{10000 + t});
    for (int t = 1; t < days; ++t) {
        const double market = normal(rng);
        for (int i = 0; i < assets; ++i)
            p.prices(t, i) = p.prices(t - 1, i) * std::exp(0.01 * (0.6 * market + 0.8 * normal(rng)));
    }
    for (int i = 0; i < assets; ++i)
        request.holdings.push_back(Holding{p.assets[static_cast<std::size_t>(i)], 10.0 + i, {}, {}});
    request.assumptions.window = window;
    return request;
}

void run(const char *label, BacktestRequest request, CovarianceEstimator estimator, int repeats,
         RiskModel model = RiskModel::Normal)
{
    request.assumptions.estimator = estimator;
    request.assumptions.model = model;
    double best = 1e300;
    int exceptions = 0, observations = 0;
    for (int k = 0; k < repeats; ++k) {
        const auto start = std::chrono::steady_clock::now();
        const auto result = runBacktest(request);
        const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
        if (!result) {
            std::printf("%s: failed: %s\n", label, result.error().message.c_str());
            return;
        }
        best = std::min(best, seconds);
        exceptions = result.value().exceptions;
        observations = result.value().observations;
    }
    std::printf("%-34s %6d days  %4d exceptions  best of %d: %8.3f s  (%.2f us/day)\n", label, observations,
                exceptions, repeats, best, 1e6 * best / observations);
}

// For comparison only: the cost of refitting the sample covariance from scratch every day,
// which the incremental update avoids.
void refitForComparison(const BacktestRequest &request, int window)
{
    const Eigen::MatrixXd returns = computeReturns(request.prices.prices, ReturnType::Simple);
    const auto start = std::chrono::steady_clock::now();
    double checksum = 0.0;
    const int days = static_cast<int>(returns.rows()) - window;
    for (int t = 0; t < days; ++t)
        checksum += sampleCovariance(returns.middleRows(t, window))(0, 0);
    const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    std::printf("%-34s %6d days  (checksum %.3g)    once:      %8.3f s  (%.2f us/day)\n",
                "refit every day (comparison only)", days, checksum, seconds, 1e6 * seconds / days);
}

} // namespace

int main()
{
    const int tested = 5000, assets = 100, window = 250;
    std::printf("backtest benchmark: %d tested days x %d assets, window %d, normal model, 99%%\n", tested, assets, window);
    const BacktestRequest request = makeRequest(tested, assets, window);
    run("sample covariance (incremental)", request, CovarianceEstimator::Sample, 3);
    run("EWMA covariance, lambda 0.94", request, CovarianceEstimator::Ewma, 3);
    run("student-t, dof fitted each day", request, CovarianceEstimator::Sample, 1, RiskModel::StudentT);
    run("cornish-fisher", request, CovarianceEstimator::Sample, 1, RiskModel::CornishFisher);
    run("historical", request, CovarianceEstimator::Sample, 1, RiskModel::Historical);
    refitForComparison(request, window);
    return 0;
}

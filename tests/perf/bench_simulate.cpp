// Benchmark of Monte Carlo VaR (simulate.h): draws per second for 10, 100 and 500 assets with 1, 2
// and all hardware threads, normal and Student-t draws. Prints figures; not a pass/fail test.
// The covariance is invented (one-factor, 60% market correlation); nothing here is checked.
#include "tailwise/simulate.h"

#include <chrono>
#include <cstdio>
#include <thread>

using namespace tailwise;

int main()
{
    std::printf("assets  threads  t-draws  simulations  seconds  draws/s      VaR          SE\n");
    for (int n : {10, 100, 500}) {
        const Eigen::VectorXd vol = Eigen::VectorXd::Constant(n, 0.015);
        Eigen::MatrixXd corr = Eigen::MatrixXd::Constant(n, n, 0.6);
        corr.diagonal().setOnes();
        const Eigen::MatrixXd cov = vol.asDiagonal() * corr * vol.asDiagonal();
        const Eigen::VectorXd e = Eigen::VectorXd::Constant(n, 1e6 / n);
        const Eigen::VectorXd mean = Eigen::VectorXd::Zero(n);
        const int hw = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
        for (int threads : {1, 2, hw}) {
            for (bool t : {false, true}) {
                const SimulationSettings s{200000, 1, t ? std::optional<double>(5.0) : std::nullopt};
                RunControl control;
                control.threads = threads;
                const auto start = std::chrono::steady_clock::now();
                auto r = simulateVarEs(e, cov, mean, 1, 0.99, s, control);
                const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
                if (!r)
                    return 1;
                std::printf("%6d  %7d  %7s  %11d  %7.3f  %10.0f  %10.2f  %8.2f\n", n, threads, t ? "yes" : "no",
                            s.simulations, seconds, s.simulations / seconds, r.value().figures.var,
                            r.value().varStandardError);
            }
        }
    }
    return 0;
}

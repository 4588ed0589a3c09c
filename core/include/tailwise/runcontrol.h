// How a caller steers a long computation: a stop token to cancel it, a progress callback, the
// number of worker threads, and where to note the wall time of its stages. Plain C++ (no Qt) so
// the window can drive it from a worker thread.
#pragma once

#include <functional>
#include <stop_token>

namespace tailwise {

// Wall time of the stages of computeRisk (risk.h), in milliseconds: estimating the window's returns,
// mean and covariance (near zero when the estimate cache answers); the risk figures and
// contributions; the Monte Carlo simulation (zero for the other models; not part of riskMs).
struct StageTimings {
    double estimateMs = 0.0;
    double riskMs = 0.0;
    double simulateMs = 0.0;
};

struct RunControl {
    std::stop_token stop;                  // a stop request ends the run with ErrorKind::Cancelled
    std::function<void(double)> progress;  // fraction done in [0, 1], non-decreasing, always on the
                                           // thread that called the computation; may be empty
    int threads = 0;                       // worker threads; 0 = std::thread::hardware_concurrency()
    StageTimings *timings = nullptr;       // when set, filled with the stages' wall times
};

} // namespace tailwise

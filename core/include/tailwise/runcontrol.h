// How a caller steers a long computation: a stop token to cancel it, a progress callback, and the
// number of worker threads. Plain C++ (no Qt) so the window can drive it from a worker thread.
#pragma once

#include <functional>
#include <stop_token>

namespace tailwise {

struct RunControl {
    std::stop_token stop;                  // a stop request ends the run with ErrorKind::Cancelled
    std::function<void(double)> progress;  // fraction done in [0, 1], non-decreasing, always on the
                                           // thread that called the computation; may be empty
    int threads = 0;                       // worker threads; 0 = std::thread::hardware_concurrency()
};

} // namespace tailwise

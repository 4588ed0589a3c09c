// Daily returns from prices, and the estimation window.
//
//   simple: r_t = P_t / P_{t−1} − 1        log: r_t = ln(P_t / P_{t−1})
// for t = 1 … T−1 (row t−1 of the result belongs to date t). The window is the N most recent
// returns; N must satisfy 2 ≤ N ≤ available returns.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"

#include <Eigen/Core>

namespace tailwise {

// rows = T−1 returns, columns = assets.
Eigen::MatrixXd computeReturns(const Eigen::MatrixXd &prices, ReturnType type);

struct ReturnWindow {
    Eigen::MatrixXd returns; // rows = N most recent returns, oldest first
    Date firstDate;          // date of the oldest return in the window
    Date lastDate;           // date of the newest return
    Warnings warnings;
};

// Errors: Assumption (field "window") when N < 2 or N > available; InsufficientData when the
// history has fewer than 3 prices. Warns when N ≤ number of assets (the covariance is singular).
Result<ReturnWindow> selectWindow(const PriceHistory &history, ReturnType type,
                                  std::optional<int> window);

} // namespace tailwise

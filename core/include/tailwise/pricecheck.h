// Prices every return can be formed from. A price must be a normal number (not below
// DBL_MIN = 2.2250738585072014e-308: a subnormal price has lost its precision and gives returns
// of 0 or infinity), and its ratio to the previous day's price must be a finite normal number too
// (IEEE 754 overflow or underflow of P_t/P_{t−1} leaves no return). The price reader
// (prices.h) refuses a file that breaks this, naming the line and column.
#pragma once

#include <Eigen/Core>

#include <cstddef>
#include <optional>
#include <string>

namespace tailwise {

// The first price in row order (row, asset: indices into `prices`, rows = dates) that cannot give
// a usable return, or nullopt. `why` says which rule it breaks, for a message.
struct UnusablePrice {
    std::size_t row = 0;
    std::size_t asset = 0;
    std::string why;
};
std::optional<UnusablePrice> findUnusablePrice(const Eigen::MatrixXd &prices);

} // namespace tailwise

#include "tailwise/returns.h"

namespace tailwise {

Eigen::MatrixXd computeReturns(const Eigen::MatrixXd &prices, ReturnType type)
{
    const Eigen::Index t = prices.rows();
    if (t < 2)
        return Eigen::MatrixXd(0, prices.cols());
    const auto now = prices.bottomRows(t - 1).array();
    const auto before = prices.topRows(t - 1).array();
    if (type == ReturnType::Log)
        return (now / before).log().matrix();
    return (now / before - 1.0).matrix();
}

Result<ReturnWindow> selectWindow(const PriceHistory &history, ReturnType type, std::optional<int> window)
{
    const int available = history.dayCount() - 1;
    if (available < 2)
        return fieldError(ErrorKind::InsufficientData, "window",
                          "the price history has " + std::to_string(history.dayCount())
                              + " days: at least 3 are needed for 2 returns");
    const int n = window.value_or(available);
    if (n < 2)
        return fieldError(ErrorKind::Assumption, "window",
                          "expected at least 2 returns in the window, found " + std::to_string(n));
    if (n > available)
        return fieldError(ErrorKind::Assumption, "window",
                          "the window asks for " + std::to_string(n) + " returns but the price history has only "
                              + std::to_string(available) + " (one fewer than its " + std::to_string(history.dayCount()) + " days)");
    ReturnWindow out;
    const Eigen::Index first = history.prices.rows() - (n + 1);
    out.returns = computeReturns(history.prices.middleRows(first, n + 1), type);
    out.firstDate = history.dates[static_cast<std::size_t>(first + 1)];
    out.lastDate = history.dates.back();
    if (n <= history.assetCount())
        out.warnings.push_back("the window has " + std::to_string(n) + " returns for " + std::to_string(history.assetCount())
                               + " assets: the covariance is singular and the figures rest on too little data");
    return out;
}

} // namespace tailwise

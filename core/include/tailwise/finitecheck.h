// Guards that keep NaN and infinity from leaving the core: no non-finite number may reach a
// screen, a file or the JSON (DEVELOPERS.md, "Conventions").
//
// The readers refuse non-finite and non-positive prices and non-finite quantities, but finite
// inputs can still overflow in double precision (largest finite value about 1.8e308, IEEE 754):
// a price moving from 1e-300 to 1e300 has a simple return of 1e600; 1e300 units at a price of
// 1e300 are an exposure of 1e600; an exposure of 1e200 has a P&L variance of order 1e400.
// Such a portfolio is refused with ErrorKind::Numerical and a message naming the holding, the
// asset or the figure, instead of being reported with an infinite or undefined figure.
#pragma once

#include "tailwise/holdings.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"

#include <Eigen/Core>

#include <string>

namespace tailwise {

// Before estimation: the window's returns of the held assets (one column per holding, in
// holdings order) and the exposures must be finite. `pricesSource` names the price file in the
// message (may be empty).
Status requireFiniteInputs(const Eigen::MatrixXd &heldReturns, const Eigen::VectorXd &exposures,
                           const Holdings &holdings, const std::string &pricesSource);

// After the calculation: every number of the report (figures, fractions, per-holding figures,
// moments, model details) must be finite.
Status requireFiniteReport(const RiskReport &report);

} // namespace tailwise

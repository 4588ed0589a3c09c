// The horizon P&L density each parametric model implies, for drawing over the historical
// histogram. P&L x in money, gains positive; μ_h, σ_h from risk.h.
//
//   normal          f(x) = φ(u)/σ_h,                      u = (x − μ_h)/σ_h
//   student-t       f(x) = f_ν(u/s)/(s σ_h),              s = √((ν−2)/ν)   (studentt.h)
//   cornish-fisher  x = μ_h + σ_h z_cf(z) with z ~ N(0,1) (cornishfisher.h), so by the change of
//                   variable f(x) = φ(z)/(σ_h z_cf′(z)) at the z solving z_cf(z) = u (found by
//                   bisection, z_cf being increasing when monotone)
// ν and the shape are those the horizon figure used (ModelDetails::horizonDof, horizonShape: the
// H-day sum's under aggregate multi-day scaling, multidayscaling.h), so VaR is the density's quantile.
// Historical and Monte Carlo have no closed density (their own samples are the picture), and a
// non-monotone Cornish–Fisher expansion has none either: nullopt. Also nullopt when σ_h = 0 (all
// mass at one point) or when a value would not be finite.
#pragma once

#include "tailwise/risk.h"

#include <optional>
#include <span>
#include <vector>

namespace tailwise {

// Density (per unit of money) at each of `points`, under the model that gave `report`'s figures.
std::optional<std::vector<double>> modelPnlDensity(const RiskReport &report, std::span<const double> points);

} // namespace tailwise

// How the Student-t and Cornish–Fisher models reach an H-day horizon.
//
//   sqrt       √H times the one-day figure, with the one-day shape (a common regulatory
//              convention; exact only for i.i.d. normal days)
//   aggregate  the model applied to the moments of the sum of H independent days: skewness S/√H
//              and excess kurtosis K/H (cumulants of a sum of i.i.d. variables add, so the k-th
//              standardised cumulant of the sum is H^(1−k/2) times the daily one; e.g. Kendall &
//              Stuart, The Advanced Theory of Statistics, vol. 1, on cumulants of sums (mem)); for
//              Student-t the ν whose excess kurtosis 6/(ν−4) equals K/H, i.e.
//              ν_H = 4 + 6/(K/H) = 4 + H(ν − 4), and ν unchanged when ν ≤ 4 (no finite kurtosis).
#pragma once

#include <optional>
#include <string_view>

namespace tailwise {

enum class MultiDayScaling { SquareRoot, Aggregate };

std::string_view toName(MultiDayScaling value); // "sqrt", "aggregate"
std::optional<MultiDayScaling> parseMultiDayScaling(std::string_view name);

// ν_H as above (capped at 10⁶ like the moment fit); ν itself when ν ≤ 4.
double aggregateDof(double dailyDof, int horizonDays);

} // namespace tailwise

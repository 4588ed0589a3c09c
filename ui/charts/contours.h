// Contour lines of a field sampled on a rectangular grid, by marching squares.
//
// Each grid cell is classified by which of its four corners lie at or above the level; the line
// crosses every edge whose ends fall on different sides, at the point found by linear
// interpolation along that edge. The two saddle cases are resolved by the mean of the four
// corners (the "asymptotic decider" simplified to the cell centre; common practice). Segments
// are then joined into polylines through the edges they share, so a closed contour comes back as
// one polyline whose last point equals its first.
// Cells with a non-finite corner are skipped (the line breaks there); no NaN is ever returned.
#pragma once

#include <span>
#include <vector>

namespace tailwise::ui {

struct ContourPoint {
    double x = 0.0;
    double y = 0.0;
};
using ContourLine = std::vector<ContourPoint>;

// values[i * ys.size() + j] is the field at (xs[i], ys[j]) — the layout of RiskGrid (x = horizon
// rows, y = confidence columns). xs and ys increase; both have at least two points.
std::vector<ContourLine> contourLines(std::span<const double> xs, std::span<const double> ys,
                                      std::span<const double> values, double level);

} // namespace tailwise::ui

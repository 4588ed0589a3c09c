// The horizons of the horizon-and-confidence grid (the results store's Grid part, resultsstore.h),
// shared by the store that computes the grid and the chart data builder that slices it
// (charts/tradeoffchartdata.h), so the two always agree on the grid's rows.
//
// Rows: every whole trading day 1 … daysPerYear — fewer under the historical model with
// overlapping H-day sums, which has sums only up to windowReturns − 1 days (modelgrid.h) — then
// the report's own horizon when it falls outside that range, so its headline is always a cell.
#pragma once

#include "tailwise/risk.h"

#include <vector>

namespace tailwise::ui {

// The last horizon of the grid's continuous run 1 … last.
int gridLastHorizon(const tailwise::RiskReport &report);

// The grid's horizons in row order (1 … gridLastHorizon, then the report's own horizon if outside).
std::vector<int> gridHorizons(const tailwise::RiskReport &report);

} // namespace tailwise::ui

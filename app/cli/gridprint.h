// `var --grid`: VaR and ES over horizons × confidences under the model that gave the headline
// (core's modelRiskGrid, grid.h), as a text table and as the JSON "grid" object.
#pragma once

#include "tailwise/grid.h"
#include "tailwise/json.h"
#include "tailwise/risk.h"

#include <string>
#include <vector>

namespace tailwise::cli {

// The grid's rows and columns: 1, 5, 10, 21, 63 and 252 trading days and 95%, 97.5%, 99%, 99.5%,
// with the report's own horizon and confidence added where missing (so its cell is the headline);
// historical with overlapping sums keeps only horizons with at least two sums in the window.
std::vector<int> gridHorizons(const RiskReport &report);
std::vector<double> gridConfidences(const RiskReport &report);

std::string gridText(const RiskReport &report, const RiskGrid &grid);
// "grid": {"model": …, "horizons_days": […], "confidences": […], "var": [[…], …], "es": [[…], …]}
// (rows by horizon, columns by confidence).
void writeGridJson(JsonWriter &j, const RiskReport &report, const RiskGrid &grid);

} // namespace tailwise::cli

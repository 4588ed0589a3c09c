// Every model at the same assumptions, side by side: the rows of a model-comparison table.
//
// Each row is computeRisk (risk.h) with only Assumptions::model changed, so the rows differ by
// the model alone: the window, covariance, horizon and confidence are shared. Student-t uses the
// given ν or fits it (studentt.h); Monte Carlo uses the given ν (t draws) or normal draws, and the
// seed and number of draws of the assumptions. A model that cannot give a figure at these
// assumptions (e.g. overlapping historical sums longer than the window) gets its error's message
// in its row instead of figures; the other rows still come.
// Errors: Cancelled (from the Monte Carlo row) ends the whole comparison; the caller's inputs
// must pass computeRisk's checks (otherwise every row would fail alike, so that error is returned).
#pragma once

#include "tailwise/risk.h"
#include "tailwise/runcontrol.h"

#include <optional>
#include <string>
#include <vector>

namespace tailwise {

struct ModelRow {
    RiskModel model = RiskModel::Normal;    // the model asked for
    RiskModel used = RiskModel::Normal;     // the model that gave the figures (after a fallback)
    std::optional<VarEs> figures;           // absent when the model failed: see `error`
    std::optional<double> varStandardError; // Monte Carlo
    std::string error;
    Warnings warnings;                      // the model's own, beyond the normal run's
};

// Rows in the order normal, student-t, cornish-fisher, historical, monte-carlo. Progress covers
// the whole table (Monte Carlo takes most of it).
Result<std::vector<ModelRow>> compareModels(const PriceHistory &prices, const Holdings &holdings,
                                            const Assumptions &assumptions, const RunControl &control = {});

} // namespace tailwise

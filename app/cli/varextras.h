// What the `var` command computes besides the risk report: a what-if of the proposed trades and
// the stress outcomes, both from core (whatif.h, stress.h).
#pragma once

#include "dailyrun.h"
#include "modeloptions.h"

#include "tailwise/grid.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/stress.h"
#include "tailwise/whatif.h"

#include <optional>
#include <vector>

namespace tailwise::cli {

struct ReportExtras {
    std::vector<Trade> trades;
    std::optional<WhatIf> whatIf;
    std::optional<std::vector<StressOutcome>> stress;
    std::string currency; // the workbook's currency code (e.g. "EUR"); empty: not stated
    std::optional<RiskGrid> grid; // --grid: horizons × confidences under the chosen model
    std::optional<RunStamp> stamp; // version, as-of date, seed, input hash (dailyrun.h)
    std::vector<LimitUse> limits;  // each limit's use and state
    std::optional<std::string> workbook; // batch: the workbook as listed, the JSON line's first key
};

// Reads the scenario files and runs the what-if and the stress. Errors: a scenario file's error
// (naming file, line and column), an unknown traded asset, or an error of the risk computation.
Result<ReportExtras> computeExtras(const ModelRequest &request, const PriceHistory &prices, const Holdings &holdings,
                                   const Assumptions &assumptions);

} // namespace tailwise::cli

// The command line's two ways to print a RiskReport: a readable report and one JSON object.
#pragma once

#include "varextras.h"

#include "tailwise/risk.h"

#include <optional>
#include <string>

namespace tailwise::cli {

// Wall time of the var command's stages in milliseconds (--timings): reading the files, and the
// stages of computeRisk (runcontrol.h); simulate only for Monte Carlo.
struct RunTimings {
    double loadMs = 0.0;
    StageTimings stages;
    bool simulated = false;
};

// `extras`: what-if and stress sections, when the options asked for them; `timings`: a
// "timings_ms" object (JSON) or a closing line (text), when given.
std::string reportText(const RiskReport &report, bool singlePosition, const ReportExtras &extras = {},
                       const std::optional<RunTimings> &timings = std::nullopt);
// `indent` 0: one line (batch's JSONL).
std::string reportJson(const RiskReport &report, bool singlePosition, const ReportExtras &extras = {},
                       const std::optional<RunTimings> &timings = std::nullopt, int indent = 2);

} // namespace tailwise::cli

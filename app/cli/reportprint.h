// The command line's two ways to print a RiskReport: a readable report and one JSON object.
#pragma once

#include "varextras.h"

#include "tailwise/risk.h"

#include <string>

namespace tailwise::cli {

// `extras`: what-if and stress sections, when the options asked for them.
std::string reportText(const RiskReport &report, bool singlePosition, const ReportExtras &extras = {});
std::string reportJson(const RiskReport &report, bool singlePosition, const ReportExtras &extras = {});

} // namespace tailwise::cli

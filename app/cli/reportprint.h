// The command line's two ways to print a RiskReport: a readable report and one JSON object.
#pragma once

#include "tailwise/risk.h"

#include <string>

namespace tailwise::cli {

std::string reportText(const RiskReport &report, bool singlePosition);
std::string reportJson(const RiskReport &report, bool singlePosition);

} // namespace tailwise::cli

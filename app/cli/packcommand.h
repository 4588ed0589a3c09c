// `tailwise-cli pack`: makes a workbook (.tailwise) from a price CSV, a holdings CSV and the
// assumption options of `tailwise-cli var`, e.g. to build the sample workbook.
#pragma once

#include <string>
#include <vector>

namespace tailwise::cli {

// Returns the exit status: 0 success, 1 bad input data or the file could not be written,
// 2 bad usage (as `tailwise-cli var`).
int runPackCommand(const std::vector<std::string> &args);
std::string packHelpText();

} // namespace tailwise::cli

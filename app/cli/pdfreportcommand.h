// `tailwise-cli report WORKBOOK --out FILE.pdf`: the workbook's PDF report, as the window's
// File ▸ Export Report… makes it (ui/export/reportexport.h), with no display needed.
#pragma once

#include <string>
#include <vector>

namespace tailwise::cli {

// Returns the exit status: 0 success, 1 bad input data (an unreadable workbook, no figures for its
// inputs) or the report could not be written, 2 bad usage.
int runPdfReportCommand(const std::vector<std::string> &args);
std::string pdfReportHelpText();

} // namespace tailwise::cli

// `tailwise-cli history FILE.db [--workbook TITLE] [--json|--csv] [--xlsx FILE]`: the runs the
// history database holds (recorded by `var --record` and `batch --record`), oldest first for each
// workbook, with the change from the workbook's previous record and what changed.
#pragma once

#include <string>
#include <vector>

namespace tailwise::cli {

int runHistoryCommand(const std::vector<std::string> &args);
std::string historyHelpText();

} // namespace tailwise::cli

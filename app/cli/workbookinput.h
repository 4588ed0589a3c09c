// Reading a saved workbook for `--workbook FILE` (var, backtest) and the WORKBOOK of render and
// report: its prices, holdings and stored assumptions become the inputs; options given override
// the stored assumptions (parseVarOptions starts from them).
#pragma once

#include "document/workbookcontents.h"

#include "tailwise/result.h"

#include <optional>
#include <string>
#include <vector>

namespace tailwise::cli {

// Loads the workbook; the error names the file and the place in it (workbookfile.h).
Result<ui::WorkbookContents> readWorkbookInput(const std::string &path);

} // namespace tailwise::cli

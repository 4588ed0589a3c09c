// Reading a saved workbook for `tailwise-cli var --workbook FILE`: the workbook's prices,
// holdings and stored assumptions become the inputs; options given on the command line override
// the stored assumptions (parseVarOptions starts from them).
#pragma once

#include "document/workbookcontents.h"

#include "tailwise/result.h"

#include <optional>
#include <string>
#include <vector>

namespace tailwise::cli {

// The FILE of `--workbook FILE` among the arguments, if given with a value (a missing value is
// left to parseVarOptions to report).
std::optional<std::string> workbookOption(const std::vector<std::string> &args);

// Loads the workbook; the error names the file and the place in it (workbookfile.h).
Result<ui::WorkbookContents> readWorkbookInput(const std::string &path);

} // namespace tailwise::cli

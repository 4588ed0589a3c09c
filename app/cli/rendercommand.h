// `tailwise-cli render`: one chart of a workbook to a file, headless (see renderoptions.h).
#pragma once

#include <string>
#include <vector>

namespace tailwise::cli {

int runRenderCommand(const std::vector<std::string> &args);

} // namespace tailwise::cli

// Options of `tailwise-cli render WORKBOOK --chart KIND --out FILE …` (help text in
// renderHelpText()). The size is a preset or width and height in mm (either overrides the
// preset's side); the format comes from --format or the file's suffix.
#pragma once

#include "export/chartrender.h"

#include "tailwise/result.h"

#include <optional>
#include <string>
#include <vector>

namespace tailwise::cli {

struct RenderOptions {
    bool help = false;
    std::string workbookPath;
    std::string outPath;
    ui::ChartExportSettings settings;
    bool noCaption = false;
    std::optional<std::string> caption; // given text; unset: the generated caption
};

// Errors name the option ("--chart: expected one of loss-tail, …"); exit 2 in main.cpp.
Result<RenderOptions> parseRenderOptions(const std::vector<std::string> &args);
std::string renderHelpText();

} // namespace tailwise::cli

// Parsing of `tailwise-cli var` options into a request. Every refusal names the option and says
// what was expected; nothing is read from disk here.
#pragma once

#include "modeloptions.h"

#include "tailwise/assumptions.h"
#include "tailwise/parametric.h"
#include "tailwise/result.h"

#include <optional>
#include <string>
#include <vector>

namespace tailwise::cli {

struct VarRequest {
    std::string pricesPath;
    std::string holdingsPath;
    std::string workbookPath; // --workbook: prices, holdings and assumptions from a saved workbook
    std::optional<SinglePosition> single; // --value/--volatility[/--drift] mode
    Assumptions assumptions;
    ModelRequest models; // --model parameters typed, --trade, --scenario, --worst-days
    bool json = false;
    bool timings = false; // --timings: wall time of each stage in the output
    bool help = false;
};

// `start` is where the assumptions begin before the options change them: the defaults, or a
// workbook's stored assumptions (an option given overrides the stored value).
Result<VarRequest> parseVarOptions(const std::vector<std::string> &args, const Assumptions &start = Assumptions{});
std::string varHelpText();

// "window" → "--window": the CLI's name for a core field, so messages speak the user's language.
std::string optionForField(const std::string &field);

} // namespace tailwise::cli

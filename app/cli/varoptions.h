// The options of `tailwise-cli var`: the shared groups of optiongroups.h plus one position's
// --value/--volatility/--drift. Every refusal names the option; nothing is read from disk here.
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
    ModelRequest models; // --trade, --scenario, --worst-days
    bool json = false;
    bool timings = false; // --timings: wall time of each stage in the output
    bool help = false;
};

// `start` is where the assumptions begin before the options change them: the defaults, or a
// workbook's stored assumptions (an option given overrides the stored value). With --workbook and
// `start` not yet the workbook's (`startIsWorkbook` false), the checks that depend on the stored
// assumptions (a parameter of another model, the assumptions' domains) wait for the second call.
Result<VarRequest> parseVarOptions(const std::vector<std::string> &args, const Assumptions &start = Assumptions{},
                                   bool startIsWorkbook = false);
std::string varHelpText();

} // namespace tailwise::cli

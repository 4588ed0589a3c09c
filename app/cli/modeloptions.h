// The `var` options that choose a model and its parameters, propose trades and name stress
// scenarios: --model, --dof, --hs-horizon, --simulations, --seed, --trade, --scenario, --worst-days.
// Parsed here so varoptions.cpp only hands them over; every refusal names the option.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/result.h"
#include "tailwise/whatif.h"

#include <string>
#include <vector>

namespace tailwise::cli {

struct ModelRequest {
    std::vector<Trade> trades;              // --trade ASSET:DELTA, in the order given
    std::vector<std::string> scenarioPaths; // --scenario FILE, in the order given
    bool worstDays = false;                 // --worst-days, or implied by --scenario
    // Which model parameters were typed, so that one that the model does not use is refused.
    bool gaveDof = false;
    bool gaveHsHorizon = false;
    bool gaveSimulations = false;
    bool gaveSeed = false;

    bool wantsStress() const { return worstDays || !scenarioPaths.empty(); }
};

// True for an option handled here that takes a value (all of them except --worst-days).
bool isModelOption(const std::string &option);
bool isModelFlag(const std::string &option); // --worst-days

// Applies one option with its value. Errors name the option.
Status applyModelOption(const std::string &option, const std::string &text, Assumptions &assumptions,
                        ModelRequest &request);
// After all options: refuses a parameter the chosen model does not use, and trades or scenarios
// without a price history.
Status checkModelOptions(const Assumptions &assumptions, const ModelRequest &request, bool singlePosition);

std::string modelHelpText();

} // namespace tailwise::cli

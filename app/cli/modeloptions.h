// What `var` computes beside the headline: proposed trades, stress scenarios, the worst days
// (read from the options by optiongroups.h's what-if group).
#pragma once

#include "tailwise/whatif.h"

#include <string>
#include <vector>

namespace tailwise::cli {

struct ModelRequest {
    std::vector<Trade> trades;              // --trade ASSET:DELTA, in the order given
    std::vector<std::string> scenarioPaths; // --scenario FILE, in the order given
    bool worstDays = false;                 // --worst-days, or implied by --scenario

    bool wantsStress() const { return worstDays || !scenarioPaths.empty(); }
};

} // namespace tailwise::cli

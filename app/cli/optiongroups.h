// The option groups the commands share, each declared once with its help text and read once.
// A group is a struct of the texts as typed, a declare function that adds its options to a
// command's CommandLine (commandline.h) under its help section, and an apply function that reads
// them into core types with messages naming the option. To add an option: add its field to the
// group's struct, one declaration in the group's declare function (name, placeholder, help) and
// its reading in the apply function. A command takes a group by calling its declare function; the
// wording that differs between commands is chosen by `Command`.
#pragma once

#include "commandline.h"
#include "modeloptions.h"

#include "tailwise/assumptions.h"
#include "tailwise/parametric.h"
#include "tailwise/result.h"

#include <optional>
#include <string>

namespace tailwise::cli {

enum class Command { Var, Backtest, Pack };

// ---- Inputs: where the holdings and prices come from ------------------------------------------
struct InputOptions {
    std::string prices;
    std::string holdings;
    std::string workbook; // not for pack
};
void declareInputOptions(CommandLine &line, InputOptions &options, Command command);
// Exactly one source: --workbook, or --prices with --holdings (`otherSource` names another one the
// command accepts, such as var's --value, when it was given).
Status checkInputOptions(const InputOptions &options, Command command, bool otherSource = false);

// ---- One position without files (var): --value, --volatility, --drift -------------------------
struct PositionOptions {
    std::optional<std::string> value, volatility, drift;
    bool given() const { return value || volatility || drift; }
};
void declarePositionOptions(CommandLine &line, PositionOptions &options);
Result<SinglePosition> applyPositionOptions(const PositionOptions &options);

// ---- Assumptions: confidence, horizon, window, returns, estimator, λ, mean ----------------------
struct AssumptionOptions {
    std::optional<std::string> confidence, horizon, daysPerYear, window, returns, estimator, lambda, mean;
};
void declareAssumptionOptions(CommandLine &line, AssumptionOptions &options, Command command);
// Changes only the assumptions given; `a` starts from the defaults or a workbook's stored ones.
Status applyAssumptionOptions(const AssumptionOptions &options, Assumptions &a);

// ---- Model: --model and its parameters ----------------------------------------------------------
struct ModelOptions {
    std::optional<std::string> model, dof, hsHorizon, scaling, simulations, seed;
};
void declareModelOptions(CommandLine &line, ModelOptions &options, Command command);
Status applyModelOptions(const ModelOptions &options, Assumptions &a, Command command);
// After validate(): a parameter the chosen model does not use is refused.
Status checkModelParameters(const ModelOptions &options, const Assumptions &a, Command command);

// ---- What-if and stress: --trade, --scenario, --worst-days (var); --scenario (pack) -----------
struct WhatIfOptions {
    std::vector<std::string> trades;
    std::vector<std::string> scenarios;
    bool worstDays = false;
};
void declareWhatIfOptions(CommandLine &line, WhatIfOptions &options, Command command);
Status applyWhatIfOptions(const WhatIfOptions &options, ModelRequest &request);

// ---- Output ------------------------------------------------------------------------------------
struct OutputOptions {
    bool json = false;
    bool timings = false; // var
    bool grid = false;    // var
    bool series = false;  // backtest
    bool help = false;
};
void declareOutputOptions(CommandLine &line, OutputOptions &options, Command command);

// Validates the assumptions; a refusal is said as the option ("window: …" → "--window: …").
Status checkAssumptions(const Assumptions &a);

// "window" → "--window": the CLI's name for a core field, so messages speak the user's language.
std::string optionForField(const std::string &field);
// A core error about an assumption field, said as the option the user typed.
std::string messageFor(const Error &error);

} // namespace tailwise::cli

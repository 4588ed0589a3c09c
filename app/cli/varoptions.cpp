#include "varoptions.h"

#include "optiongroups.h"
#include "optiontext.h"

namespace tailwise::cli {

namespace {

const char *varAbout = R"(tailwise-cli var: Value-at-Risk and Expected Shortfall of a portfolio

Usage:
  tailwise-cli var --prices FILE --holdings FILE [options] [--json]
  tailwise-cli var --workbook FILE [options] [--json]
  tailwise-cli var --value V --volatility S [--drift M] [options] [--json])";

const char *varClosing = R"(Exit status: 0 success, 1 bad input data (the message names file, line and column),
2 bad usage (the message names the option).

VaR is a loss that is not expected to be exceeded at the confidence given, not the worst case.
The figures are estimates from past data under the model's assumptions, for information only,
not advice; regulatory use follows local rules and approved models.
)";

struct VarOptions {
    InputOptions inputs;
    PositionOptions position;
    AssumptionOptions assumptions;
    ModelOptions model;
    WhatIfOptions whatIf;
    OutputOptions output;
};

void declare(CommandLine &line, VarOptions &o)
{
    declareInputOptions(line, o.inputs, Command::Var);
    declarePositionOptions(line, o.position);
    declareAssumptionOptions(line, o.assumptions, Command::Var);
    declareModelOptions(line, o.model, Command::Var);
    declareWhatIfOptions(line, o.whatIf, Command::Var);
    declareOutputOptions(line, o.output, Command::Var);
}

} // namespace

Result<VarRequest> parseVarOptions(const std::vector<std::string> &args, const Assumptions &start, bool startIsWorkbook)
{
    VarOptions o;
    CommandLine line("var", varAbout, varClosing);
    declare(line, o);
    if (auto ok = line.parse(args); !ok)
        return ok.error();
    VarRequest request;
    if (line.helpWanted()) {
        request.help = true;
        return request;
    }
    request.assumptions = start;
    if (auto ok = applyAssumptionOptions(o.assumptions, request.assumptions); !ok)
        return ok.error();
    if (auto ok = applyModelOptions(o.model, request.assumptions, Command::Var); !ok)
        return ok.error();
    if (auto ok = applyWhatIfOptions(o.whatIf, request.models); !ok)
        return ok.error();
    const bool waitForWorkbook = !o.inputs.workbook.empty() && !startIsWorkbook;
    if (!waitForWorkbook) {
        if (auto ok = checkAssumptions(request.assumptions); !ok)
            return ok.error();
        if (auto ok = checkModelParameters(o.model, request.assumptions, Command::Var); !ok)
            return ok.error();
    }
    request.json = o.output.json;
    request.timings = o.output.timings;
    request.pricesPath = o.inputs.prices;
    request.holdingsPath = o.inputs.holdings;
    request.workbookPath = o.inputs.workbook;

    const bool singleMode = o.position.given();
    if (singleMode && !request.models.trades.empty())
        return usage("--trade", "needs a portfolio from --prices and --holdings (or --workbook)");
    if (singleMode && request.models.wantsStress())
        return usage(request.models.scenarioPaths.empty() ? "--worst-days" : "--scenario",
                     "needs a portfolio from --prices and --holdings (or --workbook)");
    if (singleMode && request.workbookPath.empty() && (!o.inputs.prices.empty() || !o.inputs.holdings.empty()))
        return usage("--value", "give either --prices and --holdings, or --value and --volatility, not both");
    if (auto ok = checkInputOptions(o.inputs, Command::Var, singleMode); !ok)
        return ok.error();
    if (singleMode) {
        auto single = applyPositionOptions(o.position);
        if (!single)
            return single.error();
        request.single = single.value();
    }
    return request;
}

std::string varHelpText()
{
    VarOptions o;
    CommandLine line("var", varAbout, varClosing);
    declare(line, o);
    return line.help();
}

} // namespace tailwise::cli

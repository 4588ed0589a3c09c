#include "backtestoptions.h"

#include "optiongroups.h"
#include "optiontext.h"

namespace tailwise::cli {

namespace {

const char *backtestAbout = R"(tailwise-cli backtest: would the one-day VaR have held up over the price history?

Usage:
  tailwise-cli backtest --prices FILE --holdings FILE --window W [options] [--json] [--series]
  tailwise-cli backtest --workbook FILE [options] [--json] [--series]

For every day with W daily returns before it, the holdings (fixed quantities, valued at the
previous close; or fixed money values) get a one-day VaR forecast from those W returns, and the
day's actual P&L (simple returns) is compared with it. A loss strictly greater than the VaR is an
exception. The exceptions are then tested: Kupiec's proportion of failures, Christoffersen's
independence and conditional coverage, and the traffic-light zone (green, yellow, red).)";

const char *backtestClosing = R"(Exit status: 0 success, 1 bad input data (the message names file, line and column),
2 bad usage (the message names the option).

VaR is a loss that is not expected to be exceeded at the confidence given, not the worst case.
A backtest shows how the model would have done on this history; it does not promise how it will
do. Figures are estimates, for information only, not advice; regulatory use follows local rules
and approved models.
)";

struct Options {
    InputOptions inputs;
    AssumptionOptions assumptions;
    ModelOptions model;
    OutputOptions output;
};

void declare(CommandLine &line, Options &o)
{
    declareInputOptions(line, o.inputs, Command::Backtest);
    declareAssumptionOptions(line, o.assumptions, Command::Backtest);
    declareModelOptions(line, o.model, Command::Backtest);
    declareOutputOptions(line, o.output, Command::Backtest);
}

} // namespace

Result<BacktestOptions> parseBacktestOptions(const std::vector<std::string> &args, const Assumptions &start,
                                             bool startIsWorkbook)
{
    Options o;
    CommandLine line("backtest", backtestAbout, backtestClosing);
    declare(line, o);
    if (auto ok = line.parse(args); !ok)
        return ok.error();
    BacktestOptions options;
    if (line.helpWanted()) {
        options.help = true;
        return options;
    }
    Assumptions &a = options.assumptions;
    a = start;
    if (o.assumptions.window && *o.assumptions.window == "all")
        return usage("--window", "expected a whole number of daily returns for each forecast (e.g. 250), found \"all\"");
    if (o.assumptions.window && !toInt(*o.assumptions.window))
        return usage("--window", "expected a whole number of daily returns for each forecast (e.g. 250), found \""
                                     + *o.assumptions.window + "\"");
    if (auto ok = applyAssumptionOptions(o.assumptions, a); !ok)
        return ok.error();
    if (auto ok = applyModelOptions(o.model, a, Command::Backtest); !ok)
        return ok.error();
    if (o.inputs.workbook.empty() || startIsWorkbook) {
        if (auto ok = checkModelParameters(o.model, a, Command::Backtest); !ok)
            return ok.error();
        if (auto ok = checkAssumptions(a); !ok)
            return ok.error();
    }
    if (auto ok = checkInputOptions(o.inputs, Command::Backtest); !ok)
        return ok.error();
    options.pricesPath = o.inputs.prices;
    options.holdingsPath = o.inputs.holdings;
    options.workbookPath = o.inputs.workbook;
    options.json = o.output.json;
    options.series = o.output.series;
    if (!a.window && options.workbookPath.empty())
        return usage("--window", "expected the number of daily returns each forecast is estimated from (e.g. 250)");
    return options;
}

std::string backtestHelpText()
{
    Options o;
    CommandLine line("backtest", backtestAbout, backtestClosing);
    declare(line, o);
    return line.help();
}

} // namespace tailwise::cli

#include "optiongroups.h"

#include "optiontext.h"

#include "tailwise/backtest.h"

#include <charconv>
#include <cstdint>
#include <map>

namespace tailwise::cli {

namespace {

template <class Int>
std::optional<Int> toWhole(const std::string &text)
{
    Int v = 0;
    const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
    if (text.empty() || ec != std::errc() || end != text.data() + text.size())
        return std::nullopt;
    return v;
}

// Seeds go to JSON as numbers: keep them exact in a double.
constexpr std::uint64_t maxSeed = 9007199254740991ULL; // 2^53 − 1

Result<double> number(const std::string &option, const std::string &text, const std::string &what)
{
    const auto v = toDouble(text);
    if (!v)
        return usage(option, "expected " + what + ", found \"" + text + "\"");
    return *v;
}

Result<int> whole(const std::string &option, const std::string &text, const std::string &what)
{
    const auto v = toInt(text);
    if (!v)
        return usage(option, "expected " + what + ", found \"" + text + "\"");
    return *v;
}

const char *modelList = "'normal', 'student-t', 'cornish-fisher', 'historical' or 'monte-carlo'";

} // namespace

std::string optionForField(const std::string &field)
{
    static const std::map<std::string, std::string> names = {
        {"confidence", "--confidence"}, {"horizon", "--horizon"}, {"days-per-year", "--days-per-year"},
        {"window", "--window"},         {"lambda", "--lambda"},   {"value", "--value"},
        {"volatility", "--volatility"}, {"drift", "--drift"},     {"holdings", "--holdings"},
        {"dof", "--dof"},               {"simulations", "--simulations"}, {"model", "--model"},
        {"trade", "--trade"},           {"returns", "--returns"},
    };
    const auto it = names.find(field);
    return it == names.end() ? field : it->second;
}

std::string messageFor(const Error &error)
{
    if (!error.field.empty() && error.message.rfind(error.field + ": ", 0) == 0)
        return optionForField(error.field) + error.message.substr(error.field.size());
    return error.message;
}

Status checkAssumptions(const Assumptions &a)
{
    if (auto ok = validate(a); !ok)
        return usage(optionForField(ok.error().field), ok.error().message.substr(ok.error().field.size() + 2));
    return Done{};
}

// ---- Inputs -------------------------------------------------------------------------------------

void declareInputOptions(CommandLine &line, InputOptions &o, Command command)
{
    line.section("Data");
    line.value("--prices", o.prices, "FILE", "daily price history, CSV: date,<asset>,<asset>,... (ISO dates)");
    line.value("--holdings", o.holdings, "FILE",
               command == Command::Backtest
                   ? "holdings, CSV: asset,quantity or asset,value (a price column is not\nused: each past day is valued at its own close)"
                   : "holdings, CSV: asset,quantity[,price] or asset,value");
    if (command == Command::Var)
        line.value("--workbook", o.workbook, "FILE",
                   "a saved workbook (.tailwise): its prices, holdings and assumptions;\nan assumption option given here overrides the stored one");
    if (command == Command::Backtest)
        line.value("--workbook", o.workbook, "FILE",
                   "a saved workbook (.tailwise): its prices, holdings and assumptions,\nand the rolling window of its backtest settings; options given\nhere override the stored ones");
}

Status checkInputOptions(const InputOptions &o, Command command, bool otherSource)
{
    const bool files = !o.prices.empty() || !o.holdings.empty();
    if (!o.workbook.empty()) {
        if (files || otherSource)
            return usage("--workbook", command == Command::Var
                                           ? "give either --workbook, or --prices and --holdings, or --value and --volatility"
                                           : "give either --workbook, or --prices and --holdings");
        return Done{};
    }
    if (otherSource)
        return Done{};
    const std::string orWorkbook = command == Command::Pack ? "" : " (or a workbook with --workbook)";
    if (o.prices.empty())
        return usage("--prices", command == Command::Var
                                     ? "expected a price history file (or --value and --volatility for one position)"
                                     : "expected a price history file" + orWorkbook);
    if (o.holdings.empty())
        return usage("--holdings", "expected a holdings file with --prices");
    return Done{};
}

// ---- One position ------------------------------------------------------------------------------

void declarePositionOptions(CommandLine &line, PositionOptions &o)
{
    line.value("--value", o.value, "V", "one position's money value (instead of the two files)");
    line.value("--volatility", o.volatility, "S", "its annual volatility as a fraction (0.2 = 20%)");
    line.value("--drift", o.drift, "M", "its expected annual return as a fraction (default 0)");
}

Result<SinglePosition> applyPositionOptions(const PositionOptions &o)
{
    const std::string fraction = "a fraction per year (e.g. 0.2 for 20%)";
    std::optional<double> value, volatility, drift;
    if (o.value) {
        auto v = number("--value", *o.value, "a money value");
        if (!v)
            return v.error();
        value = v.value();
    }
    if (o.volatility) {
        auto v = number("--volatility", *o.volatility, fraction);
        if (!v)
            return v.error();
        volatility = v.value();
    }
    if (o.drift) {
        auto v = number("--drift", *o.drift, fraction);
        if (!v)
            return v.error();
        drift = v.value();
    }
    if (!value)
        return usage("--value", "expected the position's money value with --volatility");
    if (!volatility)
        return usage("--volatility", "expected the annual volatility (e.g. 0.2 for 20%) with --value");
    if (*volatility < 0)
        return usage("--volatility", "expected an annual volatility of zero or more");
    return SinglePosition{*value, *volatility, drift.value_or(0.0)};
}

// ---- Assumptions -------------------------------------------------------------------------------

void declareAssumptionOptions(CommandLine &line, AssumptionOptions &o, Command command)
{
    line.section("Assumptions");
    if (command == Command::Backtest) {
        line.value("--window", o.window, "W",
                   "daily returns behind each forecast, 2 <= W < returns in the history\n(with --workbook: its backtest settings' window unless given)");
        line.value("--confidence", o.confidence, "C",
                   "VaR confidence, 0.5 <= C <= 0.9999 (default 0.99); expected exception\nrate 1 - C");
    } else {
        line.value("--confidence", o.confidence, "C",
                   "probability that the loss stays below VaR, 0.5 <= C <= 0.9999\n(default 0.99)");
        line.value("--horizon", o.horizon, "H",
                   "horizon in whole trading days, >= 1 (default 1); risk grows with the\nsquare root of H, the mean with H");
        line.value("--days-per-year", o.daysPerYear, "N",
                   "trading days in a year (default 252); used with --volatility/--drift");
        line.value("--window", o.window, "N", "use the N most recent daily returns, N >= 2, or 'all' (default all)");
    }
    line.value("--returns", o.returns, "KIND",
               command == Command::Backtest
                   ? "returns the forecast is estimated from: 'simple' (default) or 'log';\nthe realised P&L always uses simple returns"
                   : "'simple' (P1/P0 - 1, default) or 'log' (ln(P1/P0))");
    line.value("--estimator", o.estimator, "KIND",
               "covariance: 'sample' (equal weights, default) or 'ewma'\n(exponentially weighted, recent days count more)");
    line.value("--lambda", o.lambda, "L", "EWMA decay, 0 < L < 1 (default 0.94, about 17 days' memory)");
    line.value("--mean", o.mean, "KIND", "daily mean: 'zero' (default) or 'sample' (estimated from the window)");
}

Status applyAssumptionOptions(const AssumptionOptions &o, Assumptions &a)
{
    if (o.confidence) {
        auto v = number("--confidence", *o.confidence, "a confidence level from 0.5 to 0.9999 (e.g. 0.99)");
        if (!v)
            return v.error();
        a.confidence = v.value();
    }
    if (o.horizon) {
        auto v = whole("--horizon", *o.horizon, "a whole number of trading days (e.g. 10)");
        if (!v)
            return v.error();
        a.horizonDays = v.value();
    }
    if (o.daysPerYear) {
        auto v = whole("--days-per-year", *o.daysPerYear, "a whole number of trading days a year (e.g. 252)");
        if (!v)
            return v.error();
        a.daysPerYear = v.value();
    }
    if (o.window) {
        if (*o.window == "all") {
            a.window.reset(); // also when a workbook stored a window
        } else {
            auto v = whole("--window", *o.window, "a whole number of daily returns, or 'all'");
            if (!v)
                return v.error();
            a.window = v.value();
        }
    }
    if (o.lambda) {
        auto v = number("--lambda", *o.lambda, "a decay factor between 0 and 1 (e.g. 0.94)");
        if (!v)
            return v.error();
        a.lambda = v.value();
    }
    if (o.returns) {
        const auto v = parseReturnType(*o.returns);
        if (!v)
            return usage("--returns", "expected 'simple' or 'log', found \"" + *o.returns + "\"");
        a.returns = *v;
    }
    if (o.estimator) {
        const auto v = parseEstimator(*o.estimator);
        if (!v)
            return usage("--estimator", "expected 'sample' or 'ewma', found \"" + *o.estimator + "\"");
        a.estimator = *v;
    }
    if (o.mean) {
        const auto v = parseMeanModel(*o.mean);
        if (!v)
            return usage("--mean", "expected 'zero' or 'sample', found \"" + *o.mean + "\"");
        a.mean = *v;
    }
    return Done{};
}

// ---- Model ---------------------------------------------------------------------------------------

void declareModelOptions(CommandLine &line, ModelOptions &o, Command command)
{
    line.section("Models");
    if (command == Command::Backtest) {
        line.value("--model", o.model, "NAME",
                   "'normal' (variance-covariance, default), 'student-t' (fatter tails),\n"
                   "'cornish-fisher' (normal corrected for the P&L's skewness and\n"
                   "kurtosis) or 'historical' (the window's own P&L); 'monte-carlo' is\n"
                   "not backtested (a simulation a day)");
        line.value("--dof", o.dof, "NU|fit",
                   "Student-t degrees of freedom above 2, or 'fit' (default) to fit them\nto each window's P&L by its kurtosis");
        return;
    }
    line.value("--model", o.model, "NAME",
               "normal         variance-covariance with normal P&L (default)\n"
               "student-t      the same spread with fatter tails: a Student-t scaled to\n"
               "               the same variance\n"
               "cornish-fisher the normal quantile corrected for the skewness and kurtosis\n"
               "               of the window's daily P&L\n"
               "historical     today's holdings replayed over the window's days; VaR is the\n"
               "               loss at the confidence level among them, ES the average of\n"
               "               the losses beyond it\n"
               "monte-carlo    random scenarios drawn from the estimated means and covariance");
    line.value("--dof", o.dof, "NU|fit",
               "Student-t degrees of freedom, above 2 (smaller = fatter tails), or 'fit' to\n"
               "take them from the kurtosis of the window's P&L (the default for\n"
               "student-t); with monte-carlo, draws t scenarios instead of normal ones");
    line.value("--hs-horizon", o.hsHorizon, "KIND",
               "historical, horizon over 1 day: 'sqrt' scales the one-day figures by the\n"
               "square root of the horizon (default); 'overlapping' uses sums of\n"
               "consecutive daily P&L (overlapping, so fewer independent observations)");
    line.value("--scaling", o.scaling, "KIND",
               "student-t and cornish-fisher, horizon over 1 day: 'sqrt' multiplies the\n"
               "one-day figure by the square root of the horizon, keeping the one-day\n"
               "shape (default); 'aggregate' applies the model to the sum of the days:\n"
               "skewness S/sqrt(H), excess kurtosis K/H, Student-t degrees of freedom\n"
               "4 + H(nu - 4) (kept when nu <= 4), so longer horizons are less fat-tailed");
    line.value("--simulations", o.simulations, "N",
               "monte-carlo draws, 1000 to 10000000 (default 100000); more draws, smaller\nstandard error");
    line.value("--seed", o.seed, "S",
               "monte-carlo random seed, 0 to 9007199254740991 (default 1): the same seed\nand inputs give the same figures");
}

Status applyModelOptions(const ModelOptions &o, Assumptions &a, Command command)
{
    if (o.model) {
        const auto v = parseRiskModel(*o.model);
        if (!v)
            return usage("--model", command == Command::Backtest
                                        ? "expected a model name such as 'normal', found \"" + *o.model + "\""
                                        : std::string("expected ") + modelList + ", found \"" + *o.model + "\"");
        if (command == Command::Backtest)
            if (auto ok = checkBacktestModel(*v); !ok)
                return usage("--model", ok.error().message.substr(ok.error().field.size() + 2));
        a.model = *v;
    }
    if (o.dof) {
        if (*o.dof == "fit") {
            a.dof = DegreesOfFreedom::fit();
        } else {
            const auto v = toDouble(*o.dof);
            if (!v)
                return usage("--dof", "expected degrees of freedom above 2 (e.g. 5) or 'fit', found \"" + *o.dof + "\"");
            a.dof = DegreesOfFreedom::given(*v);
        }
    }
    if (o.hsHorizon) {
        const auto v = parseHistoricalHorizon(*o.hsHorizon);
        if (!v)
            return usage("--hs-horizon", "expected 'sqrt' or 'overlapping', found \"" + *o.hsHorizon + "\"");
        a.historicalHorizon = *v;
    }
    if (o.scaling) {
        const auto v = parseMultiDayScaling(*o.scaling);
        if (!v)
            return usage("--scaling", "expected 'sqrt' or 'aggregate', found \"" + *o.scaling + "\"");
        a.scaling = *v;
    }
    if (o.simulations) {
        const auto v = toWhole<int>(*o.simulations);
        if (!v)
            return usage("--simulations", "expected a whole number of draws (e.g. 100000), found \"" + *o.simulations + "\"");
        a.simulations = *v;
    }
    if (o.seed) {
        const auto v = toWhole<std::uint64_t>(*o.seed);
        if (!v || *v > maxSeed)
            return usage("--seed", "expected a whole number from 0 to 9007199254740991, found \"" + *o.seed + "\"");
        a.seed = *v;
    }
    return Done{};
}

Status checkModelParameters(const ModelOptions &o, const Assumptions &a, Command command)
{
    const std::string model(toName(a.model));
    if (command == Command::Backtest) {
        if (o.dof && a.model != RiskModel::StudentT)
            return usage("--dof", "applies to --model student-t, not " + model);
        return Done{};
    }
    if (o.dof && a.model != RiskModel::StudentT && a.model != RiskModel::MonteCarlo)
        return usage("--dof", "applies to --model student-t or monte-carlo, not " + model);
    if (o.hsHorizon && a.model != RiskModel::Historical)
        return usage("--hs-horizon", "applies to --model historical, not " + model);
    if (o.scaling && a.model != RiskModel::StudentT && a.model != RiskModel::CornishFisher)
        return usage("--scaling", "applies to --model student-t or cornish-fisher, not " + model);
    if (o.simulations && a.model != RiskModel::MonteCarlo)
        return usage("--simulations", "applies to --model monte-carlo, not " + model);
    if (o.seed && a.model != RiskModel::MonteCarlo)
        return usage("--seed", "applies to --model monte-carlo, not " + model);
    return Done{};
}

// ---- What-if and stress --------------------------------------------------------------------------

void declareWhatIfOptions(CommandLine &line, WhatIfOptions &o, Command command)
{
    if (command == Command::Pack) {
        line.section("Kept in the workbook");
        line.repeatable("--scenario", o.scenarios, "FILE",
                        "a stress scenario to keep in the workbook (CSV asset,shock as for\n"
                        "tailwise-cli var; named by the file name without folder and\n"
                        "extension); kept in the order given, names must differ");
        return;
    }
    line.section("What-if and stress (need --prices and --holdings, or --workbook)");
    line.repeatable("--trade", o.trades, "ASSET:CHANGE",
                    "change the quantity of ASSET by CHANGE (e.g. DAX:-10; an asset of the\n"
                    "price history not yet held may be bought). Shows VaR before and\n"
                    "after, the exact change (incremental VaR) and its first-order\n"
                    "estimate from the marginal VaR");
    line.repeatable("--scenario", o.scenarios, "FILE",
                    "a stress scenario, CSV 'asset,shock' with each shock a fraction of the\n"
                    "price (-0.2 = a 20% fall); shows its P&L on today's holdings, with the\n"
                    "window's five worst days replayed on today's holdings");
    line.flag("--worst-days", o.worstDays, "the window's five worst days replayed on today's holdings, on their own");
}

Status applyWhatIfOptions(const WhatIfOptions &o, ModelRequest &request)
{
    for (const std::string &text : o.trades) {
        const std::size_t colon = text.rfind(':');
        if (colon == std::string::npos || colon == 0 || colon + 1 == text.size())
            return usage("--trade", "expected ASSET:CHANGE, e.g. DAX:-10 (a change in quantity), found \"" + text + "\"");
        const auto change = toDouble(text.substr(colon + 1));
        if (!change)
            return usage("--trade", "expected a number after the colon in \"" + text + "\" (a change in quantity, e.g. -10)");
        request.trades.push_back(Trade{text.substr(0, colon), *change});
    }
    for (const std::string &path : o.scenarios) {
        if (path.empty())
            return usage("--scenario", "expected a scenario file (CSV asset,shock)");
        request.scenarioPaths.push_back(path);
    }
    request.worstDays = o.worstDays;
    return Done{};
}

// ---- Output --------------------------------------------------------------------------------------

void declareOutputOptions(CommandLine &line, OutputOptions &o, Command command)
{
    line.section("Output");
    if (command != Command::Pack)
        line.flag("--json", o.json, "one JSON object instead of the readable report");
    if (command == Command::Var)
        line.flag("--timings", o.timings,
                  "add the wall time of each stage in ms (JSON: \"timings_ms\" with load,\n"
                  "estimate, risk and, for monte-carlo, simulate)");
    if (command == Command::Var)
        line.flag("--grid", o.grid,
                  "also VaR and ES over horizons (1, 5, 10, 21, 63, 252 days) x confidences\n"
                  "(95% to 99.5%), every cell under the chosen model (JSON: \"grid\")");
    if (command == Command::Backtest)
        line.flag("--series", o.series, "also every tested day: date, P&L, VaR, exception");
    line.flag("--help", o.help, "this text");
}

} // namespace tailwise::cli

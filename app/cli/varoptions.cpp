#include "varoptions.h"
#include "optiontext.h"

#include <charconv>
#include <cmath>
#include <map>

namespace tailwise::cli {

std::string optionForField(const std::string &field)
{
    static const std::map<std::string, std::string> names = {
        {"confidence", "--confidence"}, {"horizon", "--horizon"}, {"days-per-year", "--days-per-year"},
        {"window", "--window"},         {"lambda", "--lambda"},   {"value", "--value"},
        {"volatility", "--volatility"}, {"drift", "--drift"},
        {"dof", "--dof"},               {"simulations", "--simulations"}, {"model", "--model"},
        {"trade", "--trade"},
    };
    const auto it = names.find(field);
    return it == names.end() ? field : it->second;
}

Result<VarRequest> parseVarOptions(const std::vector<std::string> &args, const Assumptions &start)
{
    VarRequest request;
    request.assumptions = start;
    std::optional<double> value, volatility, drift;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &option = args[i];
        if (option == "--help" || option == "-h") {
            request.help = true;
            return request;
        }
        if (option == "--json") {
            request.json = true;
            continue;
        }
        if (option == "--timings") {
            request.timings = true;
            continue;
        }
        if (option.rfind("--", 0) != 0)
            return usage(option, "unexpected argument: options start with '--' (see tailwise-cli var --help)");
        if (isModelFlag(option)) {
            request.models.worstDays = true;
            continue;
        }
        if (isModelOption(option)) {
            if (i + 1 >= args.size())
                return usage(option, "expected a value after the option");
            if (auto ok = applyModelOption(option, args[++i], request.assumptions, request.models); !ok)
                return ok.error();
            continue;
        }
        static const char *known[] = {"--prices", "--holdings", "--workbook", "--value", "--volatility", "--drift",
                                      "--confidence", "--horizon", "--days-per-year", "--window", "--returns",
                                      "--estimator", "--lambda", "--mean", "--model"};
        bool isKnown = false;
        for (const char *k : known)
            isKnown |= option == k;
        if (!isKnown)
            return usage(option, "unknown option (see tailwise-cli var --help)");
        if (i + 1 >= args.size())
            return usage(option, "expected a value after the option");
        const std::string &text = args[++i];
        auto number = [&](const char *what) -> Result<double> {
            const auto v = toDouble(text);
            if (!v)
                return usage(option, std::string("expected ") + what + ", found \"" + text + "\"");
            return *v;
        };
        auto whole = [&](const char *what) -> Result<int> {
            const auto v = toInt(text);
            if (!v)
                return usage(option, std::string("expected ") + what + ", found \"" + text + "\"");
            return *v;
        };
        Assumptions &a = request.assumptions;
        if (option == "--prices") {
            request.pricesPath = text;
        } else if (option == "--workbook") {
            request.workbookPath = text;
        } else if (option == "--holdings") {
            request.holdingsPath = text;
        } else if (option == "--value" || option == "--volatility" || option == "--drift") {
            auto v = number(option == "--value" ? "a money value" : "a fraction per year (e.g. 0.2 for 20%)");
            if (!v)
                return v.error();
            (option == "--value" ? value : option == "--volatility" ? volatility : drift) = v.value();
        } else if (option == "--confidence") {
            auto v = number("a confidence level between 0 and 1 (e.g. 0.99)");
            if (!v)
                return v.error();
            a.confidence = v.value();
        } else if (option == "--horizon") {
            auto v = whole("a whole number of trading days (e.g. 10)");
            if (!v)
                return v.error();
            a.horizonDays = v.value();
        } else if (option == "--days-per-year") {
            auto v = whole("a whole number of trading days a year (e.g. 252)");
            if (!v)
                return v.error();
            a.daysPerYear = v.value();
        } else if (option == "--window") {
            if (text == "all") {
                a.window.reset(); // also when a workbook stored a window
            } else {
                auto v = whole("a whole number of daily returns, or 'all'");
                if (!v)
                    return v.error();
                a.window = v.value();
            }
        } else if (option == "--lambda") {
            auto v = number("a decay factor between 0 and 1 (e.g. 0.94)");
            if (!v)
                return v.error();
            a.lambda = v.value();
        } else if (option == "--returns") {
            const auto v = parseReturnType(text);
            if (!v)
                return usage(option, "expected 'simple' or 'log', found \"" + text + "\"");
            a.returns = *v;
        } else if (option == "--estimator") {
            const auto v = parseEstimator(text);
            if (!v)
                return usage(option, "expected 'sample' or 'ewma', found \"" + text + "\"");
            a.estimator = *v;
        } else if (option == "--mean") {
            const auto v = parseMeanModel(text);
            if (!v)
                return usage(option, "expected 'zero' or 'sample', found \"" + text + "\"");
            a.mean = *v;
        }
    }
    if (auto ok = validate(request.assumptions); !ok)
        return usage(optionForField(ok.error().field), ok.error().message.substr(ok.error().field.size() + 2));

    const bool fileMode = !request.pricesPath.empty() || !request.holdingsPath.empty();
    const bool singleMode = value || volatility || drift;
    if (auto ok = checkModelOptions(request.assumptions, request.models, singleMode); !ok)
        return ok.error();
    if (!request.workbookPath.empty()) {
        if (fileMode || singleMode)
            return usage("--workbook", "give either --workbook, or --prices and --holdings, or --value and --volatility");
        return request;
    }
    if (fileMode && singleMode)
        return usage("--value", "give either --prices and --holdings, or --value and --volatility, not both");
    if (singleMode) {
        if (!value)
            return usage("--value", "expected the position's money value with --volatility");
        if (!volatility)
            return usage("--volatility", "expected the annual volatility (e.g. 0.2 for 20%) with --value");
        if (*volatility < 0)
            return usage("--volatility", "expected an annual volatility of zero or more");
        request.single = SinglePosition{*value, *volatility, drift.value_or(0.0)};
        return request;
    }
    if (request.pricesPath.empty())
        return usage("--prices", "expected a price history file (or --value and --volatility for one position)");
    if (request.holdingsPath.empty())
        return usage("--holdings", "expected a holdings file with --prices");
    return request;
}

std::string varHelpText()
{
    return R"(tailwise-cli var: Value-at-Risk and Expected Shortfall of a portfolio

Usage:
  tailwise-cli var --prices FILE --holdings FILE [options] [--json]
  tailwise-cli var --workbook FILE [options] [--json]
  tailwise-cli var --value V --volatility S [--drift M] [options] [--json]

Data:
  --prices FILE        daily price history, CSV: date,<asset>,<asset>,... (ISO dates)
  --holdings FILE      holdings, CSV: asset,quantity[,price] or asset,value
  --workbook FILE      a saved workbook (.tailwise): its prices, holdings and assumptions;
                       an assumption option given here overrides the stored one
  --value V            one position's money value (instead of the two files)
  --volatility S       its annual volatility as a fraction (0.2 = 20%)
  --drift M            its expected annual return as a fraction (default 0)

Assumptions:
  --confidence C       probability that the loss stays below VaR, 0 < C < 1 (default 0.99)
  --horizon H          horizon in whole trading days, >= 1 (default 1); risk grows with the
                       square root of H, the mean with H
  --days-per-year N    trading days in a year (default 252); used with --volatility/--drift
  --window N           use the N most recent daily returns, N >= 2, or 'all' (default all)
  --returns KIND       'simple' (P1/P0 - 1, default) or 'log' (ln(P1/P0))
  --estimator KIND     covariance: 'sample' (equal weights, default) or 'ewma'
                       (exponentially weighted, recent days count more)
  --lambda L           EWMA decay, 0 < L < 1 (default 0.94, about 17 days' memory)
  --mean KIND          daily mean: 'zero' (default) or 'sample' (estimated from the window)
  --model NAME         normal (default), student-t, cornish-fisher, historical or
                       monte-carlo: see Models below

)" + modelHelpText() + R"(
Output:
  --json               one JSON object instead of the readable report
  --timings            add the wall time of each stage in ms (JSON: "timings_ms" with load,
                       estimate, risk and, for monte-carlo, simulate)
  --help               this text

Exit status: 0 success, 1 bad input data (the message names file, line and column),
2 bad usage (the message names the option).

VaR is a loss that is not expected to be exceeded at the confidence given, not the worst case.
The figures are estimates from past data under the model's assumptions, for information only,
not advice; regulatory use follows local rules and approved models.
)";
}

} // namespace tailwise::cli

#include "backtestoptions.h"
#include "optiontext.h"

#include "varoptions.h"

#include "tailwise/backtest.h"

#include <charconv>
#include <cmath>

namespace tailwise::cli {

std::string backtestOptionForField(const std::string &field)
{
    if (field == "model")
        return "--model";
    if (field == "holdings")
        return "--holdings";
    if (field == "returns")
        return "--returns";
    if (field == "dof")
        return "--dof";
    return optionForField(field);
}

Result<BacktestOptions> parseBacktestOptions(const std::vector<std::string> &args)
{
    BacktestOptions options;
    Assumptions &a = options.assumptions;
    bool gaveDof = false;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &option = args[i];
        if (option == "--help" || option == "-h") {
            options.help = true;
            return options;
        }
        if (option == "--json") {
            options.json = true;
            continue;
        }
        if (option == "--series") {
            options.series = true;
            continue;
        }
        if (option.rfind("--", 0) != 0)
            return usage(option, "unexpected argument: options start with '--' (see tailwise-cli backtest --help)");
        static const char *known[] = {"--prices", "--holdings", "--window",  "--confidence", "--model",
                                      "--estimator", "--lambda", "--mean", "--returns", "--dof"};
        bool isKnown = false;
        for (const char *k : known)
            isKnown |= option == k;
        if (!isKnown)
            return usage(option, "unknown option (see tailwise-cli backtest --help)");
        if (i + 1 >= args.size())
            return usage(option, "expected a value after the option");
        const std::string &text = args[++i];
        if (option == "--prices") {
            options.pricesPath = text;
        } else if (option == "--holdings") {
            options.holdingsPath = text;
        } else if (option == "--window") {
            const auto v = toInt(text);
            if (!v)
                return usage(option, "expected a whole number of daily returns for each forecast (e.g. 250), found \""
                                         + text + "\"");
            a.window = *v;
        } else if (option == "--confidence") {
            const auto v = toDouble(text);
            if (!v)
                return usage(option, "expected a confidence level between 0 and 1 (e.g. 0.99), found \"" + text + "\"");
            a.confidence = *v;
        } else if (option == "--lambda") {
            const auto v = toDouble(text);
            if (!v)
                return usage(option, "expected a decay factor between 0 and 1 (e.g. 0.94), found \"" + text + "\"");
            a.lambda = *v;
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
        } else if (option == "--dof") {
            gaveDof = true;
            if (text == "fit") {
                a.dof = DegreesOfFreedom::fit();
            } else {
                const auto v = toDouble(text);
                if (!v)
                    return usage(option, "expected degrees of freedom above 2 (e.g. 5) or 'fit', found \"" + text + "\"");
                a.dof = DegreesOfFreedom::given(*v);
            }
        } else if (option == "--model") {
            const auto v = parseRiskModel(text);
            if (!v)
                return usage(option, "expected a model name such as 'normal', found \"" + text + "\"");
            if (auto ok = checkBacktestModel(*v); !ok)
                return usage(option, ok.error().message.substr(ok.error().field.size() + 2));
            a.model = *v;
        }
    }
    if (gaveDof && a.model != RiskModel::StudentT)
        return usage("--dof", "applies to --model student-t, not " + std::string(toName(a.model)));
    if (auto ok = validate(a); !ok)
        return usage(backtestOptionForField(ok.error().field), ok.error().message.substr(ok.error().field.size() + 2));
    if (options.pricesPath.empty())
        return usage("--prices", "expected a price history file");
    if (options.holdingsPath.empty())
        return usage("--holdings", "expected a holdings file");
    if (!a.window)
        return usage("--window", "expected the number of daily returns each forecast is estimated from (e.g. 250)");
    return options;
}

std::string backtestHelpText()
{
    return R"(tailwise-cli backtest: would the one-day VaR have held up over the price history?

Usage:
  tailwise-cli backtest --prices FILE --holdings FILE --window W [options] [--json] [--series]

For every day with W daily returns before it, the holdings (fixed quantities, valued at the
previous close; or fixed money values) get a one-day VaR forecast from those W returns, and the
day's actual P&L (simple returns) is compared with it. A loss strictly greater than the VaR is an
exception. The exceptions are then tested: Kupiec's proportion of failures, Christoffersen's
independence and conditional coverage, and the traffic-light zone (green, yellow, red).

Data:
  --prices FILE        daily price history, CSV: date,<asset>,<asset>,... (ISO dates)
  --holdings FILE      holdings, CSV: asset,quantity or asset,value (a price column is not
                       used: each past day is valued at its own close)

Assumptions:
  --window W           daily returns behind each forecast, 2 <= W < returns in the history
  --confidence C       VaR confidence, 0 < C < 1 (default 0.99); expected exception rate 1 - C
  --model NAME         'normal' (variance-covariance, default), 'student-t' (fatter tails),
                       'cornish-fisher' (normal corrected for the P&L's skewness and
                       kurtosis) or 'historical' (the window's own P&L); 'monte-carlo' is
                       not backtested (a simulation a day)
  --dof NU|fit         Student-t degrees of freedom above 2, or 'fit' (default) to fit them
                       to each window's P&L by its kurtosis
  --estimator KIND     covariance: 'sample' (equal weights, default) or 'ewma'
  --lambda L           EWMA decay, 0 < L < 1 (default 0.94)
  --mean KIND          daily mean: 'zero' (default) or 'sample' (estimated from the window)
  --returns KIND       returns the forecast is estimated from: 'simple' (default) or 'log';
                       the realised P&L always uses simple returns

Output:
  --json               one JSON object instead of the readable report
  --series             also every tested day: date, P&L, VaR, exception
  --help               this text

Exit status: 0 success, 1 bad input data (the message names file, line and column),
2 bad usage (the message names the option).

VaR is a loss that is not expected to be exceeded at the confidence given, not the worst case.
A backtest shows how the model would have done on this history; it does not promise how it will
do. Figures are estimates, for information only, not advice; regulatory use follows local rules
and approved models.
)";
}

} // namespace tailwise::cli

#include "modeloptions.h"
#include "optiontext.h"

#include <charconv>
#include <cmath>
#include <cstdint>

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

} // namespace

bool isModelOption(const std::string &o)
{
    return o == "--model" || o == "--dof" || o == "--hs-horizon" || o == "--simulations" || o == "--seed"
           || o == "--trade" || o == "--scenario";
}

bool isModelFlag(const std::string &o) { return o == "--worst-days"; }

Status applyModelOption(const std::string &option, const std::string &text, Assumptions &a, ModelRequest &request)
{
    if (option == "--model") {
        const auto v = parseRiskModel(text);
        if (!v)
            return usage(option, "expected 'normal', 'student-t', 'cornish-fisher', 'historical' or 'monte-carlo', found \""
                                     + text + "\"");
        a.model = *v;
    } else if (option == "--dof") {
        request.gaveDof = true;
        if (text == "fit") {
            a.dof = DegreesOfFreedom::fit();
        } else {
            const auto v = toDouble(text);
            if (!v)
                return usage(option, "expected degrees of freedom above 2 (e.g. 5) or 'fit', found \"" + text + "\"");
            a.dof = DegreesOfFreedom::given(*v);
        }
    } else if (option == "--hs-horizon") {
        request.gaveHsHorizon = true;
        const auto v = parseHistoricalHorizon(text);
        if (!v)
            return usage(option, "expected 'sqrt' or 'overlapping', found \"" + text + "\"");
        a.historicalHorizon = *v;
    } else if (option == "--simulations") {
        request.gaveSimulations = true;
        const auto v = toWhole<int>(text);
        if (!v)
            return usage(option, "expected a whole number of draws (e.g. 100000), found \"" + text + "\"");
        a.simulations = *v;
    } else if (option == "--seed") {
        request.gaveSeed = true;
        const auto v = toWhole<std::uint64_t>(text);
        if (!v || *v > maxSeed)
            return usage(option, "expected a whole number from 0 to 9007199254740991, found \"" + text + "\"");
        a.seed = *v;
    } else if (option == "--trade") {
        const std::size_t colon = text.rfind(':');
        if (colon == std::string::npos || colon == 0 || colon + 1 == text.size())
            return usage(option, "expected ASSET:CHANGE, e.g. DAX:-10 (a change in quantity), found \"" + text + "\"");
        const auto change = toDouble(text.substr(colon + 1));
        if (!change)
            return usage(option, "expected a number after the colon in \"" + text + "\" (a change in quantity, e.g. -10)");
        request.trades.push_back(Trade{text.substr(0, colon), *change});
    } else if (option == "--scenario") {
        if (text.empty())
            return usage(option, "expected a scenario file (CSV asset,shock)");
        request.scenarioPaths.push_back(text);
    }
    return Done{};
}

Status checkModelOptions(const Assumptions &a, const ModelRequest &r, bool singlePosition)
{
    const std::string model(toName(a.model));
    if (r.gaveDof && a.model != RiskModel::StudentT && a.model != RiskModel::MonteCarlo)
        return usage("--dof", "applies to --model student-t or monte-carlo, not " + model);
    if (r.gaveHsHorizon && a.model != RiskModel::Historical)
        return usage("--hs-horizon", "applies to --model historical, not " + model);
    if (r.gaveSimulations && a.model != RiskModel::MonteCarlo)
        return usage("--simulations", "applies to --model monte-carlo, not " + model);
    if (r.gaveSeed && a.model != RiskModel::MonteCarlo)
        return usage("--seed", "applies to --model monte-carlo, not " + model);
    if (singlePosition && !r.trades.empty())
        return usage("--trade", "needs a portfolio from --prices and --holdings (or --workbook)");
    if (singlePosition && r.wantsStress())
        return usage(r.scenarioPaths.empty() ? "--worst-days" : "--scenario",
                     "needs a portfolio from --prices and --holdings (or --workbook)");
    return Done{};
}

std::string modelHelpText()
{
    return R"(Models (--model NAME):
  normal               variance-covariance with normal P&L (default)
  student-t            the same spread with fatter tails: a Student-t scaled to the same variance
  cornish-fisher       the normal quantile corrected for the skewness and kurtosis of the
                       window's daily P&L
  historical           today's holdings replayed over the window's days; VaR is the loss at the
                       confidence level among them, ES the average of the losses beyond it
  monte-carlo          random scenarios drawn from the estimated means and covariance
  --dof NU|fit         Student-t degrees of freedom, above 2 (smaller = fatter tails), or 'fit' to
                       take them from the kurtosis of the window's P&L (the default for
                       student-t); with monte-carlo, draws t scenarios instead of normal ones
  --hs-horizon KIND    historical, horizon over 1 day: 'sqrt' scales the one-day figures by the
                       square root of the horizon (default); 'overlapping' uses sums of
                       consecutive daily P&L (overlapping, so fewer independent observations)
  --simulations N      monte-carlo draws, 1000 to 10000000 (default 100000); more draws, smaller
                       standard error
  --seed S             monte-carlo random seed, 0 to 9007199254740991 (default 1): the same seed
                       and inputs give the same figures

What-if and stress (need --prices and --holdings, or --workbook):
  --trade ASSET:CHANGE change the quantity of ASSET by CHANGE (e.g. DAX:-10; an asset of the
                       price history not yet held may be bought); repeat for several trades.
                       Shows VaR before and after, the exact change (incremental VaR) and its
                       first-order estimate from the marginal VaR
  --scenario FILE      a stress scenario, CSV 'asset,shock' with each shock a fraction of the
                       price (-0.2 = a 20% fall); repeatable; shows its P&L on today's holdings,
                       with the window's five worst days replayed on today's holdings
  --worst-days         the window's five worst days replayed on today's holdings, on their own
)";
}

} // namespace tailwise::cli

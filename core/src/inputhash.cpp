#include "tailwise/inputhash.h"

#include "tailwise/json.h"
#include "tailwise/sha256.h"

#include <algorithm>
#include <numeric>
#include <vector>

namespace tailwise {

namespace {

std::string dofText(const DegreesOfFreedom &d)
{
    switch (d.kind) {
    case DegreesOfFreedom::Kind::Unset: return "unset";
    case DegreesOfFreedom::Kind::Fit: return "fit";
    case DegreesOfFreedom::Kind::Given: return formatShortest(d.value);
    }
    return "unset";
}

void appendPrices(Sha256 &hash, const PriceHistory &prices)
{
    std::vector<int> order(prices.assets.size());
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(), [&](int a, int b) { return prices.assets[a] < prices.assets[b]; });
    std::string line = "prices\ndate";
    for (const int c : order)
        line += "," + prices.assets[c];
    line += "\n";
    hash.update(line);
    for (int r = 0; r < prices.dayCount(); ++r) {
        line = toIso(prices.dates[r]);
        for (const int c : order) {
            line += ',';
            line += formatShortest(prices.prices(r, c));
        }
        line += '\n';
        hash.update(line);
    }
}

std::string holdingsText(const Holdings &holdings)
{
    std::vector<const Holding *> sorted;
    for (const auto &h : holdings)
        sorted.push_back(&h);
    std::stable_sort(sorted.begin(), sorted.end(), [](const Holding *a, const Holding *b) { return a->asset < b->asset; });
    std::string out = "holdings\n";
    for (const Holding *h : sorted) {
        out += h->asset + "," + formatShortest(h->quantity) + ","
               + (h->priceOverride ? formatShortest(*h->priceOverride) : std::string("-")) + ","
               + (h->value ? formatShortest(*h->value) : std::string("-")) + "\n";
    }
    return out;
}

} // namespace

std::string canonicalAssumptionsText(const Assumptions &a)
{
    std::string out = "assumptions\n";
    out += "confidence=" + formatShortest(a.confidence) + "\n";
    out += "horizon=" + std::to_string(a.horizonDays) + "\n";
    out += "days_per_year=" + std::to_string(a.daysPerYear) + "\n";
    out += "window=" + (a.window ? std::to_string(*a.window) : std::string("all")) + "\n";
    out += "returns=" + std::string(toName(a.returns)) + "\n";
    out += "estimator=" + std::string(toName(a.estimator)) + "\n";
    out += "lambda=" + formatShortest(a.lambda) + "\n";
    out += "mean=" + std::string(toName(a.mean)) + "\n";
    out += "model=" + std::string(toName(a.model)) + "\n";
    out += "dof=" + dofText(a.dof) + "\n";
    out += "historical_horizon=" + std::string(toName(a.historicalHorizon)) + "\n";
    // Written only when not the default, so that the text (and the hash) of every input made
    // before the choice existed stays as it was.
    if (a.scaling != MultiDayScaling::SquareRoot)
        out += "scaling=" + std::string(toName(a.scaling)) + "\n";
    out += "simulations=" + std::to_string(a.simulations) + "\n";
    out += "seed=" + std::to_string(a.seed) + "\n";
    return out;
}

std::string canonicalInputText(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions)
{
    // Same bytes as inputSha256 hashes, gathered into one string.
    std::string out = "tailwise-inputs 1\n";
    std::vector<int> order(prices.assets.size());
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(), [&](int a, int b) { return prices.assets[a] < prices.assets[b]; });
    out += "prices\ndate";
    for (const int c : order)
        out += "," + prices.assets[c];
    out += "\n";
    for (int r = 0; r < prices.dayCount(); ++r) {
        out += toIso(prices.dates[r]);
        for (const int c : order) {
            out += ',';
            out += formatShortest(prices.prices(r, c));
        }
        out += '\n';
    }
    out += holdingsText(holdings);
    out += canonicalAssumptionsText(assumptions);
    return out;
}

std::string inputSha256(const PriceHistory &prices, const Holdings &holdings, const Assumptions &assumptions)
{
    Sha256 hash;
    hash.update("tailwise-inputs 1\n");
    appendPrices(hash, prices);
    hash.update(holdingsText(holdings));
    hash.update(canonicalAssumptionsText(assumptions));
    return hash.finishHex();
}

} // namespace tailwise

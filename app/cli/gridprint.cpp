#include "gridprint.h"

#include "numbertext.h"

#include <algorithm>

namespace tailwise::cli {

namespace {

std::string pad(const std::string &s, std::size_t width)
{
    return s.size() >= width ? s : std::string(width - s.size(), ' ') + s;
}

std::string confidenceLabel(double c)
{
    std::string s = fixed(100.0 * c, 2);
    while (!s.empty() && s.back() == '0')
        s.pop_back();
    if (!s.empty() && s.back() == '.')
        s.pop_back();
    return s + "%";
}

} // namespace

std::vector<int> gridHorizons(const RiskReport &r)
{
    std::vector<int> h{1, 5, 10, 21, 63, 252};
    if (std::find(h.begin(), h.end(), r.assumptions.horizonDays) == h.end())
        h.push_back(r.assumptions.horizonDays);
    std::sort(h.begin(), h.end());
    if (r.model.used == RiskModel::Historical && r.assumptions.historicalHorizon == HistoricalHorizon::Overlapping)
        std::erase_if(h, [&](int days) { return days > 1 && days > r.windowReturns - 1; });
    return h;
}

std::vector<double> gridConfidences(const RiskReport &r)
{
    std::vector<double> c{0.95, 0.975, 0.99, 0.995};
    if (std::find(c.begin(), c.end(), r.assumptions.confidence) == c.end())
        c.push_back(r.assumptions.confidence);
    std::sort(c.begin(), c.end());
    return c;
}

std::string gridText(const RiskReport &r, const RiskGrid &g)
{
    const bool scaled = r.model.used == RiskModel::StudentT || r.model.used == RiskModel::CornishFisher;
    std::string out = "\nVaR by horizon and confidence, every cell under the " + std::string(toName(r.model.used))
                      + " model"
                      + (!scaled ? ""
                         : r.assumptions.scaling == MultiDayScaling::Aggregate ? " applied to each horizon's sum of days"
                                                                               : " scaled by the square root of the horizon")
                      + " (the headline's cell is marked *)\n";
    out += pad("horizon", 10);
    for (double c : g.confidences)
        out += pad(confidenceLabel(c), 18);
    out += "\n";
    for (std::size_t h = 0; h < g.horizons.size(); ++h) {
        out += pad(std::to_string(g.horizons[h]) + "d", 10);
        for (std::size_t c = 0; c < g.confidences.size(); ++c) {
            const bool here = g.horizons[h] == r.assumptions.horizonDays && g.confidences[c] == r.assumptions.confidence;
            out += pad(money(g.varAt(h, c)) + (here ? "*" : " "), 18);
        }
        out += "\n";
    }
    return out;
}

void writeGridJson(JsonWriter &j, const RiskReport &r, const RiskGrid &g)
{
    j.key("grid").beginObject();
    j.key("model").value(toName(r.model.used));
    if (r.model.used == RiskModel::StudentT || r.model.used == RiskModel::CornishFisher)
        j.key("scaling").value(toName(r.assumptions.scaling));
    j.key("horizons_days").beginArray();
    for (int h : g.horizons)
        j.value(h);
    j.endArray();
    j.key("confidences").beginArray();
    for (double c : g.confidences)
        j.value(c);
    j.endArray();
    for (const char *key : {"var", "es"}) {
        j.key(key).beginArray();
        for (std::size_t h = 0; h < g.horizons.size(); ++h) {
            j.beginArray();
            for (std::size_t c = 0; c < g.confidences.size(); ++c)
                j.value(key[0] == 'v' ? g.varAt(h, c) : g.esAt(h, c));
            j.endArray();
        }
        j.endArray();
    }
    j.endObject();
}

} // namespace tailwise::cli

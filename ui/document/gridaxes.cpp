#include "document/gridaxes.h"

#include <algorithm>

namespace tailwise::ui {

int gridLastHorizon(const RiskReport &report)
{
    const Assumptions &a = report.assumptions;
    int last = std::max(1, a.daysPerYear);
    if (report.model.used == RiskModel::Historical && a.historicalHorizon == HistoricalHorizon::Overlapping)
        last = std::max(1, std::min(last, report.windowReturns - 1));
    return last;
}

std::vector<int> gridHorizons(const RiskReport &report)
{
    const int last = gridLastHorizon(report);
    std::vector<int> horizons(static_cast<std::size_t>(last));
    for (int h = 1; h <= last; ++h)
        horizons[static_cast<std::size_t>(h - 1)] = h;
    const int own = report.assumptions.horizonDays;
    if (own < 1 || own > last)
        horizons.push_back(own);
    return horizons;
}

} // namespace tailwise::ui

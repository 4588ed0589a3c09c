#include "varextras.h"

namespace tailwise::cli {

Result<ReportExtras> computeExtras(const ModelRequest &request, const PriceHistory &prices, const Holdings &holdings,
                                   const Assumptions &assumptions)
{
    ReportExtras extras;
    extras.trades = request.trades;
    if (!request.trades.empty()) {
        auto w = whatIf(prices, holdings, assumptions, request.trades);
        if (!w)
            return w.error();
        extras.whatIf = std::move(w).value();
    }
    if (request.wantsStress()) {
        std::vector<StressScenario> scenarios;
        for (const auto &path : request.scenarioPaths) {
            auto s = readScenarioCsv(path, &prices);
            if (!s)
                return s.error();
            scenarios.push_back(std::move(s).value());
        }
        auto outcomes = runStress(prices, holdings, assumptions, scenarios, 5);
        if (!outcomes)
            return outcomes.error();
        extras.stress = std::move(outcomes).value();
    }
    return extras;
}

} // namespace tailwise::cli

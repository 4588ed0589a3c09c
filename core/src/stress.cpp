#include "tailwise/stress.h"

#include "csvtext.h"

#include "tailwise/returns.h"
#include "tailwise/textlimits.h"

#include <algorithm>
#include <numeric>
#include <unordered_map>

namespace tailwise {

namespace {

std::string stem(const std::string &path)
{
    const std::size_t slash = path.find_last_of("/\\");
    std::string name = slash == std::string::npos ? path : path.substr(slash + 1);
    const std::size_t dot = name.find_last_of('.');
    if (dot != std::string::npos && dot > 0)
        name = name.substr(0, dot);
    return name;
}

} // namespace

Result<StressScenario> parseScenarioCsv(std::string_view text, const std::string &source, std::string name,
                                        const PriceHistory *prices)
{
    // The name (from the file's name) goes to JSON, the window and paper: the same text rules.
    if (const auto problem = checkText(name, maxNameChars))
        return fileError(ErrorKind::Format, source, 0, 0, describeTextProblem(*problem, "the scenario's name (its file name)", maxNameChars));
    csv::HeaderedRows rows(text, source, {{"asset", "shock"}, "asset and shock", "a header 'asset,shock'", "shocks", 100000});
    if (auto header = rows.readHeader(); !header)
        return header.error();
    const int headerLine = rows.headerLine();
    const int assetCol = rows.column("asset"), shockCol = rows.column("shock");
    if (assetCol < 0 || shockCol < 0)
        return rows.errorAtLine(ErrorKind::Format, headerLine, "expected the columns 'asset' and 'shock'");

    StressScenario scenario;
    scenario.name = std::move(name);
    std::unordered_map<std::string, int> firstLine;
    while (true) {
        auto more = rows.next();
        if (!more)
            return more.error();
        if (!more.value())
            break;
        const int lineNo = rows.lineNumber();
        std::string asset(rows.cell(assetCol));
        if (asset.empty())
            return rows.error(ErrorKind::Format, assetCol, "expected an asset name, found an empty cell");
        if (const auto problem = checkText(asset, maxNameChars))
            return rows.error(ErrorKind::Format, assetCol, describeTextProblem(*problem, "the asset name", maxNameChars));
        if (prices && prices->assetIndex(asset) < 0)
            return rows.error(ErrorKind::Reference, assetCol, "the price history has no asset named \"" + asset + "\"");
        if (const auto seen = firstLine.find(asset); seen != firstLine.end())
            return rows.error(ErrorKind::Reference, assetCol,
                              "the asset \"" + asset + "\" is already shocked on line " + std::to_string(seen->second));
        firstLine.emplace(asset, lineNo);
        const auto shockText = rows.cell(shockCol);
        const auto shock = csv::parseNumber(shockText);
        if (!shock)
            return rows.error(ErrorKind::Value, shockCol,
                              "expected a shock as a fraction (a finite number, e.g. -0.2 for a 20% fall), found "
                                  + csv::quoteForMessage(shockText));
        if (*shock <= -1.0)
            return rows.error(ErrorKind::Value, shockCol,
                              "expected a shock above -1 (a price cannot fall by 100% or more), found " + std::string(shockText));
        scenario.shocks.emplace_back(std::move(asset), *shock);
    }
    if (scenario.shocks.empty())
        return rows.errorAtLine(ErrorKind::Format, headerLine, "the scenario has no rows: expected asset,shock lines");
    return scenario;
}

Result<StressScenario> readScenarioCsv(const std::string &path, const PriceHistory *prices)
{
    auto text = csv::readFileText(path, 64u * 1024u * 1024u);
    if (!text)
        return text.error();
    return parseScenarioCsv(text.value(), path, stem(path), prices);
}

double scenarioPnl(const StressScenario &scenario, const PriceHistory &prices, const Holdings &holdings)
{
    double pnl = 0.0;
    for (const auto &h : holdings)
        for (const auto &[asset, shock] : scenario.shocks)
            if (asset == h.asset)
                pnl += holdingExposure(h, prices) * shock;
    return pnl;
}

Result<std::vector<StressOutcome>> worstDays(const PriceHistory &prices, const Holdings &holdings,
                                             const Assumptions &assumptions, int count)
{
    if (auto ok = checkHoldings(holdings, prices); !ok)
        return ok.error();
    // The window is checked by selectWindow on a one-asset stand-in (its rules depend on the
    // number of days alone), and the P&L is formed from the held assets' prices directly: the
    // window reruns this on every edit, and every asset's returns would be a large new matrix.
    PriceHistory days;
    days.dates = prices.dates;
    days.prices = prices.prices.leftCols(std::min<Eigen::Index>(1, prices.prices.cols()));
    days.assets.resize(static_cast<std::size_t>(days.prices.cols()));
    auto window = selectWindow(days, ReturnType::Simple, assumptions.window);
    if (!window)
        return window.error();
    const Eigen::Index n = window.value().returns.rows();
    const Eigen::Index first = prices.prices.rows() - (n + 1); // the price before the first return
    // Columns by one hash map rather than a scan of the assets per holding. The first of a name,
    // as assetIndex gives it.
    std::unordered_map<std::string_view, Eigen::Index> column;
    column.reserve(prices.assets.size());
    for (std::size_t a = 0; a < prices.assets.size(); ++a)
        column.emplace(prices.assets[a], static_cast<Eigen::Index>(a));
    const Eigen::Index lastRow = prices.prices.rows() - 1;
    Eigen::VectorXd pnl = Eigen::VectorXd::Zero(n);
    for (const auto &h : holdings) {
        const Eigen::Index c = column.at(h.asset);
        // holdingExposure (holdings.h) with the column already found; the simple return of
        // returns.h, P_t / P_{t−1} − 1.
        const double exposure = h.value ? *h.value : h.quantity * (h.priceOverride ? *h.priceOverride : prices.prices(lastRow, c));
        const auto before = prices.prices.col(c).segment(first, n).array();
        const auto now = prices.prices.col(c).segment(first + 1, n).array();
        pnl += exposure * (now / before - 1.0).matrix();
    }
    const Eigen::Index rowsInWindow = n;
    // Row j of the window is the return ending on date dates[T − N + j].
    const std::size_t firstDate = prices.dates.size() - static_cast<std::size_t>(rowsInWindow);
    std::vector<Eigen::Index> order(static_cast<std::size_t>(rowsInWindow));
    std::iota(order.begin(), order.end(), Eigen::Index{0});
    std::stable_sort(order.begin(), order.end(), [&](Eigen::Index a, Eigen::Index b) { return pnl(a) < pnl(b); });
    std::vector<StressOutcome> out;
    for (std::size_t k = 0; k < order.size() && static_cast<int>(k) < count; ++k) {
        const Eigen::Index j = order[k];
        out.push_back(StressOutcome{"worst day " + std::to_string(k + 1), pnl(j),
                                    prices.dates[firstDate + static_cast<std::size_t>(j)]});
    }
    return out;
}

Result<std::vector<StressOutcome>> runStress(const PriceHistory &prices, const Holdings &holdings,
                                             const Assumptions &assumptions,
                                             const std::vector<StressScenario> &scenarios, int worstDayCount)
{
    if (auto ok = checkHoldings(holdings, prices); !ok)
        return ok.error();
    std::vector<StressOutcome> out;
    for (const auto &s : scenarios)
        out.push_back(StressOutcome{s.name, scenarioPnl(s, prices, holdings), std::nullopt});
    if (worstDayCount > 0) {
        auto worst = worstDays(prices, holdings, assumptions, worstDayCount);
        if (!worst)
            return worst.error();
        out.insert(out.end(), worst.value().begin(), worst.value().end());
    }
    return out;
}

} // namespace tailwise

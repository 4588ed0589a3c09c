#include "tailwise/holdings.h"
#include "tailwise/textlimits.h"

#include "csvtext.h"

#include <charconv>
#include <unordered_map>
#include <unordered_set>

namespace tailwise {

Result<Holdings> parseHoldingsCsv(std::string_view text, const std::string &source, const PriceHistory *prices)
{
    csv::HeaderedRows rows(text, source,
                           {{"asset", "quantity", "price", "value"},
                            "asset, quantity, price or value",
                            "a header 'asset,quantity' (optionally ',price') or 'asset,value'",
                            "holdings",
                            100000});
    if (auto header = rows.readHeader(); !header)
        return header.error();
    const int headerLine = rows.headerLine();
    const int assetCol = rows.column("asset"), quantityCol = rows.column("quantity");
    const int priceCol = rows.column("price"), valueCol = rows.column("value");
    if (assetCol < 0)
        return rows.errorAtLine(ErrorKind::Format, headerLine, "expected an 'asset' column");
    if ((quantityCol < 0) == (valueCol < 0))
        return rows.errorAtLine(ErrorKind::Format, headerLine, "expected exactly one of the columns 'quantity' or 'value'");
    if (valueCol >= 0 && priceCol >= 0)
        return fileError(ErrorKind::Format, source, headerLine, priceCol + 1,
                         "a 'price' column applies to quantities, not to holdings given by 'value'");

    Holdings holdings;
    std::unordered_map<std::string, int> firstLine;
    while (true) {
        auto more = rows.next();
        if (!more)
            return more.error();
        if (!more.value())
            break;
        const int lineNo = rows.lineNumber();
        Holding holding;
        holding.asset = std::string(rows.cell(assetCol));
        if (holding.asset.empty())
            return rows.error(ErrorKind::Format, assetCol, "expected an asset name, found an empty cell");
        if (const auto problem = checkText(holding.asset, maxNameChars))
            return rows.error(ErrorKind::Format, assetCol, describeTextProblem(*problem, "the asset name", maxNameChars));
        auto number = [&](int col, const char *what) -> Result<double> {
            const auto text = rows.cell(col);
            const auto v = csv::parseNumber(text);
            if (!v)
                return rows.error(ErrorKind::Value, col,
                                  std::string("expected ") + what + " (a finite number), found " + csv::quoteForMessage(text));
            return *v;
        };
        if (quantityCol >= 0) {
            auto q = number(quantityCol, "a quantity");
            if (!q)
                return q.error();
            holding.quantity = q.value();
        } else {
            auto v = number(valueCol, "a value");
            if (!v)
                return v.error();
            holding.value = v.value();
        }
        if (priceCol >= 0 && !rows.cell(priceCol).empty()) {
            auto p = number(priceCol, "a price");
            if (!p)
                return p.error();
            if (p.value() <= 0.0)
                return rows.error(ErrorKind::Value, priceCol,
                                  "expected a price greater than zero, found " + std::string(rows.cell(priceCol)));
            holding.priceOverride = p.value();
        }
        if (prices && prices->assetIndex(holding.asset) < 0)
            return rows.error(ErrorKind::Reference, assetCol,
                              "the asset \"" + holding.asset + "\" is not in the price history"
                                  + (prices->sourceName.empty() ? std::string() : " (" + prices->sourceName + ")"));
        const auto [it, inserted] = firstLine.emplace(holding.asset, lineNo);
        if (!inserted)
            return rows.error(ErrorKind::Reference, assetCol,
                              "the asset \"" + holding.asset + "\" is listed twice (first on line "
                                  + std::to_string(it->second) + ")");
        holdings.push_back(std::move(holding));
    }
    if (holdings.empty())
        return rows.errorAtLine(ErrorKind::InsufficientData, headerLine + 1, "the file has a header but no holdings");
    return holdings;
}

Result<Holdings> readHoldingsCsv(const std::string &path, const PriceHistory *prices)
{
    auto text = csv::readFileText(path, 64u * 1024u * 1024u);
    if (!text)
        return text.error();
    return parseHoldingsCsv(text.value(), path, prices);
}

std::string writeHoldingsCsv(const Holdings &holdings)
{
    bool anyValue = false, anyQuantity = false, anyOverride = false;
    for (const auto &h : holdings) {
        anyValue |= h.value.has_value();
        anyQuantity |= !h.value.has_value();
        anyOverride |= h.priceOverride.has_value();
    }
    auto number = [](double v) {
        char buffer[64];
        const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, v);
        return std::string(buffer, end);
    };
    auto name = [](const std::string &s) {
        // Quote what the reader would otherwise change: separators, quotes, blanks at either end.
        const bool blankEnd = !s.empty() && (s.front() == ' ' || s.front() == '\t' || s.back() == ' ' || s.back() == '\t'
                                             || s.back() == '\r');
        if (s.find_first_of(",\"") == std::string::npos && !blankEnd)
            return s;
        std::string out = "\"";
        for (char c : s) {
            if (c == '"')
                out += '"';
            out += c;
        }
        return out + "\"";
    };
    std::string out;
    if (anyValue && !anyQuantity) {
        out = "asset,value\n";
        for (const auto &h : holdings)
            out += name(h.asset) + "," + number(*h.value) + "\n";
        return out;
    }
    // Quantities (a holding given by value is written as an equivalent quantity at price 1 would
    // lose meaning, so value holdings are written with their value as quantity × override 1).
    out = anyOverride || anyValue ? "asset,quantity,price\n" : "asset,quantity\n";
    for (const auto &h : holdings) {
        out += name(h.asset) + ",";
        if (h.value) {
            out += number(*h.value);
            out += ",1\n";
            continue;
        }
        out += number(h.quantity);
        if (anyOverride || anyValue) {
            out += ',';
            if (h.priceOverride)
                out += number(*h.priceOverride);
        }
        out += "\n";
    }
    return out;
}

double holdingPrice(const Holding &holding, const PriceHistory &prices)
{
    if (holding.priceOverride)
        return *holding.priceOverride;
    const int index = prices.assetIndex(holding.asset);
    assert(index >= 0 && prices.prices.rows() > 0);
    return prices.prices(prices.prices.rows() - 1, index);
}

double holdingExposure(const Holding &holding, const PriceHistory &prices)
{
    if (holding.value)
        return *holding.value;
    return holding.quantity * holdingPrice(holding, prices);
}

Status checkHoldings(const Holdings &holdings, const PriceHistory &prices)
{
    // One hash look-up per holding rather than a scan of the assets: a large book is checked on
    // every edit in the window.
    const std::unordered_set<std::string_view> known(prices.assets.begin(), prices.assets.end());
    std::unordered_map<std::string_view, std::size_t> seen;
    for (std::size_t i = 0; i < holdings.size(); ++i) {
        const auto &h = holdings[i];
        if (!known.contains(h.asset))
            return fieldError(ErrorKind::Reference, "holding " + std::to_string(i + 1),
                              "the asset \"" + h.asset + "\" is not in the price history");
        const auto [it, inserted] = seen.emplace(h.asset, i);
        if (!inserted)
            return fieldError(ErrorKind::Reference, "holding " + std::to_string(i + 1),
                              "the asset \"" + h.asset + "\" is already held in holding " + std::to_string(it->second + 1));
    }
    return Done{};
}

} // namespace tailwise

#include "tailwise/prices.h"

#include "csvtext.h"

#include <charconv>
#include <cmath>
#include <limits>
#include <unordered_set>

namespace tailwise {

int PriceHistory::assetIndex(std::string_view name) const
{
    for (std::size_t i = 0; i < assets.size(); ++i)
        if (assets[i] == name)
            return static_cast<int>(i);
    return -1;
}

namespace {

bool equalsIgnoreCase(std::string_view a, std::string_view b)
{
    if (a.size() != b.size())
        return false;
    for (std::size_t i = 0; i < a.size(); ++i) {
        char x = a[i], y = b[i];
        if (x >= 'A' && x <= 'Z') x = static_cast<char>(x - 'A' + 'a');
        if (y >= 'A' && y <= 'Z') y = static_cast<char>(y - 'A' + 'a');
        if (x != y)
            return false;
    }
    return true;
}

std::string plural(std::size_t n, const char *one, const char *many)
{
    return std::to_string(n) + " " + (n == 1 ? one : many);
}

} // namespace

Result<PriceHistory> parsePriceCsv(std::string_view text, const std::string &source)
{
    if (text.size() > PriceLimits::maxFileBytes)
        return fileError(ErrorKind::FileUnreadable, source, 0, 0, "the text is over the size limit");
    csv::LineReader lines(text);
    std::string_view line;
    // Header: the first non-blank line.
    bool haveHeader = false;
    while (lines.next(line)) {
        if (line.size() > PriceLimits::maxLineBytes)
            return fileError(ErrorKind::Format, source, lines.lineNumber(), 0,
                             "the line is longer than the limit of 1 MiB");
        if (!line.empty()) {
            haveHeader = true;
            break;
        }
    }
    if (!haveHeader)
        return fileError(ErrorKind::Format, source, 0, 0,
                         "the file is empty: expected a header line 'date,<asset>,<asset>,…'");
    const int headerLine = lines.lineNumber();
    auto header = csv::splitLine(line, source, headerLine);
    if (!header)
        return header.error();
    const auto &cells = header.value();
    if (!equalsIgnoreCase(cells[0].value(), "date"))
        return fileError(ErrorKind::Format, source, headerLine, 1,
                         "expected the first column to be named 'date', found " + csv::quoteForMessage(cells[0].value()));
    if (cells.size() < 2)
        return fileError(ErrorKind::Format, source, headerLine, 2,
                         "expected at least one asset column after 'date'");
    if (cells.size() - 1 > PriceLimits::maxAssets)
        return fileError(ErrorKind::Format, source, headerLine, 0,
                         "the header has " + std::to_string(cells.size() - 1) + " assets, over the limit of "
                             + std::to_string(PriceLimits::maxAssets));

    PriceHistory history;
    history.sourceName = source;
    std::unordered_set<std::string> seen;
    for (std::size_t c = 1; c < cells.size(); ++c) {
        std::string name(cells[c].value());
        if (name.empty())
            return fileError(ErrorKind::Format, source, headerLine, cells[c].column,
                             "expected an asset name, found an empty cell");
        if (!seen.insert(name).second)
            return fileError(ErrorKind::Reference, source, headerLine, cells[c].column,
                             "the asset \"" + name + "\" appears twice in the header");
        history.assets.push_back(std::move(name));
    }
    const std::size_t n = history.assets.size();
    const double missing = std::numeric_limits<double>::quiet_NaN();

    std::vector<double> values; // row-major while reading
    values.reserve(std::min(PriceLimits::maxCells, n * std::max<std::size_t>(1, text.size() / (8 * (n + 1)))));
    std::size_t gapCount = 0;
    while (lines.next(line)) {
        const int lineNo = lines.lineNumber();
        if (line.size() > PriceLimits::maxLineBytes)
            return fileError(ErrorKind::Format, source, lineNo, 0, "the line is longer than the limit of 1 MiB");
        if (line.empty())
            continue;
        if (history.dates.size() >= PriceLimits::maxRows)
            return fileError(ErrorKind::Format, source, lineNo, 0,
                             "more than " + std::to_string(PriceLimits::maxRows) + " rows: over the limit");
        if ((history.dates.size() + 1) * n > PriceLimits::maxCells)
            return fileError(ErrorKind::Format, source, lineNo, 0,
                             "more than " + std::to_string(PriceLimits::maxCells) + " prices in all (rows × "
                                 + std::to_string(n) + " assets): over the limit");
        std::optional<Error> failure;
        const std::size_t rowStart = values.size();
        values.resize(rowStart + n, missing);
        const int count = csv::forEachCell(line, [&](int index, std::string_view cell) {
            const int column = index + 1;
            if (index == 0) {
                const auto date = parseIsoDate(cell);
                if (!date) {
                    failure = fileError(ErrorKind::Format, source, lineNo, column,
                                        "expected a date as YYYY-MM-DD, found " + csv::quoteForMessage(cell));
                    return false;
                }
                if (!history.dates.empty() && *date <= history.dates.back()) {
                    failure = fileError(ErrorKind::Format, source, lineNo, column,
                                        "dates must strictly increase: " + std::string(cell)
                                            + " does not come after " + toIso(history.dates.back()));
                    return false;
                }
                history.dates.push_back(*date);
                return true;
            }
            if (static_cast<std::size_t>(index) > n) {
                failure = fileError(ErrorKind::Format, source, lineNo, column,
                                    "the row has more cells than the header's " + std::to_string(n + 1));
                return false;
            }
            if (cell.empty()) {
                ++gapCount;
                return true;
            }
            const auto price = csv::parseNumber(cell);
            if (!price) {
                const std::string what = csv::isNonFiniteLiteral(cell)
                    ? "expected a finite price, found " + csv::quoteForMessage(cell)
                    : "expected a price (a number), found " + csv::quoteForMessage(cell);
                failure = fileError(ErrorKind::Value, source, lineNo, column, what);
                return false;
            }
            if (*price <= 0.0) {
                failure = fileError(ErrorKind::Value, source, lineNo, column,
                                    "expected a price greater than zero, found " + std::string(cell));
                return false;
            }
            values[rowStart + static_cast<std::size_t>(index) - 1] = *price;
            return true;
        });
        if (failure)
            return *failure;
        if (count < static_cast<int>(n) + 1)
            return fileError(ErrorKind::Format, source, lineNo, count + 1,
                             "the row has " + std::to_string(count) + " cells, expected "
                                 + std::to_string(n + 1) + " as in the header");
    }
    const std::size_t rows = history.dates.size();
    if (rows == 0)
        return fileError(ErrorKind::InsufficientData, source, headerLine + 1, 0,
                         "the file has a header but no prices: expected at least 3 rows of prices");

    // Gap handling: carry the previous price forward; drop the rows before every asset has one.
    std::size_t firstFullRow = 0;
    for (std::size_t a = 0; a < n; ++a) {
        std::size_t r = 0;
        while (r < rows && std::isnan(values[r * n + a]))
            ++r;
        if (r == rows)
            return fileError(ErrorKind::InsufficientData, source, headerLine, static_cast<int>(a) + 2,
                             "the asset \"" + history.assets[a] + "\" has no price on any row");
        firstFullRow = std::max(firstFullRow, r);
    }
    std::size_t leadingGaps = 0;
    for (std::size_t r = 0; r < firstFullRow; ++r)
        for (std::size_t a = 0; a < n; ++a)
            leadingGaps += std::isnan(values[r * n + a]) ? 1 : 0;
    const std::size_t keptRows = rows - firstFullRow;
    history.prices.resize(static_cast<Eigen::Index>(keptRows), static_cast<Eigen::Index>(n));
    std::size_t filled = 0;
    for (std::size_t r = 0; r < keptRows; ++r) {
        for (std::size_t a = 0; a < n; ++a) {
            double v = values[(r + firstFullRow) * n + a];
            if (std::isnan(v)) {
                if (r > 0) {
                    v = history.prices(static_cast<Eigen::Index>(r) - 1, static_cast<Eigen::Index>(a));
                } else {
                    // A gap on the first kept row: this asset's previous price lies on a dropped
                    // row (it had one before firstFullRow, or firstFullRow would be later).
                    std::size_t back = firstFullRow;
                    while (std::isnan(values[(back - 1) * n + a]))
                        --back;
                    v = values[(back - 1) * n + a];
                }
                ++filled;
            }
            history.prices(static_cast<Eigen::Index>(r), static_cast<Eigen::Index>(a)) = v;
        }
    }
    if (firstFullRow > 0) {
        history.dates.erase(history.dates.begin(), history.dates.begin() + static_cast<std::ptrdiff_t>(firstFullRow));
        history.warnings.push_back(source + ": dropped the first " + plural(firstFullRow, "row", "rows")
                                   + " (" + plural(leadingGaps, "empty cell", "empty cells")
                                   + ") before every asset had a price");
    }
    if (filled > 0)
        history.warnings.push_back(source + ": " + plural(filled, "empty price was", "empty prices were")
                                   + " filled with the previous day's price (a zero return that day)");
    (void)gapCount;
    if (history.dates.size() < 3)
        return fileError(ErrorKind::InsufficientData, source, 0, 0,
                         "only " + plural(history.dates.size(), "row", "rows")
                             + " of prices: expected at least 3 to estimate anything");
    return history;
}

Result<PriceHistory> readPriceCsv(const std::string &path)
{
    auto text = csv::readFileText(path, PriceLimits::maxFileBytes);
    if (!text)
        return text.error();
    return parsePriceCsv(text.value(), path);
}

namespace {
void appendCsvName(std::string &out, const std::string &name)
{
    // Quote what the reader would otherwise change: separators, quotes, and blanks at either end
    // (an unquoted cell is trimmed).
    const bool blankEnd = !name.empty() && (name.front() == ' ' || name.front() == '\t' || name.back() == ' ' || name.back() == '\t'
                                               || name.back() == '\r');
    if (name.find_first_of(",\"") == std::string::npos && !blankEnd) {
        out += name;
        return;
    }
    out += '"';
    for (char c : name) {
        if (c == '"')
            out += '"';
        out += c;
    }
    out += '"';
}
} // namespace

std::string writePriceCsv(const PriceHistory &history)
{
    std::string out = "date";
    for (const auto &name : history.assets) {
        out += ',';
        appendCsvName(out, name);
    }
    out += '\n';
    char buffer[64];
    for (Eigen::Index r = 0; r < history.prices.rows(); ++r) {
        out += toIso(history.dates[static_cast<std::size_t>(r)]);
        for (Eigen::Index c = 0; c < history.prices.cols(); ++c) {
            const auto [end, ec] = std::to_chars(buffer, buffer + sizeof buffer, history.prices(r, c));
            out += ',';
            out.append(buffer, end);
        }
        out += '\n';
    }
    return out;
}

} // namespace tailwise

#include "tailwise/prices.h"
#include "tailwise/pricecheck.h"
#include "tailwise/textlimits.h"

#include "csvtext.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <limits>
#include <optional>
#include <thread>
#include <unordered_set>
#include <vector>

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

struct DataLine {
    std::string_view text;
    int lineNumber = 0;
};

struct RowDate {
    Date date;
    bool parsed = false; // the row's first cell was a valid date
};

struct ChunkFailure {
    std::size_t row = 0;
    std::optional<Error> error;
};

// Threads for `rows` × `assets` cells: one per hardware thread for a large file, one below about
// 10⁵ cells, where starting a thread costs more than it saves (common practice).
std::size_t chunkCount(std::size_t rows, std::size_t assets)
{
    if (rows * assets < 100000 || rows < 2)
        return 1;
    const std::size_t hardware = std::max(1u, std::thread::hardware_concurrency());
    return std::min({hardware, rows, std::size_t{16}});
}

// The common row, "YYYY-MM-DD,p,p,…,p" with every price a plain positive number and nothing else
// in the cells, read in one pass without looking for the commas first. False for anything else
// (a gap, a blank, a quote, a sign, a bad cell, a wrong count): parseRow then reads the row the
// general way, which gives the same prices and the message.
bool parsePlainRow(std::string_view line, std::size_t assets, double *prices, std::size_t stride, RowDate &date)
{
    if (line.size() < 11 || line[10] != ',')
        return false;
    const auto parsed = parseIsoDate(line.substr(0, 10));
    if (!parsed)
        return false;
    const char *at = line.data() + 11;
    const char *const last = line.data() + line.size();
    for (std::size_t a = 0; a < assets; ++a) {
        at = csv::parsePositivePrefix(at, last, prices[a * stride]);
        if (!at)
            return false;
        if (a + 1 < assets) {
            if (at == last || *at != ',')
                return false;
            ++at;
        }
    }
    if (at != last)
        return false;
    date = RowDate{*parsed, true};
    return true;
}

// One data row: the date into `date`, asset a's price into `prices[a · stride]` (a column of the
// column-major matrix; a gap is NaN). The first error on the line, or nothing.
std::optional<Error> parseRow(const DataLine &line, std::size_t assets, const std::string &source, double *prices,
                              std::size_t stride, RowDate &date)
{
    if (parsePlainRow(line.text, assets, prices, stride, date))
        return std::nullopt;
    for (std::size_t a = 0; a < assets; ++a) // gaps, and whatever a partial fast pass wrote
        prices[a * stride] = std::numeric_limits<double>::quiet_NaN();
    std::optional<Error> failure;
    const int lineNo = line.lineNumber;
    const int count = csv::forEachCell(line.text, [&](int index, std::string_view cell) {
        const int column = index + 1;
        if (index == 0) {
            const auto parsed = parseIsoDate(cell);
            if (!parsed) {
                failure = fileError(ErrorKind::Format, source, lineNo, column,
                                    "expected a date as YYYY-MM-DD, found " + csv::quoteForMessage(cell));
                return false;
            }
            date = RowDate{*parsed, true};
            return true;
        }
        if (static_cast<std::size_t>(index) > assets) {
            failure = fileError(ErrorKind::Format, source, lineNo, column,
                                "the row has more cells than the header's " + std::to_string(assets + 1));
            return false;
        }
        if (cell.empty())
            return true;
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
        if (!std::isnormal(*price)) {
            failure = fileError(ErrorKind::Value, source, lineNo, column,
                                "the price " + std::string(cell)
                                    + " is too small to compute with (below 2.2e-308, a subnormal number)");
            return false;
        }
        prices[static_cast<std::size_t>(index - 1) * stride] = *price;
        return true;
    });
    if (failure)
        return failure;
    if (count < static_cast<int>(assets) + 1)
        return fileError(ErrorKind::Format, source, lineNo, count + 1,
                         "the row has " + std::to_string(count) + " cells, expected " + std::to_string(assets + 1)
                             + " as in the header");
    return std::nullopt;
}

} // namespace

std::optional<UnusablePrice> findUnusablePrice(const Eigen::MatrixXd &prices)
{
    std::optional<UnusablePrice> first;
    for (Eigen::Index a = 0; a < prices.cols(); ++a) {
        const double *column = prices.col(a).data();
        const auto rows = static_cast<std::size_t>(prices.rows());
        const std::size_t limit = first ? first->row : rows; // only an earlier row can come first
        for (std::size_t r = 0; r < limit; ++r) {
            const double p = column[r];
            std::string why;
            if (!std::isnormal(p) || p < 0.0)
                why = "is too small to compute with (below 2.2e-308, a subnormal number)";
            else if (r > 0 && !std::isnormal(p / column[r - 1]))
                why = "differs from the previous day's price by a factor too large to compute a return with "
                      "(the ratio overflows or underflows)";
            if (!why.empty()) {
                first = UnusablePrice{r, static_cast<std::size_t>(a), std::move(why)};
                break;
            }
        }
    }
    return first;
}

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
        if (const auto problem = checkText(name, maxNameChars))
            return fileError(ErrorKind::Format, source, headerLine, cells[c].column,
                             describeTextProblem(*problem, "the asset name", maxNameChars));
        if (!seen.insert(name).second)
            return fileError(ErrorKind::Reference, source, headerLine, cells[c].column,
                             "the asset \"" + name + "\" appears twice in the header");
        history.assets.push_back(std::move(name));
    }
    const std::size_t n = history.assets.size();

    // First pass, in file order: the data lines, up to a line that ends the reading early (too
    // long, or over a row or cell limit) — that line's error is reported only if no earlier line
    // has one. The cost is one scan for line ends.
    std::vector<DataLine> dataLines;
    std::optional<Error> stoppedAt;
    while (lines.next(line)) {
        const int lineNo = lines.lineNumber();
        if (line.size() > PriceLimits::maxLineBytes) {
            stoppedAt = fileError(ErrorKind::Format, source, lineNo, 0, "the line is longer than the limit of 1 MiB");
            break;
        }
        if (line.empty())
            continue;
        if (dataLines.size() >= PriceLimits::maxRows) {
            stoppedAt = fileError(ErrorKind::Format, source, lineNo, 0,
                                  "more than " + std::to_string(PriceLimits::maxRows) + " rows: over the limit");
            break;
        }
        if ((dataLines.size() + 1) * n > PriceLimits::maxCells) {
            stoppedAt = fileError(ErrorKind::Format, source, lineNo, 0,
                                  "more than " + std::to_string(PriceLimits::maxCells) + " prices in all (rows × "
                                      + std::to_string(n) + " assets): over the limit");
            break;
        }
        dataLines.push_back(DataLine{line, lineNo});
    }

    // Second pass: the rows' cells, in contiguous chunks on the hardware threads. Each chunk stops
    // at its first bad row; the row reported is the first bad one in file order, so the message
    // is the one a reading from top to bottom would give, whatever the number of threads.
    // Straight into the column-major matrix: no second copy of the prices, and no pass to fill it
    // first (every row writes all its cells).
    const std::size_t rows = dataLines.size();
    history.prices.resize(static_cast<Eigen::Index>(rows), static_cast<Eigen::Index>(n));
    double *const values = history.prices.data(); // asset a's price on row r at values[a · rows + r]
    std::vector<RowDate> dates(rows);
    const std::size_t chunks = chunkCount(rows, n);
    std::vector<ChunkFailure> failures(chunks);
    auto parseChunk = [&](std::size_t chunk) {
        const std::size_t first = rows * chunk / chunks, last = rows * (chunk + 1) / chunks;
        for (std::size_t r = first; r < last; ++r) {
            if (auto error = parseRow(dataLines[r], n, source, values + r, rows, dates[r])) {
                failures[chunk] = ChunkFailure{r, std::move(error)};
                return;
            }
        }
    };
    {
        std::vector<std::jthread> pool;
        for (std::size_t c = 1; c < chunks; ++c)
            pool.emplace_back(parseChunk, c);
        parseChunk(0);
    }
    std::size_t badRow = rows;
    const ChunkFailure *firstFailure = nullptr;
    for (const auto &f : failures)
        if (f.error && f.row < badRow) {
            badRow = f.row;
            firstFailure = &f;
        }
    // Dates must strictly increase: checked here, in file order, up to the first bad row (whose
    // date comes first on its line, so an order error there precedes its other errors).
    for (std::size_t r = 1; r < rows && r <= badRow; ++r) {
        if (!dates[r].parsed)
            break;
        if (dates[r].date <= dates[r - 1].date)
            return fileError(ErrorKind::Format, source, dataLines[r].lineNumber, 1,
                             "dates must strictly increase: " + toIso(dates[r].date) + " does not come after "
                                 + toIso(dates[r - 1].date));
    }
    if (firstFailure)
        return *firstFailure->error;
    if (stoppedAt)
        return *stoppedAt;
    history.dates.reserve(rows);
    for (const auto &d : dates)
        history.dates.push_back(d.date);
    if (rows == 0)
        return fileError(ErrorKind::InsufficientData, source, headerLine + 1, 0,
                         "the file has a header but no prices: expected at least 3 rows of prices");

    // Gap handling: carry the previous price forward; drop the rows before every asset has one.
    std::size_t firstFullRow = 0;
    for (std::size_t a = 0; a < n; ++a) {
        const double *column = values + a * rows;
        std::size_t r = 0;
        while (r < rows && std::isnan(column[r]))
            ++r;
        if (r == rows)
            return fileError(ErrorKind::InsufficientData, source, headerLine, static_cast<int>(a) + 2,
                             "the asset \"" + history.assets[a] + "\" has no price on any row");
        firstFullRow = std::max(firstFullRow, r);
    }
    // Fill each column downwards: a gap takes the (already filled) price of the row above; on the
    // first kept row, the asset's last price on a dropped row (it has one, or firstFullRow would be
    // later).
    std::size_t leadingGaps = 0, filled = 0;
    for (std::size_t a = 0; a < n; ++a) {
        double *column = values + a * rows;
        for (std::size_t r = 0; r < firstFullRow; ++r)
            leadingGaps += std::isnan(column[r]) ? 1 : 0;
        for (std::size_t r = firstFullRow; r < rows; ++r) {
            if (!std::isnan(column[r]))
                continue;
            std::size_t back = r;
            while (std::isnan(column[back - 1]))
                --back;
            column[r] = column[back - 1];
            ++filled;
        }
    }
    if (firstFullRow > 0) {
        const Eigen::MatrixXd kept = history.prices.bottomRows(static_cast<Eigen::Index>(rows - firstFullRow));
        history.prices = kept;
    }
    // Prices every return can be formed from (a subnormal, or a ratio that overflows, would give a
    // return of zero or infinity): checked on the kept rows, named by line and column.
    if (const auto bad = findUnusablePrice(history.prices)) {
        const auto column = static_cast<std::ptrdiff_t>(bad->asset) + 2;
        return fileError(ErrorKind::Value, source, dataLines[bad->row + firstFullRow].lineNumber, static_cast<int>(column),
                         "the price of \"" + history.assets[bad->asset] + "\" " + bad->why);
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
    if (history.dates.size() < 3)
        return fileError(ErrorKind::InsufficientData, source, 0, 0,
                         "only " + plural(history.dates.size(), "row", "rows")
                             + " of prices: expected at least 3 to estimate anything");
    return history;
}

Result<PriceHistory> readPriceCsv(const std::string &path)
{
    // Parsed straight from a mapping of the file: a large history is not copied first.
    auto file = csv::FileText::open(path, PriceLimits::maxFileBytes);
    if (!file)
        return file.error();
    return parsePriceCsv(file.value().text(), path);
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

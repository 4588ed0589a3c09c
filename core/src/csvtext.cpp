#include "csvtext.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <filesystem>
#include <system_error>
#include <utility>

#ifdef TAILWISE_HAVE_FAST_FLOAT
#include <fast_float/fast_float.h>
#endif

#include <fcntl.h>
#include <sys/mman.h>
#include <sys/stat.h>
#include <unistd.h>

namespace tailwise::csv {

std::string_view stripBom(std::string_view text)
{
    if (text.size() >= 3 && static_cast<unsigned char>(text[0]) == 0xEF
        && static_cast<unsigned char>(text[1]) == 0xBB && static_cast<unsigned char>(text[2]) == 0xBF)
        text.remove_prefix(3);
    return text;
}

bool LineReader::next(std::string_view &line)
{
    if (m_pos >= m_text.size())
        return false;
    std::size_t end = m_text.find('\n', m_pos);
    if (end == std::string_view::npos)
        end = m_text.size();
    line = m_text.substr(m_pos, end - m_pos);
    if (!line.empty() && line.back() == '\r')
        line.remove_suffix(1);
    m_pos = end + 1;
    ++m_line;
    return true;
}

namespace {
std::string_view trim(std::string_view s)
{
    while (!s.empty() && (s.front() == ' ' || s.front() == '\t'))
        s.remove_prefix(1);
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t'))
        s.remove_suffix(1);
    return s;
}
} // namespace

Result<std::vector<Cell>> splitLine(std::string_view line, const std::string &source, int lineNumber)
{
    std::vector<Cell> cells;
    std::size_t pos = 0;
    int column = 1;
    while (true) {
        Cell cell;
        cell.column = column;
        // Skip leading blanks to see whether the cell is quoted.
        std::size_t start = pos;
        while (start < line.size() && (line[start] == ' ' || line[start] == '\t'))
            ++start;
        if (start < line.size() && line[start] == '"') {
            std::string value;
            bool escaped = false;
            std::size_t i = start + 1;
            bool closed = false;
            for (; i < line.size(); ++i) {
                if (line[i] == '"') {
                    if (i + 1 < line.size() && line[i + 1] == '"') {
                        value += '"';
                        escaped = true;
                        ++i;
                        continue;
                    }
                    closed = true;
                    break;
                }
                value += line[i];
            }
            if (!closed)
                return fileError(ErrorKind::Format, source, lineNumber, column,
                                 "a quoted cell is not closed: expected a closing '\"'");
            std::size_t after = i + 1;
            while (after < line.size() && (line[after] == ' ' || line[after] == '\t'))
                ++after;
            if (after < line.size() && line[after] != ',')
                return fileError(ErrorKind::Format, source, lineNumber, column,
                                 "unexpected text after a quoted cell: expected ',' or the end of the line");
            cell.text = line.substr(start + 1, i - start - 1);
            if (escaped)
                cell.unescaped = std::move(value);
            cells.push_back(std::move(cell));
            if (after >= line.size())
                return cells;
            pos = after + 1;
        } else {
            std::size_t end = line.find(',', pos);
            const bool last = end == std::string_view::npos;
            if (last)
                end = line.size();
            cell.text = trim(line.substr(pos, end - pos));
            cells.push_back(std::move(cell));
            if (last)
                return cells;
            pos = end + 1;
        }
        ++column;
    }
}

bool isNonFiniteLiteral(std::string_view text)
{
    if (!text.empty() && (text.front() == '+' || text.front() == '-'))
        text.remove_prefix(1);
    std::string lower;
    for (char c : text)
        lower += static_cast<char>(c >= 'A' && c <= 'Z' ? c - 'A' + 'a' : c);
    return lower == "nan" || lower == "inf" || lower == "infinity" || lower.rfind("nan(", 0) == 0;
}

std::optional<double> parseNumber(std::string_view text)
{
    if (text.empty())
        return std::nullopt;
    if (text.front() == '+')
        text.remove_prefix(1);
    double value = 0.0;
    const char *const last = text.data() + text.size();
#ifdef TAILWISE_HAVE_FAST_FLOAT
    // fast_float (Lemire, "Number parsing at a gigabyte per second", Software: Practice and
    // Experience 51(8), 2021 (mem)) rounds correctly, as std::from_chars does, about twice as fast
    // here. Its answer is taken when it is a normal finite number; zero, subnormals, overflow and
    // errors go to std::from_chars, so the refusals (out of range, not a number) stay the same.
    {
        const auto [end, ec] = fast_float::from_chars(text.data(), last, value);
        if (ec == std::errc() && end == last && std::isnormal(value))
            return value;
    }
#endif
    const auto [end, ec] = std::from_chars(text.data(), last, value);
    if (ec != std::errc() || end != last || !std::isfinite(value))
        return std::nullopt;
    return value;
}

const char *parsePositivePrefix(const char *first, const char *last, double &value)
{
    if (first == last || *first == '-' || *first == '+')
        return nullptr;
#ifdef TAILWISE_HAVE_FAST_FLOAT
    const auto [end, ec] = fast_float::from_chars(first, last, value);
#else
    const auto [end, ec] = std::from_chars(first, last, value);
#endif
    if (ec != std::errc() || !std::isnormal(value) || value <= 0.0)
        return nullptr;
    return end;
}

std::string quoteForMessage(std::string_view text)
{
    if (text.empty())
        return "an empty cell";
    std::string out = "\"";
    const std::size_t limit = 40;
    for (std::size_t i = 0; i < text.size() && i < limit; ++i) {
        const unsigned char c = static_cast<unsigned char>(text[i]);
        out += (c < 0x20 || c == 0x7F) ? '?' : static_cast<char>(c);
    }
    if (text.size() > limit)
        out += "…";
    out += "\"";
    return out;
}

namespace {

constexpr std::size_t maxLineBytes = 64 * 1024;

std::string lowercase(std::string_view s)
{
    std::string out(s);
    for (char &c : out)
        if (c >= 'A' && c <= 'Z')
            c = static_cast<char>(c - 'A' + 'a');
    return out;
}

} // namespace

HeaderedRows::HeaderedRows(std::string_view text, std::string source, Layout layout)
    : m_lines(text), m_source(std::move(source)), m_layout(std::move(layout)), m_index(m_layout.columns.size(), -1)
{
}

Status HeaderedRows::readHeader()
{
    std::string_view line;
    bool haveHeader = false;
    while (m_lines.next(line)) {
        if (line.size() > maxLineBytes)
            return fileError(ErrorKind::Format, m_source, m_lines.lineNumber(), 0, "the line is longer than the limit of 64 KiB");
        if (!line.empty()) {
            haveHeader = true;
            break;
        }
    }
    if (!haveHeader)
        return fileError(ErrorKind::Format, m_source, 0, 0, "the file is empty: expected " + m_layout.emptyExpectation);
    m_headerLine = m_lines.lineNumber();
    auto header = splitLine(line, m_source, m_headerLine);
    if (!header)
        return header.error();
    for (const auto &cell : header.value()) {
        const std::string name = lowercase(cell.value());
        const auto known = std::find(m_layout.columns.begin(), m_layout.columns.end(), name);
        if (known == m_layout.columns.end())
            return fileError(ErrorKind::Format, m_source, m_headerLine, cell.column,
                             "unknown column " + quoteForMessage(cell.value()) + ": expected " + m_layout.expectedColumns);
        int &slot = m_index[static_cast<std::size_t>(known - m_layout.columns.begin())];
        if (slot >= 0)
            return fileError(ErrorKind::Format, m_source, m_headerLine, cell.column, "the column '" + name + "' appears twice");
        slot = cell.column - 1;
    }
    m_columns = header.value().size();
    return Done{};
}

int HeaderedRows::column(std::string_view name) const
{
    for (std::size_t i = 0; i < m_layout.columns.size(); ++i)
        if (m_layout.columns[i] == name)
            return m_index[i];
    return -1;
}

Result<bool> HeaderedRows::next()
{
    std::string_view line;
    while (m_lines.next(line)) {
        const int lineNo = m_lines.lineNumber();
        if (line.size() > maxLineBytes)
            return fileError(ErrorKind::Format, m_source, lineNo, 0, "the line is longer than the limit of 64 KiB");
        if (line.empty())
            continue;
        if (m_rows >= m_layout.maxRows)
            return fileError(ErrorKind::Format, m_source, lineNo, 0,
                             "more than " + std::to_string(m_layout.maxRows) + " " + m_layout.rowsName + ": over the limit");
        auto split = splitLine(line, m_source, lineNo);
        if (!split)
            return split.error();
        m_cells = std::move(split).value();
        if (m_cells.size() != m_columns)
            return fileError(ErrorKind::Format, m_source, lineNo, static_cast<int>(std::min(m_cells.size(), m_columns)) + 1,
                             "the row has " + std::to_string(m_cells.size()) + " cells, expected "
                                 + std::to_string(m_columns) + " as in the header");
        ++m_rows;
        return true;
    }
    return false;
}

Error HeaderedRows::error(ErrorKind kind, int column, const std::string &what) const
{
    return fileError(kind, m_source, m_lines.lineNumber(), column + 1, what);
}

Error HeaderedRows::errorAtLine(ErrorKind kind, int line, const std::string &what) const
{
    return fileError(kind, m_source, line, 0, what);
}

Result<std::string> readFileText(const std::string &path, std::size_t maxBytes)
{
    namespace fs = std::filesystem;
    std::error_code ec;
    const fs::file_status status = fs::status(path, ec);
    if (ec || !fs::exists(status))
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, "the file does not exist");
    if (fs::is_directory(status))
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, "this is a folder, not a file");
    const auto size = fs::file_size(path, ec);
    if (!ec && size > maxBytes)
        return fileError(ErrorKind::FileUnreadable, path, 0, 0,
                         "the file is " + std::to_string(size / (1024 * 1024)) + " MiB, over the limit of "
                             + std::to_string(maxBytes / (1024 * 1024)) + " MiB");
    std::FILE *file = std::fopen(path.c_str(), "rb");
    if (!file)
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, "the file cannot be opened for reading");
    std::string text;
    if (!ec) {
        // Straight into the string: a large file is not copied a second time.
        text.resize(static_cast<std::size_t>(size));
        text.resize(std::fread(text.data(), 1, text.size(), file));
    }
    char buffer[1 << 16]; // the rest, if the file grew since its size was taken
    std::size_t got = 0;
    while ((got = std::fread(buffer, 1, sizeof buffer, file)) > 0) {
        text.append(buffer, got);
        if (text.size() > maxBytes) {
            std::fclose(file);
            return fileError(ErrorKind::FileUnreadable, path, 0, 0, "the file is over the size limit");
        }
    }
    const bool failed = std::ferror(file) != 0;
    std::fclose(file);
    if (failed)
        return fileError(ErrorKind::FileUnreadable, path, 0, 0, "the file could not be read to the end");
    return text;
}

Result<FileText> FileText::open(const std::string &path, std::size_t maxBytes)
{
    namespace fs = std::filesystem;
    std::error_code ec;
    const fs::file_status status = fs::status(path, ec);
    const bool regular = !ec && fs::is_regular_file(status);
    const auto size = regular ? fs::file_size(path, ec) : 0;
    FileText out;
    if (regular && !ec && size > 0 && size <= maxBytes) {
        const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
        if (fd >= 0) {
            void *mapped = ::mmap(nullptr, static_cast<std::size_t>(size), PROT_READ, MAP_PRIVATE | MAP_POPULATE, fd, 0);
            ::close(fd); // the mapping keeps the file
            if (mapped != MAP_FAILED) {
                out.m_mapped = static_cast<const char *>(mapped);
                out.m_size = static_cast<std::size_t>(size);
                return out;
            }
        }
    }
    // Everything else, including every error, as readFileText gives it.
    auto text = readFileText(path, maxBytes);
    if (!text)
        return text.error();
    out.m_read = std::move(text).value();
    return out;
}

FileText::FileText(FileText &&other) noexcept
    : m_mapped(std::exchange(other.m_mapped, nullptr)), m_size(std::exchange(other.m_size, 0)),
      m_read(std::move(other.m_read))
{
}

FileText::~FileText()
{
    if (m_mapped)
        ::munmap(const_cast<char *>(m_mapped), m_size);
}

} // namespace tailwise::csv

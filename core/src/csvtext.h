// Internal: the text rules shared by the CSV readers (prices, holdings).
// Lines end in LF or CRLF; a UTF-8 byte-order mark at the start is skipped; cells are separated
// by commas; a cell may be double-quoted (a doubled quote inside stands for one quote).
#pragma once

#include "tailwise/result.h"

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace tailwise::csv {

std::string_view stripBom(std::string_view text);

// Iterates lines without copying; tracks the 1-based line number.
class LineReader {
public:
    explicit LineReader(std::string_view text) : m_text(stripBom(text)) {}
    // Next line without its terminator; false at the end.
    bool next(std::string_view &line);
    int lineNumber() const { return m_line; }

private:
    std::string_view m_text;
    std::size_t m_pos = 0;
    int m_line = 0;
};

struct Cell {
    std::string_view text; // trimmed of surrounding blanks, quotes removed when not escaped
    std::string unescaped; // set only when the cell held an escaped quote
    int column = 0;        // 1-based
    std::string_view value() const { return unescaped.empty() ? text : std::string_view(unescaped); }
};

// Splits one line into cells. Error when a quoted cell is not closed.
Result<std::vector<Cell>> splitLine(std::string_view line, const std::string &source, int lineNumber);

// Calls `onCell(index, text)` for each comma-separated cell of an unquoted data line without
// allocating; cells are trimmed of blanks. Returns the number of cells.
template <class F>
int forEachCell(std::string_view line, F &&onCell)
{
    int index = 0;
    std::size_t start = 0;
    while (true) {
        std::size_t end = line.find(',', start);
        const bool last = end == std::string_view::npos;
        if (last)
            end = line.size();
        std::string_view cell = line.substr(start, end - start);
        while (!cell.empty() && (cell.front() == ' ' || cell.front() == '\t'))
            cell.remove_prefix(1);
        while (!cell.empty() && (cell.back() == ' ' || cell.back() == '\t'))
            cell.remove_suffix(1);
        if (!onCell(index, cell))
            return -1;
        ++index;
        if (last)
            return index;
        start = end + 1;
    }
}

// A finite decimal number, the whole cell; nullopt otherwise (NaN and infinity are refused).
std::optional<double> parseNumber(std::string_view text);
// The fast path of a reader: a number at the start of [first, last) with no blank, sign or other
// decoration before it. Returns where it ends and sets `value` when that number is normal and
// positive (the value parseNumber gives for the same text); nullptr otherwise, and the caller
// goes the general way, which gives the message.
const char *parsePositivePrefix(const char *first, const char *last, double &value);
bool isNonFiniteLiteral(std::string_view text);

// Describes a cell's content for a message: "\"abc\"", or "an empty cell"; long text is cut.
std::string quoteForMessage(std::string_view text);

// Reads a whole file as text. Errors: FileUnreadable for a missing file, a folder, an unreadable
// file, or one over `maxBytes`.
Result<std::string> readFileText(const std::string &path, std::size_t maxBytes);

// A whole file's text without copying it: a read-only mapping of the file (the pages come from
// the page cache), or the text read into memory where a mapping is not possible (an empty file, a
// pipe). Same checks and errors as readFileText. Move-only.
class FileText {
public:
    static Result<FileText> open(const std::string &path, std::size_t maxBytes);
    FileText(FileText &&other) noexcept;
    FileText &operator=(FileText &&) = delete;
    FileText(const FileText &) = delete;
    ~FileText();
    std::string_view text() const { return m_mapped ? std::string_view(m_mapped, m_size) : std::string_view(m_read); }

private:
    FileText() = default;
    const char *m_mapped = nullptr;
    std::size_t m_size = 0;
    std::string m_read;
};

} // namespace tailwise::csv

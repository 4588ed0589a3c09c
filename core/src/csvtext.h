// Internal: the text rules shared by the CSV readers (prices, holdings, scenarios).
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

// A file of rows under a header that names its columns — the layout of the holdings and scenario
// CSVs — read one row at a time with the rules both share, and their messages:
//   - blank lines are skipped; a line over 64 KiB is refused ("the line is longer than the limit
//     of 64 KiB", at its line);
//   - the first non-blank line is the header: each cell one of the reader's column names, in any
//     case, at most once ("unknown column \"x\": expected …", "the column 'x' appears twice", at
//     the cell's line and column); no header at all is "the file is empty: expected …";
//   - every later row has as many cells as the header ("the row has n cells, expected m as in the
//     header", at the first cell missing or too many), and there are at most maxRows of them
//     ("more than 100000 <rows>: over the limit").
// Messages are core's fileError: "<source>:<line>:<column>: <what>".
class HeaderedRows {
public:
    struct Layout {
        std::vector<std::string_view> columns; // the column names, lowercase
        std::string expectedColumns;           // after "unknown column …: expected "
        std::string emptyExpectation;          // after "the file is empty: expected "
        std::string rowsName;                  // "holdings", "shocks": in the over-the-limit message
        std::size_t maxRows = 100000;
    };

    HeaderedRows(std::string_view text, std::string source, Layout layout);

    // Reads the header; call once, first.
    Status readHeader();
    int headerLine() const { return m_headerLine; }
    // The 0-based index of a column of the layout, or -1 when the header lacks it.
    int column(std::string_view name) const;

    // Moves to the next row: true with cells(), false at the end, or the row's error.
    Result<bool> next();
    const std::vector<Cell> &cells() const { return m_cells; }
    std::string_view cell(int column) const { return m_cells[static_cast<std::size_t>(column)].value(); }
    int lineNumber() const { return m_lines.lineNumber(); }
    std::size_t rowCount() const { return m_rows; }

    // An error at the current row, in the given 0-based column (-1: the whole line).
    Error error(ErrorKind kind, int column, const std::string &what) const;
    // An error at a line of the file, for after the last row (column 0).
    Error errorAtLine(ErrorKind kind, int line, const std::string &what) const;

private:
    LineReader m_lines;
    std::string m_source;
    Layout m_layout;
    std::vector<int> m_index; // per layout column: its 0-based index in the header, or -1
    std::size_t m_columns = 0;
    std::size_t m_rows = 0;
    int m_headerLine = 0;
    std::vector<Cell> m_cells;
};

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

// Tables for colleagues: each table one sheet of an .xlsx workbook (Office Open XML, written by
// libxlsxwriter) or one CSV file. In the workbook numbers are numbers (not text), money has a
// thousands-separated two-decimal format, fractions a percent format, dates are dates, the header
// row is bold and frozen. A number that is not finite is left empty (no NaN reaches a file).
// Files are written beside the target under a temporary name and renamed over it, so a failed
// write leaves any previous file as it was and reports the failure.
#pragma once

#include "tailwise/result.h"

#include <string>
#include <variant>
#include <vector>

namespace tailwise::xlsx {

enum class CellKind {
    Text,
    Number,  // general number, shortest form
    Money,   // #,##0.00
    Percent, // 0.00% (the value is a fraction)
    Integer, // 0
    Date,    // the cell's text is YYYY-MM-DD; written as a date
};

struct Column {
    std::string title;
    CellKind kind = CellKind::Text;
};

// Empty, text, or a number. A Date column's cells are text "YYYY-MM-DD".
using Cell = std::variant<std::monostate, std::string, double>;

struct Table {
    std::string name; // the sheet's name (at most 31 characters; []:*?/\ are replaced)
    std::vector<Column> columns;
    std::vector<std::vector<Cell>> rows;
};

// One sheet per table, in order. Error: the file cannot be written (naming it and why).
Status writeXlsx(const std::string &path, const std::vector<Table> &tables);

// The table as CSV (RFC 4180 quoting; numbers in shortest round-trip form; "\n" line ends).
std::string tableCsv(const Table &table);
Status writeCsv(const std::string &path, const Table &table);

// Writes text to `path` through a temporary file in the same folder and a rename.
Status writeFileAtomically(const std::string &path, const std::string &text);

} // namespace tailwise::xlsx

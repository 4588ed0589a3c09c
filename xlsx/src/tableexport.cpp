#include "tailwise/xlsx/tableexport.h"

#include "tailwise/date.h"
#include "tailwise/filewrite.h"
#include "tailwise/json.h"

#include <xlsxwriter.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <fstream>
#include <iterator>

#include <unistd.h>

namespace tailwise::xlsx {

namespace {

// A new empty file only this process can read, in $TMPDIR (else /tmp); empty on failure.
std::string scratchFile()
{
    const char *dir = std::getenv("TMPDIR");
    std::string name = std::string(dir && *dir ? dir : "/tmp") + "/tailwise-xlsx-XXXXXX";
    const int fd = ::mkstemp(name.data());
    if (fd < 0)
        return {};
    ::close(fd);
    return name;
}

Error writeError(const std::string &path, const std::string &why)
{
    return fileError(ErrorKind::FileUnreadable, path, 0, 0, "could not be written: " + why + "; nothing was written");
}

std::string sheetName(std::string name, std::vector<std::string> &used)
{
    for (char &c : name)
        if (std::string_view("[]:*?/\\").find(c) != std::string_view::npos)
            c = '-';
    if (name.empty())
        name = "Sheet";
    if (name.size() > 31)
        name.resize(31);
    std::string unique = name;
    for (int n = 2; std::find(used.begin(), used.end(), unique) != used.end(); ++n) {
        std::string suffix(1, ' ');
        suffix += std::to_string(n);
        unique = name.substr(0, 31 - suffix.size()) + suffix;
    }
    used.push_back(unique);
    return unique;
}

std::string csvField(const std::string &s)
{
    if (s.find_first_of(",\"\n\r") == std::string::npos)
        return s;
    std::string out = "\"";
    for (const char c : s) {
        if (c == '"')
            out += '"';
        out += c;
    }
    return out + "\"";
}

} // namespace

Status writeFileAtomically(const std::string &path, const std::string &text)
{
    // The one checked way every Tailwise file is written (tailwise/filewrite.h): every write,
    // fsync and close checked, the old file untouched on failure.
    return writeFileReplacing(path, text);
}

Status writeXlsx(const std::string &path, const std::vector<Table> &tables)
{
    // libxlsxwriter writes only to a file: it makes the workbook in a private scratch file, whose
    // bytes then go to `path` the one checked way (writeFileAtomically).
    std::string tmp = scratchFile();
    if (tmp.empty())
        return writeError(path, "no scratch file could be made in the temporary folder");
    lxw_workbook *book = workbook_new(tmp.c_str());
    if (!book) {
        std::remove(tmp.c_str());
        return writeError(path, "the workbook could not be started");
    }
    lxw_format *header = workbook_add_format(book);
    format_set_bold(header);
    lxw_format *money = workbook_add_format(book);
    format_set_num_format(money, "#,##0.00");
    lxw_format *percent = workbook_add_format(book);
    format_set_num_format(percent, "0.00%");
    lxw_format *integer = workbook_add_format(book);
    format_set_num_format(integer, "0");
    lxw_format *date = workbook_add_format(book);
    format_set_num_format(date, "yyyy-mm-dd");
    std::vector<std::string> used;
    for (const Table &t : tables) {
        lxw_worksheet *sheet = workbook_add_worksheet(book, sheetName(t.name, used).c_str());
        if (!sheet)
            continue;
        for (std::size_t c = 0; c < t.columns.size(); ++c) {
            const auto col = static_cast<lxw_col_t>(c);
            worksheet_write_string(sheet, 0, col, t.columns[c].title.c_str(), header);
            const double width = std::max<double>(12.0, static_cast<double>(t.columns[c].title.size()) + 2.0);
            worksheet_set_column(sheet, col, col, t.columns[c].kind == CellKind::Text ? std::max(width, 18.0) : width, nullptr);
        }
        worksheet_freeze_panes(sheet, 1, 0);
        for (std::size_t r = 0; r < t.rows.size(); ++r) {
            const auto row = static_cast<lxw_row_t>(r + 1);
            for (std::size_t c = 0; c < t.rows[r].size() && c < t.columns.size(); ++c) {
                const auto col = static_cast<lxw_col_t>(c);
                const Cell &cell = t.rows[r][c];
                const CellKind kind = t.columns[c].kind;
                if (const auto *text = std::get_if<std::string>(&cell)) {
                    if (kind == CellKind::Date) {
                        if (const auto d = parseIsoDate(*text)) {
                            const std::string iso = toIso(*d);
                            lxw_datetime dt{std::stoi(iso.substr(0, 4)), std::stoi(iso.substr(5, 2)),
                                            std::stoi(iso.substr(8, 2)), 0, 0, 0.0};
                            worksheet_write_datetime(sheet, row, col, &dt, date);
                            continue;
                        }
                    }
                    worksheet_write_string(sheet, row, col, text->c_str(), nullptr);
                } else if (const auto *number = std::get_if<double>(&cell)) {
                    if (!std::isfinite(*number))
                        continue;
                    lxw_format *f = kind == CellKind::Money ? money
                                    : kind == CellKind::Percent ? percent
                                    : kind == CellKind::Integer ? integer
                                                                : nullptr;
                    worksheet_write_number(sheet, row, col, *number, f);
                }
            }
        }
    }
    const lxw_error closed = workbook_close(book);
    if (closed != LXW_NO_ERROR) {
        std::remove(tmp.c_str());
        return writeError(path, lxw_strerror(closed));
    }
    std::ifstream in(tmp, std::ios::binary);
    std::string bytes((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
    const bool read = !in.bad();
    in.close();
    std::remove(tmp.c_str());
    if (!read || bytes.empty())
        return writeError(path, "the scratch file could not be read back");
    return writeFileAtomically(path, bytes);
}

std::string tableCsv(const Table &table)
{
    std::string out;
    for (std::size_t c = 0; c < table.columns.size(); ++c) {
        if (c)
            out += ',';
        out += csvField(table.columns[c].title);
    }
    out += "\n";
    for (const auto &row : table.rows) {
        for (std::size_t c = 0; c < table.columns.size(); ++c) {
            if (c)
                out += ",";
            if (c >= row.size())
                continue;
            if (const auto *text = std::get_if<std::string>(&row[c]))
                out += csvField(*text);
            else if (const auto *number = std::get_if<double>(&row[c]); number && std::isfinite(*number))
                out += formatShortest(*number);
        }
        out += "\n";
    }
    return out;
}

Status writeCsv(const std::string &path, const Table &table) { return writeFileAtomically(path, tableCsv(table)); }

} // namespace tailwise::xlsx

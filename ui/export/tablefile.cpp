#include "export/tablefile.h"

#include "text/numbers.h"

#include <QAbstractItemModel>
#include <QFile>
#include <QFileInfo>
#include <QLocale>

#include <optional>
#include <vector>

namespace tailwise::ui {

namespace {

using tailwise::xlsx::Cell;
using tailwise::xlsx::CellKind;

struct ReadCell {
    std::optional<double> number; // the figure, when the text is one
    bool percent = false;          // the text ended in the percent sign (number is then a fraction)
    bool money = false;            // two decimals or a thousands separator: a money figure
    bool empty = false;            // nothing, or a dash for "no figure"
};

ReadCell readCell(const QString &shown)
{
    ReadCell c;
    const QString text = shown.trimmed();
    if (text.isEmpty() || text == QStringLiteral("—") || text == QStringLiteral("–") || text == QStringLiteral("-")) {
        c.empty = true;
        return c;
    }
    const QLocale locale;
    QString digits = text;
    if (digits.endsWith(locale.percent()) || digits.endsWith(QLatin1Char('%'))) {
        digits.chop(1);
        c.percent = true;
    }
    const auto value = readNumber(digits.trimmed());
    if (!value)
        return c;
    c.number = c.percent ? *value / 100.0 : *value;
    const int point = static_cast<int>(digits.lastIndexOf(locale.decimalPoint()));
    c.money = !c.percent && (digits.contains(locale.groupSeparator()) || (point >= 0 && digits.size() - point - 1 == 2));
    return c;
}

} // namespace

tailwise::xlsx::Table tableFromModel(const QAbstractItemModel &model, const QString &name)
{
    tailwise::xlsx::Table table;
    table.name = name.toStdString();
    const int rows = model.rowCount(), columns = model.columnCount();
    std::vector<std::vector<ReadCell>> read(static_cast<std::size_t>(rows));
    for (int r = 0; r < rows; ++r)
        for (int c = 0; c < columns; ++c)
            read[static_cast<std::size_t>(r)].push_back(readCell(model.index(r, c).data(Qt::DisplayRole).toString()));
    for (int c = 0; c < columns; ++c) {
        // A column is figures when every cell is a figure or empty, and at least one is a figure.
        bool figures = false, allFigures = true, allPercent = true, anyMoney = false;
        for (int r = 0; r < rows; ++r) {
            const ReadCell &cell = read[static_cast<std::size_t>(r)][static_cast<std::size_t>(c)];
            if (cell.empty)
                continue;
            if (!cell.number) {
                allFigures = false;
                break;
            }
            figures = true;
            allPercent = allPercent && cell.percent;
            anyMoney = anyMoney || cell.money;
        }
        const bool numeric = figures && allFigures;
        const CellKind kind = !numeric ? CellKind::Text
                              : allPercent ? CellKind::Percent
                              : anyMoney   ? CellKind::Money
                                           : CellKind::Number;
        table.columns.push_back({model.headerData(c, Qt::Horizontal, Qt::DisplayRole).toString().toStdString(), kind});
    }
    for (int r = 0; r < rows; ++r) {
        std::vector<Cell> row;
        for (int c = 0; c < columns; ++c) {
            const ReadCell &cell = read[static_cast<std::size_t>(r)][static_cast<std::size_t>(c)];
            if (table.columns[static_cast<std::size_t>(c)].kind != CellKind::Text)
                row.push_back(cell.number ? Cell(*cell.number) : Cell());
            else
                row.push_back(Cell(model.index(r, c).data(Qt::DisplayRole).toString().toStdString()));
        }
        table.rows.push_back(std::move(row));
    }
    return table;
}

tailwise::Status writeTableFile(const QAbstractItemModel &model, const QString &name, const QString &path)
{
    const QString suffix = QFileInfo(path).suffix().toLower();
    const std::string file = QFile::encodeName(path).toStdString();
    if (suffix == QStringLiteral("xlsx"))
        return tailwise::xlsx::writeXlsx(file, {tableFromModel(model, name)});
    if (suffix == QStringLiteral("csv"))
        return tailwise::xlsx::writeCsv(file, tableFromModel(model, name));
    return tailwise::fileError(tailwise::ErrorKind::Assumption, path.toStdString(), 0, 0,
                               "a table is written as .xlsx or .csv, not as ." + suffix.toStdString());
}

} // namespace tailwise::ui

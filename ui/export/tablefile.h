// Any table of the window as a file colleagues can open: an .xlsx workbook of one sheet (numbers
// as numbers, money and percent formats, a bold frozen header: tailwise/xlsx/tableexport.h) or
// CSV, chosen by the file's suffix. The table is taken as the user sees it — the model's header
// and the text of each cell — and each column that holds only figures is written as numbers:
// "1,234.56" (in the user's locale) becomes the number 1234.56 in a money format, "24.86%" the
// fraction 0.2486 in a percent format; a dash ("no figure") becomes an empty cell.
#pragma once

#include "tailwise/result.h"
#include "tailwise/xlsx/tableexport.h"

#include <QString>

class QAbstractItemModel;

namespace tailwise::ui {

// The model's visible table as a sheet named `name`.
tailwise::xlsx::Table tableFromModel(const QAbstractItemModel &model, const QString &name);

// Writes it to `path` (.xlsx or .csv; anything else is refused naming the suffix), the one
// checked way (tailwise/filewrite.h).
tailwise::Status writeTableFile(const QAbstractItemModel &model, const QString &name, const QString &path);

} // namespace tailwise::ui

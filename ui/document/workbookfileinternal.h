// What the workbook file's reader (workbookreader.cpp) and writer (workbookwriter.cpp) share:
// the writer checks that its contents read back with the reader's rules, and the reader names
// the defaults it used with the writer's own spelling of them. Not for use outside those two.
#pragma once

#include "workbookcontents.h"

#include "tailwise/assumptions.h"
#include "tailwise/result.h"

#include <QJsonObject>
#include <QString>

#include <string>

namespace tailwise::ui::detail {

inline std::string text(const QString &s) { return s.toStdString(); }

// The "assumptions" object as a workbook stores it (one key per field of Assumptions).
QJsonObject assumptionsJson(const Assumptions &assumptions);

// The contents of a parsed workbook object, or the first problem, "<source>: <json path>: <what>".
Result<WorkbookContents> contentsFromJson(const QJsonObject &root, const std::string &source);

} // namespace tailwise::ui::detail

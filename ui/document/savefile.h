// The Qt side of core's one way to write a file (tailwise/filewrite.h): every file the window and
// the command line write — workbook, report, SVG, PDF, PNG, CSV — is made in memory and handed to
// saveFile, which writes a temporary file in the target's folder, checks every write, fsync and
// close, and only then renames it over the target. On failure the old file is untouched and the
// error reads "could not save FILE: <the system's reason>".
#pragma once

#include "tailwise/result.h"

#include <QByteArray>
#include <QString>
#include <QStringList>

namespace tailwise::ui {

tailwise::Status saveFile(const QString &path, const QByteArray &bytes);

// Empty when writing `path` would replace none of `inputs`; otherwise the sentence that refuses
// it, naming both files ("… would replace prices.csv, a file this workbook was read from …").
// The same test as the command line's --out check (tailwise/filewrite.h).
QString refusalToOverwriteInput(const QString &path, const QStringList &inputs);

} // namespace tailwise::ui

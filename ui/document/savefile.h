// The Qt side of core's one way to write a file (tailwise/filewrite.h): every file the window and
// the command line write — workbook, report, SVG, PDF, PNG, CSV — is made in memory and handed to
// saveFile, which writes a temporary file in the target's folder, checks every write, fsync and
// close, and only then renames it over the target. On failure the old file is untouched and the
// error reads "could not save FILE: <the system's reason>".
#pragma once

#include "tailwise/result.h"

#include <QByteArray>
#include <QString>

namespace tailwise::ui {

tailwise::Status saveFile(const QString &path, const QByteArray &bytes);

} // namespace tailwise::ui

// A chart on the clipboard: a picture (at the settings' size and dpi, for word processors and
// mail) and the same chart as SVG ("image/svg+xml", for drawing programs), in one QMimeData.
#pragma once

#include "export/chartrender.h"

class QMimeData;

namespace tailwise::ui {

// Caller owns the result (QClipboard::setMimeData takes it).
QMimeData *chartMimeData(const ChartExportSettings &settings, const WorkbookResults &results);

} // namespace tailwise::ui

// The report's pages: a Document (reportdocument.h) flowed onto A4 portrait pages of a PDF.
//
// Layout: 20 mm side margins; a running header (the workbook's name on the left, the date on the
// right) and footer (the document's footer note, and "Page n of m") on every page. Blocks flow
// down the page in order; a heading is never left at the foot of a page (it moves on with the
// start of what follows it); a table's header goes with at least two of its rows and is repeated
// on every page the table runs onto; a figure and a paragraph are kept whole. Since "of m" needs
// the number of pages before the first is drawn, the layout is measured in full first, then drawn.
//
// Works without a display: QPdfWriter and QPainter need a QGuiApplication, which may run on the
// offscreen platform.
#pragma once

#include "reportdocument.h"

#include "tailwise/result.h"

class QIODevice;

namespace tailwise::ui::report {

// Writes the PDF to `path` through a temporary file renamed on success (document/savefile.h), so a failed
// write leaves any earlier file as it was. Returns the number of pages; the error names the file.
Result<int> writePdf(const Document &document, const QString &path);
// The same into an open device (tests).
int writePdf(const Document &document, QIODevice &device);

} // namespace tailwise::ui::report

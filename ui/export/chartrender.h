// Charts for print and files: any ChartKind drawn off-screen from WorkbookResults in the print
// style, at a physical size, with an optional caption, onto any QPainter — and the writers for
// PNG (150/300/600 dpi), SVG (vector, QSvgGenerator) and PDF (vector, QPdfWriter, one page).
//
// How the size works: the picture is laid out on a canvas of the physical size at 96 units per
// inch (one unit = 0.2646 mm, the screen pixel the charts' pens and marks were drawn for), with
// pixel-sized fonts whose size follows the physical width (print points: 7.7 in a column, 9.4 on a page, 12.3 on a slide), and
// that canvas is scaled onto the target. So a 300 dpi PNG and a PDF of the same size show the
// same picture, and text is the same size on paper whatever the resolution. Text stays text in
// SVG and PDF (QCustomPlot paints with caching off).
//
// The print style (applied over the charts' own): white background, ink text, the palette of
// chartstyle.h (apart in greyscale), the locale's thousands separators, the currency in place of
// "money" in axis labels when one is given, and none of the window's chrome (no hover read-out,
// no selection, no "click to …" hints). The size given is the whole picture, caption included.
// Needs a QApplication (the charts are widgets, never shown); the command line makes an
// offscreen one (app/cli/guiapplication.h).
#pragma once

#include "charts/chartkind.h"
#include "export/workbookresults.h"

#include "tailwise/result.h"

#include <QImage>
#include <QRectF>
#include <QSizeF>
#include <QString>

#include <array>
#include <optional>

class QIODevice;
class QPainter;

namespace tailwise::ui {

enum class ExportFormat { Png, Svg, Pdf };
QString exportFormatName(ExportFormat format);                    // "png", "svg", "pdf"
std::optional<ExportFormat> parseExportFormat(const QString &name); // case-insensitive
std::optional<ExportFormat> exportFormatForPath(const QString &path); // by the file's suffix

// Sizes that fit common uses (width × height, mm): a letter's column 85 × 75, half a page
// 170 × 110, a full page 170 × 230 (the text area of A4 and US Letter with 20 mm margins), a
// 16:9 slide 254 × 143 (10 in wide).
enum class SizePreset { Column, HalfPage, FullPage, Slide };
inline constexpr std::array<SizePreset, 4> allSizePresets{SizePreset::Column, SizePreset::HalfPage, SizePreset::FullPage,
                                                          SizePreset::Slide};
QString sizePresetName(SizePreset preset);                      // "column", "half-page", "full-page", "slide"
std::optional<SizePreset> parseSizePreset(const QString &name);
QString sizePresetTitle(SizePreset preset);                     // "A letter's column (85 × 75 mm)"
QSizeF sizePresetMm(SizePreset preset);

inline constexpr std::array<int, 3> exportDpiChoices{150, 300, 600};
// Limits of a custom size, so a typo cannot ask for a poster of gigapixels.
inline constexpr double minExportMm = 30.0;
inline constexpr double maxExportMm = 600.0;

struct ChartPrintOptions {
    QSizeF sizeMm{170.0, 110.0}; // the whole picture, caption included
    QString caption;             // drawn under the chart, word-wrapped; empty: no caption
    QString currency;            // e.g. "EUR": named on money axes in place of the workbook's (results.currency); empty keeps that
    LossTailUnit lossTailUnit = LossTailUnit::Money;
};

// Why `kind` cannot be drawn from these results (e.g. the backtest had too little history);
// empty when it can.
QString chartUnavailableReason(ChartKind kind, const WorkbookResults &results);

// Paints the chart filling `target` (painter coordinates). Fonts and marks are sized for
// options.sizeMm on paper, whatever `target`'s size in painter units. A chart that cannot be
// drawn (too little data, or a number that is not finite: plotcheck.h) paints its reason instead
// and returns it; the return is empty when the chart was drawn.
QString paintChart(QPainter &painter, const QRectF &target, ChartKind kind, const WorkbookResults &results,
                const ChartPrintOptions &options);

// Font size (points on paper) of axis labels and captions at this physical size.
double printLabelPoints(const QSizeF &sizeMm);
// Pixels of a PNG at this size and resolution: round(mm / 25.4 × dpi) each way.
QSize exportPixelSize(const QSizeF &sizeMm, int dpi);

struct ChartExportSettings {
    ChartKind kind = ChartKind::LossTail;
    ExportFormat format = ExportFormat::Png;
    int dpi = 300;               // PNG only; stored in the file's pHYs so it prints at the size
    ChartPrintOptions print;
};

// Checks the size (each side within minExportMm…maxExportMm) and dpi (> 0, at most 1200);
// errors name the field ("width-mm", "height-mm", "dpi").
tailwise::Status checkExportSettings(const ChartExportSettings &settings);

// The picture as an image (PNG export, clipboard), white background. `notDrawn`, when given,
// receives paintChart's reason when the chart could not be drawn.
QImage renderChartImage(ChartKind kind, const WorkbookResults &results, const ChartPrintOptions &options, int dpi,
                        QString *notDrawn = nullptr);

// Writes the chart in settings.format to `device` (open for writing) or to `path` (atomically:
// a temporary file, then renamed). Errors: the chart cannot be drawn (Value, naming the chart),
// bad settings (Assumption, naming the field), the file cannot be written (FileUnreadable,
// naming the file).
tailwise::Status writeChart(QIODevice &device, const ChartExportSettings &settings, const WorkbookResults &results);
tailwise::Status writeChart(const QString &path, const ChartExportSettings &settings, const WorkbookResults &results);

} // namespace tailwise::ui

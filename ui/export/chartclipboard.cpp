#include "export/chartclipboard.h"

#include <QBuffer>
#include <QMimeData>

namespace tailwise::ui {

QMimeData *chartMimeData(const ChartExportSettings &settings, const WorkbookResults &results)
{
    auto *mime = new QMimeData;
    mime->setImageData(renderChartImage(settings.kind, results, settings.print, settings.dpi));
    ChartExportSettings svg = settings;
    svg.format = ExportFormat::Svg;
    QByteArray bytes;
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    if (writeChart(buffer, svg, results))
        mime->setData(QStringLiteral("image/svg+xml"), bytes);
    return mime;
}

} // namespace tailwise::ui

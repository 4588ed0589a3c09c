#include "rendercommand.h"

#include "exitstatus.h"

#include "guiapplication.h"
#include "renderoptions.h"
#include "workbookinput.h"

#include "export/captions.h"
#include "export/chartrender.h"
#include "export/workbookresults.h"

#include <QApplication>
#include <QDir>
#include <QFile>

#include <cstdio>

namespace tailwise::cli {

namespace {

} // namespace

int runRenderCommand(const std::vector<std::string> &args)
{
    auto parsed = parseRenderOptions(args);
    if (!parsed)
        return fail(exitUsage, parsed.error().message);
    RenderOptions options = std::move(parsed).value();
    if (options.help) {
        std::fputs(renderHelpText().c_str(), stdout);
        return exitOk;
    }
    auto contents = readWorkbookInput(options.workbookPath);
    if (!contents)
        return fail(exitBadInput, contents.error().message);
    auto results = ui::computeWorkbookResults(contents.value());
    if (!results)
        return fail(exitBadInput, options.workbookPath + ": " + results.error().message);

    // Only now, with something to draw: the charts are widgets and need the application.
    const auto app = makeGuiApplication();
    ui::ChartExportSettings &s = options.settings;
    if (options.caption)
        s.print.caption = QString::fromStdString(*options.caption);
    else if (!options.noCaption)
        s.print.caption = ui::captionFor(s.kind, results.value());
    const auto written = ui::writeChart(QFile::decodeName(options.outPath.c_str()), s, results.value());
    if (!written)
        return fail(exitBadInput, written.error().message);
    // Like `report`, say what was written: the size on paper, and the pixels of a PNG.
    const QString path = QDir::toNativeSeparators(QFile::decodeName(options.outPath.c_str()));
    QString what = QStringLiteral("%1, %2 × %3 mm")
                       .arg(ui::exportFormatName(s.format).toUpper())
                       .arg(s.print.sizeMm.width(), 0, 'g', 4)
                       .arg(s.print.sizeMm.height(), 0, 'g', 4);
    if (s.format == ui::ExportFormat::Png) {
        const QSize px = ui::exportPixelSize(s.print.sizeMm, s.dpi);
        what += QStringLiteral(", %1 × %2 px at %3 dpi").arg(px.width()).arg(px.height()).arg(s.dpi);
    }
    std::fprintf(stdout, "Wrote %s (%s).\n", path.toLocal8Bit().constData(), what.toUtf8().constData());
    return exitOk;
}

} // namespace tailwise::cli

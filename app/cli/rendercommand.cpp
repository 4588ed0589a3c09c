#include "rendercommand.h"

#include "exitstatus.h"

#include "guiapplication.h"
#include "renderoptions.h"
#include "workbookinput.h"

#include "export/captions.h"
#include "export/chartrender.h"
#include "export/workbookresults.h"

#include "tailwise/filewrite.h"

#include <QApplication>
#include <QBuffer>
#include <QDir>
#include <QFile>

#include <cstdio>

namespace tailwise::cli {

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
    if (auto ok = checkOutputIsNotAnInput(options.outPath, {options.workbookPath}); !ok)
        return fail(exitUsage, ok.error().message);
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
    const bool toStdout = options.outPath == "-";
    if (toStdout) { // --out -: the picture to standard output, the summary to the error stream
        QBuffer buffer;
        buffer.open(QIODevice::WriteOnly);
        if (auto drawn = ui::writeChart(buffer, s, results.value()); !drawn)
            return fail(exitBadInput, drawn.error().message);
        if (auto written = writeStandardOutput(std::string_view(buffer.data().constData(), buffer.data().size())); !written)
            return fail(exitBadInput, written.error().message);
    } else if (const auto written = ui::writeChart(QFile::decodeName(options.outPath.c_str()), s, results.value()); !written) {
        return fail(exitBadInput, written.error().message);
    }
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
    std::fprintf(toStdout ? stderr : stdout, "Wrote %s (%s).\n", toStdout ? "standard output" : path.toLocal8Bit().constData(),
                 what.toUtf8().constData());
    return exitOk;
}

} // namespace tailwise::cli

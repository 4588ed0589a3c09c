#include "pdfreportcommand.h"

#include "exitstatus.h"

#include "commandline.h"
#include "guiapplication.h"
#include "optiontext.h"
#include "workbookinput.h"

#include "export/reportexport.h"

#include <QByteArray>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QApplication>

#include <cstdio>
#include <memory>
#include <optional>

namespace tailwise::cli {

namespace {

struct PdfReportOptions {
    bool help = false;
    std::string workbook;
    std::string out;
};

const char *reportAbout = R"(tailwise-cli report: the PDF report of a workbook

Usage:
  tailwise-cli report WORKBOOK --out FILE.pdf

Writes the report the window's File > Export Report... makes: the headline figures, the loss tail,
what drives the risk, horizon and confidence, the backtest (when the workbook sets one), the models
compared, every assumption, and the cautions; with the workbook's name, the date and page numbers
on every page. Figures come from the workbook's stored assumptions. Needs no display.)";

const char *reportClosing = R"(Exit status: 0 written, 1 the workbook cannot be read or gives no figures, or the PDF cannot be
written, 2 bad usage.
)";

void declare(CommandLine &line, PdfReportOptions &o)
{
    line.positional("WORKBOOK", o.workbook);
    line.section("Options");
    line.value("--out,-o", o.out, "FILE.pdf", "the PDF to write (replaced only once it is complete)");
    line.flag("--help", o.help, "this text");
}

Result<PdfReportOptions> parse(const std::vector<std::string> &args)
{
    PdfReportOptions o;
    CommandLine line("report", reportAbout, reportClosing);
    declare(line, o);
    if (auto ok = line.parse(args); !ok)
        return ok.error();
    if (line.helpWanted()) {
        o.help = true;
        return o;
    }
    if (o.workbook.empty())
        return usage("report", "expected the workbook to report on: tailwise-cli report WORKBOOK --out FILE.pdf");
    if (o.out.empty())
        return usage("--out", "expected the PDF file to write, e.g. --out report.pdf");
    return o;
}

} // namespace

std::string pdfReportHelpText()
{
    PdfReportOptions o;
    CommandLine line("report", reportAbout, reportClosing);
    declare(line, o);
    return line.help();
}

int runPdfReportCommand(const std::vector<std::string> &args)
{
    const auto parsed = parse(args);
    if (!parsed)
        return fail(exitUsage, parsed.error().message);
    const PdfReportOptions &o = parsed.value();
    if (o.help) {
        std::fputs(pdfReportHelpText().c_str(), stdout);
        return exitOk;
    }
    auto contents = readWorkbookInput(o.workbook);
    if (!contents)
        return fail(exitBadInput, contents.error().message);
    const ui::ReportData data = ui::computeReportData(std::move(contents).value());
    if (!data.results)
        return fail(exitBadInput, o.workbook + ": no figures for this workbook's inputs: " + data.results.error().message);
    const auto app = makeGuiApplication();
    const QString out = QFile::decodeName(o.out.c_str());
    const auto written = ui::writeReport(data, QFileInfo(QFile::decodeName(o.workbook.c_str())).fileName(), out);
    if (!written)
        return fail(exitBadInput, written.error().message);
    std::fprintf(stdout, "Wrote %s (%d pages).\n", QDir::toNativeSeparators(out).toLocal8Bit().constData(),
                 written.value());
    for (const auto &w : data.results.value().report.warnings)
        std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());
    return exitOk;
}

} // namespace tailwise::cli

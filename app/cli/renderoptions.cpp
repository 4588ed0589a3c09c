#include "renderoptions.h"

#include "commandline.h"
#include "optiongroups.h"
#include "optiontext.h"

#include "document/currencycode.h"

#include <QString>

#include <algorithm>
#include <iterator>
#include <tuple>

namespace tailwise::cli {

namespace {

std::string joined(const QStringList &names) { return names.join(QStringLiteral(", ")).toStdString(); }

QStringList presetNames()
{
    QStringList names;
    for (const ui::SizePreset p : ui::allSizePresets)
        names << ui::sizePresetName(p);
    return names;
}

const char *renderAbout = R"(tailwise-cli render: draw one chart of a workbook to a PNG, SVG or PDF file (no display needed)

Usage:
  tailwise-cli render WORKBOOK --chart KIND --out FILE [options])";

const char *renderClosing = R"(The figures are estimates from past prices under the workbook's assumptions: VaR is not the worst
case, and none of this is advice.
Exit status: 0 written, 1 the workbook cannot be read or the chart cannot be drawn, 2 bad options.
)";

struct Texts {
    std::string workbook, chart, out, format, preset, widthMm, heightMm, dpi;
    std::optional<std::string> caption, currency;
    bool noCaption = false, percent = false;
    OutputOptions output;
};

void declare(CommandLine &line, Texts &t)
{
    line.positional("WORKBOOK", t.workbook);
    line.section("Chart");
    line.value("--chart", t.chart, "KIND",
               "loss-tail      the horizon P&L curve with the tail beyond VaR\n"
               "tradeoff       VaR over horizon and confidence\n"
               "contributions  each holding's part of VaR, and diversification\n"
               "backtest       past days' P&L against their one-day VaR\n"
               "models         VaR and ES under every model");
    line.value("--out", t.out, "FILE", "the file to write; its suffix (.png, .svg, .pdf) chooses the format");
    line.value("--format", t.format, "F", "png, svg or pdf, whatever the suffix");
    line.value("--preset", t.preset, "P",
               "column (85 x 75 mm), half-page (170 x 110, the default),\nfull-page (170 x 230), slide (254 x 143, 16:9)");
    line.value("--width-mm", t.widthMm, "W", "width in mm (30 to 600), instead of the preset's");
    line.value("--height-mm", t.heightMm, "H", "height in mm (30 to 600), instead of the preset's; caption included");
    line.value("--dpi", t.dpi, "D", "PNG resolution, dots per inch (default 300; 150, 300 or 600 are usual)");
    line.value("--caption", t.caption, "TEXT", "the caption under the chart, instead of the one written from the results");
    line.flag("--no-caption", t.noCaption, "no caption");
    line.value("--currency", t.currency, "CODE",
               "named on money axes, e.g. EUR, instead of the workbook's own currency\n(default: the workbook's; \"money\" when it states none)");
    line.flag("--percent", t.percent, "loss-tail: the P&L axis in % of portfolio value instead of money");
    line.section("Other");
    line.flag("--help", t.output.help, "this text");
}

} // namespace

Result<RenderOptions> parseRenderOptions(const std::vector<std::string> &args)
{
    Texts t;
    CommandLine line("render", renderAbout, renderClosing);
    declare(line, t);
    if (auto ok = line.parse(args); !ok)
        return ok.error();
    RenderOptions options;
    if (line.helpWanted()) {
        options.help = true;
        return options;
    }
    ui::ChartExportSettings &s = options.settings;
    std::optional<ui::ChartKind> kind;
    std::optional<ui::ExportFormat> format;
    std::optional<double> width, height;
    ui::SizePreset preset = ui::SizePreset::HalfPage;
    options.workbookPath = t.workbook;
    options.outPath = t.out;
    options.noCaption = t.noCaption;
    options.caption = t.caption;
    if (t.percent)
        s.print.lossTailUnit = ui::LossTailUnit::PercentOfValue;
    if (!t.chart.empty()) {
        kind = ui::parseChartKind(QString::fromStdString(t.chart));
        if (!kind)
            return usage("--chart", "expected one of " + joined(ui::chartKindNames()) + ", found \"" + t.chart + "\"");
    }
    if (!t.format.empty()) {
        format = ui::parseExportFormat(QString::fromStdString(t.format));
        if (!format)
            return usage("--format", "expected png, svg or pdf, found \"" + t.format + "\"");
    }
    if (!t.preset.empty()) {
        const auto p = ui::parseSizePreset(QString::fromStdString(t.preset));
        if (!p)
            return usage("--preset", "expected one of " + joined(presetNames()) + ", found \"" + t.preset + "\"");
        preset = *p;
    }
    for (const auto &[option, text, target] : {std::tuple{"--width-mm", &t.widthMm, &width}, std::tuple{"--height-mm", &t.heightMm, &height}}) {
        if (text->empty())
            continue;
        const auto mm = toDouble(*text);
        if (!mm || *mm < ui::minExportMm || *mm > ui::maxExportMm)
            return usage(option, "expected a size in mm from " + std::to_string(static_cast<int>(ui::minExportMm)) + " to "
                                     + std::to_string(static_cast<int>(ui::maxExportMm)) + ", found \"" + *text + "\"");
        *target = *mm;
    }
    if (!t.dpi.empty()) {
        const auto dpi = toInt(t.dpi);
        if (!dpi || *dpi < 50 || *dpi > 1200)
            return usage("--dpi", "expected a resolution from 50 to 1200 dots per inch (150, 300 or 600 are usual), found \""
                                      + t.dpi + "\"");
        s.dpi = *dpi;
    }
    if (t.currency) {
        auto code = ui::parseCurrencyCode(QString::fromStdString(*t.currency), "--currency");
        if (!code)
            return code.error();
        s.print.currency = code.value();
    }
    if (options.workbookPath.empty())
        return usage("WORKBOOK", "expected the workbook to draw from (tailwise-cli render WORKBOOK --chart KIND --out FILE)");
    if (!kind)
        return usage("--chart", "expected one of " + joined(ui::chartKindNames()));
    if (options.outPath.empty())
        return usage("--out", "expected the file to write (FILE.png, FILE.svg or FILE.pdf)");
    if (!format)
        format = ui::exportFormatForPath(QString::fromStdString(options.outPath));
    if (!format)
        return usage("--out", "cannot tell the format from \"" + options.outPath + "\": end it in .png, .svg or .pdf, or give --format");
    if (options.noCaption && options.caption)
        return usage("--no-caption", "give either --caption TEXT or --no-caption, not both");
    s.kind = *kind;
    s.format = *format;
    const QSizeF mm = ui::sizePresetMm(preset);
    s.print.sizeMm = QSizeF(width.value_or(mm.width()), height.value_or(mm.height()));
    return options;
}

std::string renderHelpText()
{
    Texts t;
    CommandLine line("render", renderAbout, renderClosing);
    declare(line, t);
    return line.help();
}

} // namespace tailwise::cli

#include "renderoptions.h"

#include "optiontext.h"

#include "document/currencycode.h"

#include <QString>

#include <algorithm>
#include <iterator>

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

} // namespace

Result<RenderOptions> parseRenderOptions(const std::vector<std::string> &args)
{
    RenderOptions options;
    ui::ChartExportSettings &s = options.settings;
    std::optional<ui::ChartKind> kind;
    std::optional<ui::ExportFormat> format;
    std::optional<double> width, height;
    ui::SizePreset preset = ui::SizePreset::HalfPage;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &option = args[i];
        if (option == "--help" || option == "-h") {
            options.help = true;
            return options;
        }
        if (option == "--no-caption") {
            options.noCaption = true;
            continue;
        }
        if (option == "--percent") {
            s.print.lossTailUnit = ui::LossTailUnit::PercentOfValue;
            continue;
        }
        if (option.rfind("--", 0) != 0) {
            if (!options.workbookPath.empty())
                return usage(option, "unexpected argument: give one workbook (the first was \"" + options.workbookPath + "\")");
            options.workbookPath = option;
            continue;
        }
        static const char *const valued[] = {"--chart", "--out", "--format", "--preset", "--width-mm", "--height-mm",
                                             "--dpi", "--caption", "--currency"};
        if (std::find(std::begin(valued), std::end(valued), option) == std::end(valued))
            return usage(option, "unknown option (tailwise-cli render --help lists them)");
        if (i + 1 >= args.size())
            return usage(option, "expected a value after it");
        const std::string &value = args[++i];
        const QString text = QString::fromStdString(value);
        if (option == "--chart") {
            kind = ui::parseChartKind(text);
            if (!kind)
                return usage(option, "expected one of " + joined(ui::chartKindNames()) + ", found \"" + value + "\"");
        } else if (option == "--out") {
            options.outPath = value;
        } else if (option == "--format") {
            format = ui::parseExportFormat(text);
            if (!format)
                return usage(option, "expected png, svg or pdf, found \"" + value + "\"");
        } else if (option == "--preset") {
            const auto p = ui::parseSizePreset(text);
            if (!p)
                return usage(option, "expected one of " + joined(presetNames()) + ", found \"" + value + "\"");
            preset = *p;
        } else if (option == "--width-mm" || option == "--height-mm") {
            const auto mm = toDouble(value);
            if (!mm || *mm < ui::minExportMm || *mm > ui::maxExportMm)
                return usage(option, "expected a size in mm from " + std::to_string(static_cast<int>(ui::minExportMm)) + " to "
                                         + std::to_string(static_cast<int>(ui::maxExportMm)) + ", found \"" + value + "\"");
            (option == "--width-mm" ? width : height) = *mm;
        } else if (option == "--dpi") {
            const auto dpi = toInt(value);
            if (!dpi || *dpi < 50 || *dpi > 1200)
                return usage(option, "expected a resolution from 50 to 1200 dots per inch (150, 300 or 600 are usual), found \""
                                         + value + "\"");
            s.dpi = *dpi;
        } else if (option == "--caption") {
            options.caption = value;
        } else if (option == "--currency") {
            auto code = ui::parseCurrencyCode(text, option);
            if (!code)
                return code.error();
            s.print.currency = code.value();
        }
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
    return R"(tailwise-cli render: draw one chart of a workbook to a PNG, SVG or PDF file (no display needed)

Usage:
  tailwise-cli render WORKBOOK --chart KIND --out FILE [options]

  --chart KIND        loss-tail      the horizon P&L curve with the tail beyond VaR
                      tradeoff       VaR over horizon and confidence
                      contributions  each holding's part of VaR, and diversification
                      backtest       past days' P&L against their one-day VaR
                      models         VaR and ES under every model
  --out FILE          the file to write; its suffix (.png, .svg, .pdf) chooses the format
  --format F          png, svg or pdf, whatever the suffix
  --preset P          column (85 x 75 mm), half-page (170 x 110, the default),
                      full-page (170 x 230), slide (254 x 143, 16:9)
  --width-mm W        width in mm (30 to 600), instead of the preset's
  --height-mm H       height in mm (30 to 600), instead of the preset's; caption included
  --dpi D             PNG resolution, dots per inch (default 300; 150, 300 or 600 are usual)
  --caption TEXT      the caption under the chart, instead of the one written from the results
  --no-caption        no caption
  --currency CODE     named on money axes, e.g. EUR, instead of the workbook's own currency
                      (default: the workbook's; "money" when it states none)
  --percent           loss-tail: the P&L axis in % of portfolio value instead of money
  --help              this text

The figures are estimates from past prices under the workbook's assumptions: VaR is not the worst
case, and none of this is advice.
Exit status: 0 written, 1 the workbook cannot be read or the chart cannot be drawn, 2 bad options.
)";
}

} // namespace tailwise::cli

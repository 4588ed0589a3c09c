#include "packcommand.h"

#include "varoptions.h"

#include "document/workbookfile.h"

#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <QFile>
#include <QString>

#include <cstdio>

namespace tailwise::cli {

namespace {

constexpr int exitOk = 0;
constexpr int exitBadInput = 1;
constexpr int exitUsage = 2;

int fail(int code, const std::string &message)
{
    std::fprintf(stderr, "tailwise-cli: %s\n", message.c_str());
    return code;
}

} // namespace

std::string packHelpText()
{
    return R"(tailwise-cli pack: make a workbook from a price history and holdings

Usage:
  tailwise-cli pack --prices FILE --holdings FILE [assumption options] [--title T] --out FILE.tailwise

  --prices FILE        daily price history, CSV (as for tailwise-cli var)
  --holdings FILE      holdings, CSV (as for tailwise-cli var)
  --title T            the workbook's title, shown in the window and on reports
  --out FILE           the workbook to write (JSON, extension .tailwise); written atomically,
                       an existing file is replaced only when the new one is complete

The assumption options are those of tailwise-cli var (--confidence, --horizon, --window,
--estimator, ...); they are stored in the workbook, which then carries the whole analysis:
  tailwise-cli var --workbook FILE.tailwise

Exit status: 0 written, 1 bad input data or the file could not be written, 2 bad usage.
)";
}

int runPackCommand(const std::vector<std::string> &args)
{
    std::vector<std::string> varArgs;
    std::string title, out;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string &option = args[i];
        if (option == "--help" || option == "-h") {
            std::fputs(packHelpText().c_str(), stdout);
            return exitOk;
        }
        if (option == "--title" || option == "--out") {
            if (i + 1 >= args.size())
                return fail(exitUsage, option + ": expected a value after the option");
            (option == "--title" ? title : out) = args[++i];
            continue;
        }
        // Outputs and one-off questions (what-if trades, stress) are not part of a workbook.
        if (option == "--json" || option == "--workbook" || option == "--value" || option == "--volatility"
            || option == "--drift" || option == "--trade" || option == "--scenario" || option == "--worst-days")
            return fail(exitUsage, option + ": not an option of pack (see tailwise-cli pack --help)");
        varArgs.push_back(option);
    }
    auto request = parseVarOptions(varArgs);
    if (!request)
        return fail(exitUsage, request.error().message);
    if (out.empty())
        return fail(exitUsage, "--out: expected the workbook file to write (e.g. --out fund.tailwise)");
    const VarRequest &req = request.value();

    auto prices = readPriceCsv(req.pricesPath);
    if (!prices)
        return fail(exitBadInput, prices.error().message);
    auto holdings = readHoldingsCsv(req.holdingsPath, &prices.value());
    if (!holdings)
        return fail(exitBadInput, holdings.error().message);
    for (const auto &w : prices.value().warnings)
        std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());

    ui::WorkbookContents contents;
    contents.title = QString::fromStdString(title);
    contents.prices = std::move(prices).value();
    contents.holdings = std::move(holdings).value();
    contents.assumptions = req.assumptions;
    const auto saved = ui::saveWorkbook(contents, QFile::decodeName(out.c_str()));
    if (!saved)
        return fail(exitBadInput, saved.error().message);
    std::printf("wrote %s: %d assets, %d days, %zu holdings\n", out.c_str(), contents.prices.assetCount(),
                contents.prices.dayCount(), contents.holdings.size());
    return exitOk;
}

} // namespace tailwise::cli

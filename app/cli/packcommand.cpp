#include "packcommand.h"

#include "exitstatus.h"

#include "dailyrun.h"
#include "varoptions.h"

#include "document/currencycode.h"
#include "document/workbookfile.h"

#include "tailwise/backtest.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"
#include "tailwise/stress.h"

#include <QFile>
#include <QString>

#include <algorithm>
#include <charconv>
#include <cstdio>
#include <optional>

namespace tailwise::cli {

namespace {

// --backtest-window W, --backtest-test-size A, --backtest-models LIST: the window's backtest
// settings, stored when any of them is given. Ok, or the usage message naming the option.
std::optional<std::string> readBacktestOption(const std::string &option, const std::string &value,
                                              ui::BacktestSettings &b)
{
    if (option == "--backtest-window") {
        int w = 0;
        const auto [end, ec] = std::from_chars(value.data(), value.data() + value.size(), w);
        if (value.empty() || ec != std::errc() || end != value.data() + value.size() || w < 2)
            return option + ": expected a whole number of returns of at least 2, found \"" + value + "\"";
        b.window = w;
        return std::nullopt;
    }
    if (option == "--backtest-test-size") {
        double a = 0.0;
        const auto [end, ec] = std::from_chars(value.data(), value.data() + value.size(), a);
        if (value.empty() || ec != std::errc() || end != value.data() + value.size() || !(a > 0.0 && a < 1.0))
            return option + ": expected a test size between 0 and 1 (e.g. 0.05), found \"" + value + "\"";
        b.testSize = a;
        return std::nullopt;
    }
    b.models.clear();
    std::size_t start = 0;
    while (start <= value.size()) {
        std::size_t end = value.find(',', start);
        if (end == std::string::npos)
            end = value.size();
        const std::string name = value.substr(start, end - start);
        const auto model = parseRiskModel(name);
        if (!model || !checkBacktestModel(*model).ok()) {
            std::string known;
            for (const RiskModel m : backtestModels())
                known += (known.empty() ? "" : ", ") + std::string(toName(m));
            return option + ": expected models the backtest runs, separated by commas (" + known + "), found \"" + name + "\"";
        }
        if (std::find(b.models.begin(), b.models.end(), *model) != b.models.end())
            return option + ": the model \"" + name + "\" appears twice";
        b.models.push_back(*model);
        start = end + 1;
    }
    return std::nullopt;
}

} // namespace

std::string packHelpText()
{
    return R"(tailwise-cli pack: make a workbook from a price history and holdings

Usage:
  tailwise-cli pack --prices FILE --holdings FILE [assumption options] [--title T]
                    [--currency CODE] --out FILE.tailwise

  --prices FILE        daily price history, CSV (as for tailwise-cli var)
  --holdings FILE      holdings, CSV (as for tailwise-cli var)
  --title T            the workbook's title, shown in the window and on reports
  --currency CODE      the currency the prices and values are in, three capital letters
                       (e.g. EUR, GBP, USD); named beside money figures and on money axes.
                       Only a label: nothing is converted. Not stated when not given
  --out FILE           the workbook to write (JSON, extension .tailwise); written atomically,
                       an existing file is replaced only when the new one is complete
  --backtest-window W  the window's backtest settings, stored when any of these three is given:
  --backtest-test-size A   rolling window of W returns (default 250), test size of the verdicts
  --backtest-models LIST   (default 0.05) and the models, comma-separated, the first one drawn
                       and the others compared with it (default normal)
  --scenario FILE      a stress scenario to keep in the workbook (CSV asset,shock as for
                       tailwise-cli var; named by the file name without folder and extension);
                       repeatable, kept in the order given, names must differ
  --limit SPEC         a limit on VaR or ES to keep in the workbook, checked at every run;
                       repeatable: MEASURE=AMOUNT[%][,warn=W%][,group=NAME], MEASURE var or es,
                       AMOUNT money or percent of value (%), warning level 80% unless stated

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
    QString currency;
    std::optional<ui::BacktestSettings> backtest;
    std::vector<std::string> scenarioPaths;
    DailyOptions daily; // --limit, stored in the workbook
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
        if (option == "--currency") {
            if (i + 1 >= args.size())
                return fail(exitUsage, option + ": expected a value after the option");
            auto code = ui::parseCurrencyCode(QString::fromStdString(args[++i]), option);
            if (!code)
                return fail(exitUsage, code.error().message);
            currency = code.value();
            continue;
        }
        if (option == "--backtest-window" || option == "--backtest-test-size" || option == "--backtest-models") {
            if (i + 1 >= args.size())
                return fail(exitUsage, option + ": expected a value after the option");
            if (!backtest)
                backtest = ui::BacktestSettings{};
            if (const auto problem = readBacktestOption(option, args[++i], *backtest))
                return fail(exitUsage, *problem);
            continue;
        }
        if (option == "--limit") {
            if (i + 1 >= args.size())
                return fail(exitUsage, option + ": expected a limit such as var=250000 after the option");
            daily.limits.push_back(args[++i]);
            continue;
        }
        if (option == "--scenario") {
            if (i + 1 >= args.size())
                return fail(exitUsage, option + ": expected a scenario file (CSV) after the option");
            scenarioPaths.push_back(args[++i]);
            continue;
        }
        // Outputs and one-off questions (what-if trades, the worst days) are not part of a workbook.
        if (option == "--json" || option == "--workbook" || option == "--value" || option == "--volatility"
            || option == "--drift" || option == "--trade" || option == "--worst-days")
            return fail(exitUsage, option + ": not an option of pack (see tailwise-cli pack --help)");
        varArgs.push_back(option);
    }
    auto request = parseVarOptions(varArgs);
    if (!request)
        return fail(exitUsage, request.error().message);
    if (out.empty())
        return fail(exitUsage, "--out: expected the workbook file to write (e.g. --out fund.tailwise)");
    const VarRequest &req = request.value();
    const auto limits = applyDailyOptions(daily, {});
    if (!limits)
        return fail(exitUsage, limits.error().message);

    auto prices = readPriceCsv(req.pricesPath);
    if (!prices)
        return fail(exitBadInput, prices.error().message);
    auto holdings = readHoldingsCsv(req.holdingsPath, &prices.value());
    if (!holdings)
        return fail(exitBadInput, holdings.error().message);
    for (const auto &w : prices.value().warnings)
        std::fprintf(stderr, "tailwise-cli: warning: %s\n", w.c_str());

    std::vector<StressScenario> scenarios;
    for (const std::string &path : scenarioPaths) {
        auto scenario = readScenarioCsv(path, &prices.value());
        if (!scenario)
            return fail(exitBadInput, scenario.error().message);
        for (const StressScenario &s : scenarios)
            if (s.name == scenario.value().name)
                return fail(exitUsage, "--scenario " + path + ": a scenario named \"" + s.name
                                           + "\" is already given (names come from the file names)");
        scenarios.push_back(std::move(scenario).value());
    }

    ui::WorkbookContents contents;
    contents.title = QString::fromStdString(title);
    contents.currency = currency;
    contents.prices = std::move(prices).value();
    contents.holdings = std::move(holdings).value();
    contents.assumptions = req.assumptions;
    contents.backtest = backtest;
    contents.scenarios = std::move(scenarios);
    contents.limits = limits.value().limits;
    const auto saved = ui::saveWorkbook(contents, QFile::decodeName(out.c_str()));
    if (!saved)
        return fail(exitBadInput, saved.error().message);
    std::printf("wrote %s: %d assets, %d days, %zu holdings\n", out.c_str(), contents.prices.assetCount(),
                contents.prices.dayCount(), contents.holdings.size());
    return exitOk;
}

} // namespace tailwise::cli

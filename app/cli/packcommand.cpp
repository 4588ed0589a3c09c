#include "packcommand.h"

#include "exitstatus.h"

#include "commandline.h"
#include "dailyrun.h"
#include "optiongroups.h"
#include "optiontext.h"

#include "document/currencycode.h"
#include "document/workbookfile.h"

#include "tailwise/backtest.h"
#include "tailwise/filewrite.h"
#include "tailwise/textlimits.h"
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


const char *packAbout = R"(tailwise-cli pack: make a workbook from a price history and holdings

Usage:
  tailwise-cli pack --prices FILE --holdings FILE [assumption options] [--title T]
                    [--currency CODE] --out FILE.tailwise

The assumptions are stored in the workbook, which then carries the whole analysis:
  tailwise-cli var --workbook FILE.tailwise)";

const char *packClosing = R"(Exit status: 0 written, 1 bad input data or the file could not be written, 2 bad usage.
)";

struct PackOptions {
    InputOptions inputs;
    AssumptionOptions assumptions;
    ModelOptions model;
    WhatIfOptions kept; // --scenario
    std::string title, out;
    std::optional<std::string> currency, backtestWindow, backtestTestSize, backtestModels;
    std::vector<std::string> limits; // --limit, stored in the workbook (dailyrun.h)
    OutputOptions output;
};

void declare(CommandLine &line, PackOptions &o)
{
    declareInputOptions(line, o.inputs, Command::Pack);
    declareAssumptionOptions(line, o.assumptions, Command::Pack);
    declareModelOptions(line, o.model, Command::Pack);
    declareWhatIfOptions(line, o.kept, Command::Pack);
    line.section("Workbook");
    line.value("--title", o.title, "T", "the workbook's title, shown in the window and on reports");
    line.value("--currency", o.currency, "CODE",
               "the currency the prices and values are in, three capital letters\n"
               "(e.g. EUR, GBP, USD); named beside money figures and on money axes.\n"
               "Only a label: nothing is converted. Not stated when not given");
    line.value("--backtest-window", o.backtestWindow, "W",
               "the window's backtest settings, stored when any of these three is\ngiven: rolling window of W returns (default 250),");
    line.value("--backtest-test-size", o.backtestTestSize, "A", "test size of the verdicts (default 0.05)");
    line.value("--backtest-models", o.backtestModels, "LIST",
               "the models, comma-separated, the first one drawn and the others\ncompared with it (default normal)");
    line.repeatable("--limit", o.limits, "SPEC",
                    "a limit on VaR or ES to keep in the workbook, checked at every run:\n"
                    "MEASURE=AMOUNT[%][,warn=W%][,group=NAME], MEASURE var or es, AMOUNT\n"
                    "money or percent of value (%), warning level 80% unless stated");
    declareOutputOptions(line, o.output, Command::Pack);
    line.value("--out", o.out, "FILE",
               "the workbook to write (JSON, extension .tailwise), or - for standard\n"
               "output; written atomically: an existing regular file is replaced only\n"
               "when the new one is complete, never one of the inputs");
}

} // namespace

std::string packHelpText()
{
    PackOptions o;
    CommandLine line("pack", packAbout, packClosing);
    declare(line, o);
    return line.help();
}

int runPackCommand(const std::vector<std::string> &args)
{
    PackOptions o;
    CommandLine line("pack", packAbout, packClosing);
    declare(line, o);
    if (auto ok = line.parse(args); !ok)
        return fail(exitUsage, ok.error().message);
    if (line.helpWanted()) {
        std::fputs(line.help().c_str(), stdout);
        return exitOk;
    }
    Assumptions assumptions;
    if (auto ok = applyAssumptionOptions(o.assumptions, assumptions); !ok)
        return fail(exitUsage, ok.error().message);
    if (auto ok = applyModelOptions(o.model, assumptions, Command::Pack); !ok)
        return fail(exitUsage, ok.error().message);
    if (auto ok = checkAssumptions(assumptions); !ok)
        return fail(exitUsage, ok.error().message);
    if (auto ok = checkModelParameters(o.model, assumptions, Command::Pack); !ok)
        return fail(exitUsage, ok.error().message);
    if (auto ok = checkInputOptions(o.inputs, Command::Pack); !ok)
        return fail(exitUsage, ok.error().message);
    QString currency;
    if (o.currency) {
        auto code = ui::parseCurrencyCode(QString::fromStdString(*o.currency), "--currency");
        if (!code)
            return fail(exitUsage, code.error().message);
        currency = code.value();
    }
    std::optional<ui::BacktestSettings> backtest;
    for (const auto &[option, text] : {std::pair{"--backtest-window", &o.backtestWindow},
                                       std::pair{"--backtest-test-size", &o.backtestTestSize},
                                       std::pair{"--backtest-models", &o.backtestModels}}) {
        if (!*text)
            continue;
        if (!backtest)
            backtest = ui::BacktestSettings{};
        if (const auto problem = readBacktestOption(option, **text, *backtest))
            return fail(exitUsage, *problem);
    }
    DailyOptions daily;
    daily.limits = o.limits;
    const auto limits = applyDailyOptions(daily, {});
    if (!limits)
        return fail(exitUsage, limits.error().message);
    if (o.out.empty())
        return fail(exitUsage, "--out: expected the workbook file to write (e.g. --out fund.tailwise)");
    const std::vector<std::string> &scenarioPaths = o.kept.scenarios;
    {
        std::vector<std::string> inputs{o.inputs.prices, o.inputs.holdings};
        inputs.insert(inputs.end(), scenarioPaths.begin(), scenarioPaths.end());
        if (auto ok = checkOutputIsNotAnInput(o.out, inputs); !ok)
            return fail(exitUsage, ok.error().message);
    }
    if (const auto problem = checkText(o.title, maxTitleChars))
        return fail(exitUsage, "--title: " + describeTextProblem(*problem, "the title", maxTitleChars));
    const std::string title = o.title;
    const std::string out = o.out;
    struct {
        std::string pricesPath, holdingsPath;
        Assumptions assumptions;
    } req{o.inputs.prices, o.inputs.holdings, assumptions};

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
    if (out == "-") { // --out -: the workbook to standard output, the summary to the error stream
        const auto json = ui::workbookJson(contents);
        if (!json)
            return fail(exitBadInput, json.error().message);
        if (auto written = writeStandardOutput(std::string_view(json.value().constData(), json.value().size())); !written)
            return fail(exitBadInput, written.error().message);
        std::fprintf(stderr, "tailwise-cli: wrote the workbook to standard output: %d assets, %d days, %zu holdings\n",
                     contents.prices.assetCount(), contents.prices.dayCount(), contents.holdings.size());
        return exitOk;
    }
    const auto saved = ui::saveWorkbook(contents, QFile::decodeName(out.c_str()));
    if (!saved)
        return fail(exitBadInput, saved.error().message);
    std::printf("wrote %s: %d assets, %d days, %zu holdings\n", out.c_str(), contents.prices.assetCount(),
                contents.prices.dayCount(), contents.holdings.size());
    return exitOk;
}

} // namespace tailwise::cli

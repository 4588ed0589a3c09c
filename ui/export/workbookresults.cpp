#include "export/workbookresults.h"

#include "document/backtestrequest.h"
#include "text/assumptionlabels.h"

#include <QCoreApplication>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("WorkbookResults", text); }

QString sentence(const std::string &message) { return QString::fromStdString(message); }

// Every chart's data from the parts `r` has, naming r.currency on the money axes.
void buildChartData(WorkbookResults &r)
{
    LossTailOptions lossTail;
    lossTail.currency = r.currency;
    r.lossTail = buildLossTailChartData(r.report, lossTail);
    TradeoffOptions tradeoff;
    tradeoff.currency = r.currency;
    if (!r.tradeoffGrid)
        r.tradeoffGrid = computeTradeoffGrid(r.report, tradeoff);
    r.tradeoff = buildTradeoffChartData(r.report, *r.tradeoffGrid, tradeoff);
    ContributionsOptions contributions;
    contributions.currency = r.currency;
    r.contributions = buildContributionsChartData(r.report, contributions);
    r.backtestChart.reset();
    if (r.backtest)
        r.backtestChart = buildBacktestChartData(*r.backtest, modelLabel(r.backtest->assumptions.model),
                                                 r.currency);
    r.modelsChart.reset();
    if (r.models)
        r.modelsChart = buildModelComparisonChartData(*r.models, r.report.portfolioValue, r.report.assumptions, r.currency);
}

} // namespace

QString riskModelTitle(RiskModel model)
{
    return modelLabel(model);
}

WorkbookResults assembleWorkbookResults(const QString &title, const RiskReport &report, const BacktestSettings &settings,
                                        const std::optional<Result<BacktestResult>> &backtest,
                                        const std::optional<Result<std::vector<ModelRow>>> &models,
                                        const QString &currency, std::optional<Result<RiskGrid>> tradeoffGrid)
{
    WorkbookResults r;
    r.tradeoffGrid = std::move(tradeoffGrid);
    r.title = title;
    r.currency = currency;
    r.report = report;
    r.backtestSettings = settings;

    if (!backtest) {
        r.backtestProblem = tr("The backtest has not been computed yet.");
    } else if (!*backtest) {
        r.backtestProblem = sentence(backtest->error().message);
    } else {
        r.backtest = backtest->value();
    }

    if (!models) {
        r.modelsProblem = tr("The model comparison has not been computed yet.");
    } else if (!*models) {
        r.modelsProblem = sentence(models->error().message);
    } else {
        r.models = models->value();
    }
    buildChartData(r);
    return r;
}

WorkbookResults relabelWorkbookResults(const WorkbookResults &results, const QString &currency)
{
    WorkbookResults r = results;
    r.currency = currency;
    buildChartData(r);
    return r;
}

Result<WorkbookResults> computeWorkbookResults(const WorkbookContents &contents)
{
    auto report = computeRisk(contents.prices, contents.holdings, contents.assumptions);
    if (!report)
        return report.error();
    const BacktestSettings settings = contents.backtest.value_or(BacktestSettings{});
    std::optional<Result<BacktestResult>> backtest;
    if (settings.models.empty())
        backtest = Result<BacktestResult>(fieldError(ErrorKind::Assumption, "backtest.models", "the workbook's backtest names no model"));
    else
        backtest = runBacktest(backtestRequestFor(contents, settings, settings.models.front()));
    std::optional<Result<std::vector<ModelRow>>> models =
        compareModels(contents.prices, contents.holdings, contents.assumptions);
    return assembleWorkbookResults(contents.title, report.value(), settings, backtest, models, contents.currency);
}

} // namespace tailwise::ui

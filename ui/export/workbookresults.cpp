#include "export/workbookresults.h"

#include "document/backtestrequest.h"
#include "models/modelcomparisonmodel.h"

#include <QCoreApplication>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("WorkbookResults", text); }

QString sentence(const std::string &message) { return QString::fromStdString(message); }

} // namespace

QString riskModelTitle(RiskModel model)
{
    return ModelComparisonModel::modelName(model);
}

WorkbookResults assembleWorkbookResults(const QString &title, const RiskReport &report, const BacktestSettings &settings,
                                        const std::optional<Result<BacktestResult>> &backtest,
                                        const std::optional<Result<std::vector<ModelRow>>> &models)
{
    WorkbookResults r;
    r.title = title;
    r.report = report;
    r.backtestSettings = settings;
    r.lossTail = buildLossTailChartData(report);
    r.tradeoff = buildTradeoffChartData(report);
    r.contributions = buildContributionsChartData(report);

    if (!backtest) {
        r.backtestProblem = tr("The backtest has not been computed yet.");
    } else if (!*backtest) {
        r.backtestProblem = sentence(backtest->error().message);
    } else {
        r.backtest = backtest->value();
        r.backtestChart = buildBacktestChartData(*r.backtest, riskModelTitle(r.backtest->assumptions.model));
    }

    if (!models) {
        r.modelsProblem = tr("The model comparison has not been computed yet.");
    } else if (!*models) {
        r.modelsProblem = sentence(models->error().message);
    } else {
        r.models = models->value();
        r.modelsChart = buildModelComparisonChartData(*r.models, report.portfolioValue, report.assumptions);
    }
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
    return assembleWorkbookResults(contents.title, report.value(), settings, backtest, models);
}

} // namespace tailwise::ui

// WorkbookResults: everything the charts, captions and reports of a workbook show, computed
// headless from its contents (no window, no Workbook object, no background jobs).
//
// The parts, each from core:
//   report    — computeRisk at the workbook's assumptions (risk.h); without it nothing can be drawn,
//               so its error is the error of the whole;
//   backtest  — runBacktest of the first backtest model (backtest.h), with the workbook's
//               BacktestSettings or the defaults (document/backtestrequest.h builds the request,
//               as the window's runner does);
//   models    — compareModels at the same assumptions (comparison.h).
// A part that cannot be had (too little history for the rolling window, a model refused) is not a
// failure of the whole: its optional stays empty and its *Problem holds the sentence to show.
// The chart data of every kind is built here too, by the charts' own pure builders, so a chart,
// its caption and a report quote the same numbers.
#pragma once

#include "charts/backtestchartdata.h"
#include "charts/contributionschartdata.h"
#include "charts/losstailchartdata.h"
#include "charts/modelcomparisonchartdata.h"
#include "charts/tradeoffchartdata.h"
#include "document/workbookcontents.h"

#include "tailwise/backtest.h"
#include "tailwise/comparison.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"

#include <QString>

#include <optional>
#include <vector>

namespace tailwise::ui {

struct WorkbookResults {
    QString title;                                   // the workbook's title (may be empty)
    QString currency;                                // the code the chart data's money axes name (may be empty)
    tailwise::RiskReport report;

    BacktestSettings backtestSettings;               // as used (the workbook's, or the defaults)
    std::optional<tailwise::BacktestResult> backtest; // of backtestSettings.models.front()
    QString backtestProblem;                         // why there is none, when there is none

    std::optional<std::vector<tailwise::ModelRow>> models; // compareModels rows
    QString modelsProblem;

    // The horizon-and-confidence grid the tradeoff chart slices (computeTradeoffGrid of report):
    // kept so that a relabel does not compute it again.
    std::optional<tailwise::Result<tailwise::RiskGrid>> tradeoffGrid;

    // The charts' numbers, from their builders (print defaults: money axis, history bars on).
    LossTailChartData lossTail;
    TradeoffChartData tradeoff;
    ContributionsChartData contributions;
    std::optional<BacktestChartData> backtestChart;  // with `backtest`
    std::optional<ModelComparisonChartData> modelsChart; // with `models`
};

// Computes every part on the calling thread (the backtest and Monte Carlo take a second or two
// on the sample). Errors: computeRisk's, when the workbook's figures cannot be computed.
tailwise::Result<WorkbookResults> computeWorkbookResults(const WorkbookContents &contents);

// The same from parts already computed (the window has them from its own background jobs):
// `backtest` and `models` unset mean "not computed yet" and leave a problem saying so;
// `tradeoffGrid`, when given, is computeTradeoffGrid(report) (the store's Grid part), else it is
// computed here.
WorkbookResults assembleWorkbookResults(const QString &title, const tailwise::RiskReport &report,
                                        const BacktestSettings &backtestSettings,
                                        const std::optional<tailwise::Result<tailwise::BacktestResult>> &backtest,
                                        const std::optional<tailwise::Result<std::vector<tailwise::ModelRow>>> &models,
                                        const QString &currency = {},
                                        std::optional<tailwise::Result<tailwise::RiskGrid>> tradeoffGrid = {});

// The same results with every chart's data rebuilt to name `currency` on its money axes (an
// export told another currency than the workbook's). Cheap: the builders only arrange numbers.
WorkbookResults relabelWorkbookResults(const WorkbookResults &results, const QString &currency);

// The model's name as the window's backtest view and comparison table give it ("Normal").
QString riskModelTitle(tailwise::RiskModel model);

} // namespace tailwise::ui

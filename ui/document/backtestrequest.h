// The request a backtest of one model gets from a workbook's contents (core: runBacktest,
// backtest.h): the workbook's assumptions (confidence, returns, estimator, λ, mean, ν) with the
// settings' rolling window W and the model, at a horizon of one day — a backtest of one-day VaR,
// whatever the headline's horizon. The window's runner and the headless export share it, so a
// chart exported from the command line shows the same backtest as the window.
#pragma once

#include "document/workbookcontents.h"

#include "tailwise/backtest.h"

namespace tailwise::ui {

tailwise::BacktestRequest backtestRequestFor(const WorkbookContents &contents, const BacktestSettings &settings,
                                             tailwise::RiskModel model);

} // namespace tailwise::ui

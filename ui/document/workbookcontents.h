// WorkbookContents: everything a workbook stores — the inputs of an analysis, without the
// document machinery (undo, signals, results). A plain value, so that the workbook file
// (workbookfile.h) and the command line can use it with QtCore alone.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/holdings.h"
#include "tailwise/limits.h"
#include "tailwise/prices.h"
#include "tailwise/result.h"
#include "tailwise/stress.h"

#include <QString>

#include <optional>
#include <vector>

namespace tailwise::ui {

// How the window backtests the holdings (backtest.h): the rolling window W, the test size at
// which the Kupiec and Christoffersen tests give their verdict, and the models. The first model
// is the one drawn and listed; the others, when there are any, are compared with it side by side.
// The rest of the method (confidence, returns, estimator, λ, mean, ν) is the workbook's assumptions.
struct BacktestSettings {
    int window = 250;                                            // W, returns per forecast
    double testSize = 0.05;                                      // reject when p-value < this
    std::vector<tailwise::RiskModel> models{tailwise::RiskModel::Normal};
    friend bool operator==(const BacktestSettings &, const BacktestSettings &) = default;
};

struct WorkbookContents {
    QString title;                 // shown in the window title and on reports
    // The currency every money figure is in, as a code such as "EUR" (currencycode.h); empty: not
    // stated, and money axes say "money". Labels only: no figure depends on it.
    QString currency;
    tailwise::PriceHistory prices; // embedded: a workbook carries its own data
    tailwise::Holdings holdings;
    tailwise::Assumptions assumptions;
    std::optional<BacktestSettings> backtest; // unset: the window's defaults (BacktestSettings{})
    // Named per-asset price shocks (stress.h), in the order shown; every asset is in `prices`.
    std::vector<tailwise::StressScenario> scenarios;
    // Limits on VaR and ES (limits.h), checked at every run; written as their text form
    // ("var=250000", "es=2.5%,warn=90%").
    std::vector<tailwise::Limit> limits;
    // What reading the file noted (e.g. absent assumptions that took their defaults): shown when
    // the file is opened, never written back.
    tailwise::Warnings warnings;
};

} // namespace tailwise::ui

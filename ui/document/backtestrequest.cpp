#include "document/backtestrequest.h"

namespace tailwise::ui {

BacktestRequest backtestRequestFor(const WorkbookContents &contents, const BacktestSettings &settings, RiskModel model)
{
    BacktestRequest request;
    request.prices = contents.prices;
    request.holdings = contents.holdings;
    request.assumptions = contents.assumptions;
    request.assumptions.window = settings.window;
    request.assumptions.model = model;
    request.assumptions.horizonDays = 1; // a backtest of one-day VaR, whatever the headline's horizon
    return request;
}

} // namespace tailwise::ui

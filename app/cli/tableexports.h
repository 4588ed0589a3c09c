// The command line's tables for colleagues (tailwise/xlsx/tableexport.h): the var command's
// summary, contributions and limits, and the history of recorded runs, each as one table, so that
// `--xlsx FILE` writes one sheet per table and `history --csv` prints the history table.
#pragma once

#include "varextras.h"

#include "tailwise/backtest.h"
#include "tailwise/risk.h"
#include "tailwise/store/historystore.h"
#include "tailwise/xlsx/tableexport.h"

#include <string>
#include <vector>

namespace tailwise::cli {

std::vector<xlsx::Table> varTables(const RiskReport &report, const ReportExtras &extras);
Status writeVarWorkbook(const std::string &path, const RiskReport &report, const ReportExtras &extras);

// The backtest's days and its exceptions, one sheet each.
std::vector<xlsx::Table> backtestTables(const BacktestResult &result);

// One row per run: workbook, as-of date, value, VaR, ES, realised P&L, change in VaR and ES from
// the workbook's previous record and what changed, the worst limit state, hashes, version.
struct HistoryRow {
    store::RunRecord run;
    std::optional<double> varChange, esChange;
    std::vector<std::string> changed; // "holdings", "market data", "assumptions"
    std::string worstLimitState;      // "", "ok", "warning", "breached"
};
std::vector<HistoryRow> historyRows(const std::vector<store::RunRecord> &runs);
xlsx::Table historyTable(const std::vector<HistoryRow> &rows);

} // namespace tailwise::cli

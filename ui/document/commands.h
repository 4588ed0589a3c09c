// Every user edit of a workbook, as an undo command with readable text for the Edit menu.
// Panels call these free functions; the command classes stay inside commands.cpp.
//
// Runs of edits to the same field (a slider drag, spin-box steps) merge into one undo step:
// pass the field's MergeKey; consecutive setAssumptions() calls with the same non-None key merge.
#pragma once

#include "workbook.h"

#include <QString>

#include <vector>

namespace tailwise::ui::edit {

enum class MergeKey {
    None = 0,
    Confidence,
    Horizon,
    DaysPerYear,
    Window,
    Lambda,
    Other,
    BacktestWindow,
    BacktestTestSize,
};

// Changes one holding (quantity, price override, asset, …). `text` e.g. "Change quantity of ABC".
void setHolding(Workbook &workbook, int row, const tailwise::Holding &holding, const QString &text);
// Inserts holdings before `row` (row == count appends): add, duplicate, paste.
void insertHoldings(Workbook &workbook, int row, const tailwise::Holdings &holdings, const QString &text);
// Removes the given rows (any order, duplicates ignored) in one undo step.
void removeHoldings(Workbook &workbook, std::vector<int> rows);
// Replaces all holdings in one step (import, paste over everything).
void replaceHoldings(Workbook &workbook, const tailwise::Holdings &holdings, const QString &text);
// Sets the assumptions; see MergeKey above.
void setAssumptions(Workbook &workbook, const tailwise::Assumptions &assumptions, const QString &text,
                    MergeKey key = MergeKey::None);
// Replaces the price history (import). Precondition: every holding's asset is in `prices`
// (check with tailwise::checkHoldings first and refuse otherwise, so nothing changes).
void replacePrices(Workbook &workbook, const tailwise::PriceHistory &prices, const QString &text);
void setTitle(Workbook &workbook, const QString &title);
// Sets the currency code (trimmed; empty: not stated). A text that is not a code (currencycode.h)
// changes nothing and comes back as the error to show; does nothing when it is unchanged.
tailwise::Result<QString> setCurrency(Workbook &workbook, const QString &text);
// Sets the backtest settings (stored in the workbook from then on); consecutive calls with the
// same non-None key merge. Does nothing when they are what the workbook already has.
void setBacktestSettings(Workbook &workbook, const BacktestSettings &settings, const QString &text,
                         MergeKey key = MergeKey::None);
// Replaces the list of stress scenarios (add, rename, edit a shock, remove) in one step.
// Precondition: every shocked asset is in the workbook's price history.
void setScenarios(Workbook &workbook, const std::vector<tailwise::StressScenario> &scenarios, const QString &text);

} // namespace tailwise::ui::edit

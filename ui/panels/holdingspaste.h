// Reading a block of holdings pasted from a spreadsheet.
//
// The block is rows of cells separated by tabs (what spreadsheets put on the clipboard; commas
// are accepted when no row has a tab): asset, quantity and optionally a price. A first row whose
// quantity cell is not a number is taken as a header and skipped. Each row updates the holding of
// that asset when it is already held, or adds one otherwise, so the result is the whole new list
// of holdings and the paste is one undo step.
#pragma once

#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <QString>

namespace tailwise::ui {

struct PastedHoldings {
    tailwise::Holdings holdings; // the complete list after the paste
    int added = 0;
    int updated = 0;
    QString error; // non-empty: nothing is to change; names the pasted row and the cell
};

PastedHoldings mergePastedHoldings(const QString &text, const tailwise::Holdings &current,
                                   const tailwise::PriceHistory &prices);

} // namespace tailwise::ui

// WorkbookContents: everything a workbook stores — the inputs of an analysis, without the
// document machinery (undo, signals, results). A plain value, so that the workbook file
// (workbookfile.h) and the command line can use it with QtCore alone.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/holdings.h"
#include "tailwise/prices.h"

#include <QString>

namespace tailwise::ui {

struct WorkbookContents {
    QString title;                 // shown in the window title and on reports
    tailwise::PriceHistory prices; // embedded: a workbook carries its own data
    tailwise::Holdings holdings;
    tailwise::Assumptions assumptions;
};

} // namespace tailwise::ui

// Table columns that fit their contents without letting one long name (up to 100 characters,
// tailwise/textlimits.h) push the table, the panel and the window apart: a column is at most about
// text/names.h's shortNameChars wide, a longer text is elided in the middle, and the cell's
// tooltip gives it whole.
#pragma once

class QTableView;
class QTableWidgetItem;

namespace tailwise::ui {

// For columns that follow their contents (QHeaderView::ResizeToContents): caps them.
void capColumnWidths(QTableView *view);
// For columns the user may resize: fits them to their contents once, then caps each.
void fitColumnsCapped(QTableView *view);
// The item's text whole in its tooltip when the column may elide it.
void showWholeTextInTooltip(QTableWidgetItem *item);

} // namespace tailwise::ui

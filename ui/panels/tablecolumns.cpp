#include "tablecolumns.h"

#include "text/names.h"

#include <QFontMetrics>
#include <QHeaderView>
#include <QTableView>
#include <QTableWidgetItem>

namespace tailwise::ui {

namespace {

int widestColumn(const QTableView *view)
{
    // A name of shortNameChars average characters, plus the cell's margins.
    return view->fontMetrics().averageCharWidth() * (shortNameChars + 2) + 16;
}

} // namespace

void capColumnWidths(QTableView *view)
{
    view->setTextElideMode(Qt::ElideMiddle);
    view->horizontalHeader()->setMaximumSectionSize(widestColumn(view));
}

void fitColumnsCapped(QTableView *view)
{
    view->setTextElideMode(Qt::ElideMiddle);
    view->resizeColumnsToContents();
    const int widest = widestColumn(view);
    QHeaderView *header = view->horizontalHeader();
    for (int c = 0; c < header->count(); ++c)
        if (header->sectionSize(c) > widest)
            header->resizeSection(c, widest);
}

void showWholeTextInTooltip(QTableWidgetItem *item)
{
    if (item->text().size() > shortNameChars && item->toolTip().isEmpty())
        item->setToolTip(item->text());
}

} // namespace tailwise::ui

// ReportDocument: what a PDF report says, as plain blocks in reading order — text, key figures,
// tables and figures — before any page exists. The sections (reportsections.h) fill it from
// results; the page layout (reportpdf.h) flows it onto A4 pages. Keeping the two apart lets a
// test read the report's words without drawing, and the layout stay free of finance.
#pragma once

#include <QString>
#include <QStringList>

#include <functional>
#include <variant>
#include <vector>

class QPainter;
class QRectF;

namespace tailwise::ui::report {

enum class TextStyle {
    Title,      // the workbook's title, once at the top
    Heading,    // a section; kept on the page of what follows it
    Subheading, // a part of a section; kept with what follows it too
    Body,
    Note,       // smaller: captions, how-to-read lines, warnings
};

struct Text {
    TextStyle style = TextStyle::Body;
    QString text;
};

// A row of large figures, each with a label above and a detail line below (headline figures).
struct KeyFigures {
    struct Item {
        QString label;
        QString value;
        QString detail;
    };
    std::vector<Item> items;
};

struct Column {
    QString title;
    bool numeric = false; // right-aligned, so that digits line up
    double weight = 1.0;  // share of the table's width
};

// A table that may run over several pages: its header is repeated on each, and never left at
// the foot of a page without rows under it.
struct Table {
    std::vector<Column> columns;
    std::vector<QStringList> rows;  // one text per column
    bool header = true;             // false for a two-column listing (label, value)
    int boldLastRows = 0;           // e.g. a total row
    std::vector<int> boldRows;      // further rows set in bold (e.g. the current setting)
};

// A picture drawn by `paint` into the rectangle it is given (in device units of the page);
// its height is `aspect` × the text width. Kept whole on one page.
struct Figure {
    double aspect = 0.5;
    std::function<void(QPainter &, const QRectF &)> paint;
};

struct PageBreak {};

using Block = std::variant<Text, KeyFigures, Table, Figure, PageBreak>;

struct Document {
    QString workbookName; // in every page's header
    QString dateText;     // in every page's header: the day the report was made
    QString footerNote;   // in every page's footer, beside "page n of m"
    // The file's metadata (XMP, ISO 16684-1): its title is workbookName; the subject says what the
    // report is, the keywords carry the run's stamp (version, as-of date, seed, input SHA-256) so
    // that a PDF found in a folder can be traced without opening it.
    QString subject;
    QStringList keywords;
    std::vector<Block> blocks;

    void add(TextStyle style, const QString &text) { blocks.emplace_back(Text{style, text}); }
    void add(Block block) { blocks.push_back(std::move(block)); }
    // Every word of the report in reading order (headers and footers aside), one block a line:
    // for tests and for a check that no figure reads "nan".
    QString plainText() const;
};

} // namespace tailwise::ui::report

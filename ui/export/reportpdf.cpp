#include "reportpdf.h"

#include "document/savefile.h"

#include <QBuffer>
#include <QCoreApplication>
#include <QDir>
#include <QFontMetricsF>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>

#include <algorithm>
#include <cmath>

namespace tailwise::ui::report {

namespace {

constexpr int kDpi = 300;
constexpr double kMarginSideMm = 20.0;
constexpr double kMarginTopMm = 24.0;    // the header sits inside it
constexpr double kMarginBottomMm = 22.0; // the footer sits inside it
constexpr int kRowsWithHeader = 2;       // a table's header never goes without this many rows
constexpr double kFigureShrinkTo = 0.8;  // a figure may be drawn down to this share of its size

template <class... Ts>
struct Overloaded : Ts... {
    using Ts::operator()...;
};
template <class... Ts>
Overloaded(Ts...) -> Overloaded<Ts...>;

QFont baseFont(double points, bool bold = false)
{
    // A sans family found on common Linux, Windows and macOS set-ups; the style hint covers the rest.
    QFont font;
    font.setFamilies({QStringLiteral("DejaVu Sans"), QStringLiteral("Liberation Sans"), QStringLiteral("Arial"),
                      QStringLiteral("Helvetica")});
    font.setStyleHint(QFont::SansSerif);
    // No ligatures: text copied out of the report (or read by pdftotext) keeps plain letters.
    font.setStyleStrategy(QFont::PreferNoShaping);
    font.setPointSizeF(points);
    font.setBold(bold);
    return font;
}

QFont fontFor(TextStyle style)
{
    switch (style) {
    case TextStyle::Title: return baseFont(18.0, true);
    case TextStyle::Heading: return baseFont(13.5, true);
    case TextStyle::Subheading: return baseFont(10.5, true);
    case TextStyle::Body: return baseFont(9.5);
    case TextStyle::Note: return baseFont(8.0);
    }
    return baseFont(9.5);
}

const QColor kInk(0x1d, 0x24, 0x2b);
const QColor kGrey(0x5a, 0x63, 0x6c);
const QColor kRule(0xb8, 0xbf, 0xc6);
const QColor kBand(0xef, 0xf2, 0xf4);

// One placed piece of a block on a page: all of it, or rows [rowBegin, rowEnd) of a table.
struct Piece {
    std::size_t block = 0;
    double y = 0.0;      // top, device units
    double height = 0.0; // including the space after it
    int rowBegin = 0;
    int rowEnd = 0;
    bool continued = false; // a table's later part: its header is repeated, marked "continued"
};

class Layout {
public:
    Layout(const Document &document, QPaintDevice &device) : m_doc(document), m_device(device)
    {
        const double mm = kDpi / 25.4;
        m_page = QRectF(0, 0, device.width(), device.height());
        m_body = m_page.adjusted(kMarginSideMm * mm, kMarginTopMm * mm, -kMarginSideMm * mm, -kMarginBottomMm * mm);
        m_mm = mm;
    }

    void flow();
    void paint(QPainter &painter, QPdfWriter &writer) const;
    int pageCount() const { return static_cast<int>(m_pages.size()); }

private:
    double pt(double points) const { return points * kDpi / 72.0; }
    // Word wrap; a word wider than the line (a long asset code in a narrow column) is broken
    // anywhere rather than running into the next column.
    int wrapFlags(const QFont &font, const QString &text, double width) const
    {
        const QFontMetricsF metrics(font, &m_device);
        for (const QString &word : text.split(QLatin1Char(' '), Qt::SkipEmptyParts))
            if (metrics.horizontalAdvance(word) > width)
                return Qt::TextWrapAnywhere;
        return Qt::TextWordWrap;
    }
    double textHeight(const QFont &font, const QString &text, double width) const
    {
        const QFontMetricsF metrics(font, &m_device);
        return metrics.boundingRect(QRectF(0, 0, width, 1e7), wrapFlags(font, text, width), text).height();
    }
    double spaceBefore(const Block &block) const;
    double spaceAfter(const Block &block) const;
    double height(const Block &block) const; // whole block, without the spaces around it
    // What must fit below a heading so that it is not left alone: the start of the next block.
    double leadHeight(std::size_t index) const;

    // A paragraph right before a table or a subheading introduces it: what of that must come
    // with the paragraph.
    double introducedLead(std::size_t paragraph) const
    {
        const std::size_t next = paragraph + 1;
        if (next >= m_doc.blocks.size())
            return 0.0;
        const Block &block = m_doc.blocks[next];
        const auto *text = std::get_if<Text>(&block);
        return std::holds_alternative<Table>(block) || (text && text->style == TextStyle::Subheading) ? leadHeight(next)
                                                                                                     : 0.0;
    }

    // Tables
    std::vector<double> columnWidths(const Table &table) const;
    double rowHeight(const Table &table, const QStringList &row, bool bold) const;
    double headerHeight(const Table &table) const;
    double cellPad() const { return pt(2.6); }

    double tableHeight(const Table &table) const
    {
        double h = headerHeight(table);
        for (const QStringList &row : table.rows)
            h += rowHeight(table, row, false);
        return h;
    }
    // A short table (up to a third of a page) is kept whole: split, it would be hard to read.
    bool keepWhole(const Table &table) const { return tableHeight(table) <= m_body.height() / 3.0; }

    void newPage()
    {
        m_pages.emplace_back();
        m_y = m_body.top();
    }
    double room() const { return m_body.bottom() - m_y; }
    bool atTop() const { return m_y <= m_body.top() + 0.5; }

    void paintHeaderFooter(QPainter &painter, int pageIndex) const;
    void paintPiece(QPainter &painter, const Piece &piece) const;
    void paintTable(QPainter &painter, const Table &table, const Piece &piece) const;
    void paintKeyFigures(QPainter &painter, const KeyFigures &figures, double y) const;

    const Document &m_doc;
    QPaintDevice &m_device;
    QRectF m_page;
    QRectF m_body;
    double m_mm = 1.0;
    double m_y = 0.0;
    std::vector<std::vector<Piece>> m_pages;
};

double Layout::spaceBefore(const Block &block) const
{
    if (const auto *t = std::get_if<Text>(&block)) {
        switch (t->style) {
        case TextStyle::Heading: return pt(14);
        case TextStyle::Subheading: return pt(8);
        default: return 0.0;
        }
    }
    return 0.0;
}

double Layout::spaceAfter(const Block &block) const
{
    if (const auto *t = std::get_if<Text>(&block)) {
        switch (t->style) {
        case TextStyle::Title: return pt(4);
        case TextStyle::Heading: return pt(5);
        case TextStyle::Subheading: return pt(3);
        case TextStyle::Body: return pt(5);
        case TextStyle::Note: return pt(4);
        }
    }
    if (std::holds_alternative<Figure>(block))
        return pt(4);
    return pt(8);
}

std::vector<double> Layout::columnWidths(const Table &table) const
{
    double total = 0.0;
    for (const Column &c : table.columns)
        total += c.weight;
    std::vector<double> widths;
    for (const Column &c : table.columns)
        widths.push_back(m_body.width() * c.weight / (total > 0 ? total : 1.0));
    return widths;
}

double Layout::rowHeight(const Table &table, const QStringList &row, bool bold) const
{
    const QFont font = baseFont(8.5, bold);
    const auto widths = columnWidths(table);
    double tallest = QFontMetricsF(font, &m_device).height();
    for (int i = 0; i < row.size() && i < static_cast<int>(widths.size()); ++i)
        tallest = std::max(tallest, textHeight(font, row[i], widths[static_cast<std::size_t>(i)] - 2 * cellPad()));
    return tallest + 2 * cellPad();
}

double Layout::headerHeight(const Table &table) const
{
    if (!table.header)
        return 0.0;
    QStringList titles;
    for (const Column &c : table.columns)
        titles << c.title;
    return rowHeight(table, titles, true);
}

double Layout::height(const Block &block) const
{
    return std::visit(Overloaded{
                          [&](const Text &t) { return textHeight(fontFor(t.style), t.text, m_body.width()); },
                          [&](const KeyFigures &) {
                              // label, value, and a detail of two lines
                              return QFontMetricsF(baseFont(8.5), &m_device).height() * 3.5
                                     + QFontMetricsF(baseFont(17, true), &m_device).height() + pt(10);
                          },
                          [&](const Table &t) {
                              double h = headerHeight(t);
                              for (int i = 0; i < static_cast<int>(t.rows.size()); ++i)
                                  h += rowHeight(t, t.rows[static_cast<std::size_t>(i)], false);
                              return h;
                          },
                          [&](const Figure &f) { return std::min(m_body.width() * f.aspect, m_body.height() * 0.9); },
                          [](const PageBreak &) { return 0.0; },
                      },
                      block);
}

double Layout::leadHeight(std::size_t index) const
{
    if (index >= m_doc.blocks.size())
        return 0.0;
    const Block &next = m_doc.blocks[index];
    if (const auto *t = std::get_if<Table>(&next)) {
        if (keepWhole(*t))
            return spaceBefore(next) + tableHeight(*t);
        double h = headerHeight(*t);
        for (int i = 0; i < std::min<int>(kRowsWithHeader, static_cast<int>(t->rows.size())); ++i)
            h += rowHeight(*t, t->rows[static_cast<std::size_t>(i)], false);
        return spaceBefore(next) + h;
    }
    if (const auto *t = std::get_if<Text>(&next)) {
        // A heading followed by a subheading keeps both with the start of what comes after.
        if (t->style == TextStyle::Heading || t->style == TextStyle::Subheading)
            return spaceBefore(next) + height(next) + spaceAfter(next) + leadHeight(index + 1);
        // Paragraphs are kept whole, so the heading goes with all of it — and with the start of
        // a table the paragraph introduces.
        return spaceBefore(next) + height(next) + spaceAfter(next) + introducedLead(index);
    }
    return spaceBefore(next) + height(next);
}

void Layout::flow()
{
    m_pages.clear();
    newPage();
    for (std::size_t i = 0; i < m_doc.blocks.size(); ++i) {
        const Block &block = m_doc.blocks[i];
        if (std::holds_alternative<PageBreak>(block)) {
            if (!atTop())
                newPage();
            continue;
        }
        if (const auto *table = std::get_if<Table>(&block)) {
            // Rows go on while they fit; the header goes with at least kRowsWithHeader rows.
            const int n = static_cast<int>(table->rows.size());
            int row = 0;
            bool continued = false;
            if (keepWhole(*table) && tableHeight(*table) > room() && !atTop())
                newPage();
            while (row < n || (n == 0 && row == 0)) {
                double h = headerHeight(*table);
                int end = row;
                double lead = h;
                for (int k = row; k < std::min(n, row + kRowsWithHeader); ++k)
                    lead += rowHeight(*table, table->rows[static_cast<std::size_t>(k)], false);
                if (lead > room() && !atTop())
                    newPage();
                while (end < n) {
                    const double r = rowHeight(*table, table->rows[static_cast<std::size_t>(end)], false);
                    if (h + r > room() && end > row)
                        break;
                    h += r;
                    ++end;
                }
                m_pages.back().push_back({i, m_y, h + spaceAfter(block), row, end, continued});
                m_y += h + spaceAfter(block);
                if (n == 0)
                    break;
                row = end;
                continued = true;
                if (row < n)
                    newPage();
            }
            continue;
        }
        const double before = atTop() ? 0.0 : spaceBefore(block);
        if (std::holds_alternative<Figure>(block)) {
            // A figure a little taller than what is left is drawn a little smaller rather than
            // leaving the rest of the page empty.
            const double full = height(block);
            double h = full;
            if (full > room() && room() >= kFigureShrinkTo * full)
                h = room();
            else if (full > room())
                newPage();
            m_pages.back().push_back({i, m_y, h, 0, 0, false});
            m_y += h + spaceAfter(block);
            continue;
        }
        double needed = before + height(block);
        if (const auto *t = std::get_if<Text>(&block);
            t && (t->style == TextStyle::Heading || t->style == TextStyle::Subheading))
            needed += spaceAfter(block) + leadHeight(i + 1);
        else if (t)
            needed += spaceAfter(block) + introducedLead(i);
        // What is kept together never asks for more than most of a page: beyond that, the block
        // goes alone (a heading still takes the start of what follows).
        needed = std::min(needed, std::max(before + height(block), m_body.height() * 0.6));
        if (needed > room() && !atTop())
            newPage();
        m_y += atTop() ? 0.0 : spaceBefore(block);
        const double h = height(block);
        m_pages.back().push_back({i, m_y, h, 0, 0, false});
        m_y += h + spaceAfter(block);
    }
    if (m_pages.size() > 1 && m_pages.back().empty())
        m_pages.pop_back();
}

void Layout::paintHeaderFooter(QPainter &painter, int pageIndex) const
{
    const QFont font = baseFont(7.5);
    painter.setFont(font);
    painter.setPen(kGrey);
    const double headerBase = m_body.top() - 8 * m_mm;
    const QRectF header(m_body.left(), headerBase - pt(12), m_body.width(), pt(12));
    painter.drawText(header, Qt::AlignLeft | Qt::AlignBottom,
                     QFontMetricsF(font, &m_device).elidedText(m_doc.workbookName, Qt::ElideMiddle, m_body.width() * 0.7));
    painter.drawText(header, Qt::AlignRight | Qt::AlignBottom, m_doc.dateText);
    painter.setPen(QPen(kRule, pt(0.5)));
    painter.drawLine(QPointF(m_body.left(), headerBase + pt(2)), QPointF(m_body.right(), headerBase + pt(2)));

    const double footerTop = m_body.bottom() + 8 * m_mm;
    painter.drawLine(QPointF(m_body.left(), footerTop - pt(2)), QPointF(m_body.right(), footerTop - pt(2)));
    painter.setPen(kGrey);
    const QString pageText = QCoreApplication::translate("ReportPdf", "Page %1 of %2").arg(pageIndex + 1).arg(pageCount());
    const QFontMetricsF metrics(font, &m_device);
    const double pageWidth = metrics.horizontalAdvance(pageText) + pt(12);
    painter.drawText(QRectF(m_body.left(), footerTop, m_body.width() - pageWidth, pt(24)),
                     Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, m_doc.footerNote);
    painter.drawText(QRectF(m_body.left(), footerTop, m_body.width(), pt(12)), Qt::AlignRight | Qt::AlignTop, pageText);
}

void Layout::paintKeyFigures(QPainter &painter, const KeyFigures &figures, double y) const
{
    const int n = std::max<int>(1, static_cast<int>(figures.items.size()));
    const double gap = pt(8);
    const double width = (m_body.width() - gap * (n - 1)) / n;
    const double h = height(Block{figures});
    const QFont small = baseFont(8.5);
    const QFont big = baseFont(17, true);
    const QFontMetricsF smallMetrics(small, &m_device);
    const QFontMetricsF bigMetrics(big, &m_device);
    for (int i = 0; i < static_cast<int>(figures.items.size()); ++i) {
        const auto &item = figures.items[static_cast<std::size_t>(i)];
        const QRectF box(m_body.left() + i * (width + gap), y, width, h);
        painter.setPen(Qt::NoPen);
        painter.setBrush(kBand);
        painter.drawRect(box);
        painter.setBrush(Qt::NoBrush);
        const QRectF inner = box.adjusted(pt(6), pt(5), -pt(6), -pt(5));
        painter.setPen(kGrey);
        painter.setFont(small);
        painter.drawText(QRectF(inner.left(), inner.top(), inner.width(), smallMetrics.height()), Qt::AlignLeft,
                         item.label);
        painter.setPen(kInk);
        painter.setFont(big);
        const double valueTop = inner.top() + smallMetrics.height() * 1.1;
        painter.drawText(QRectF(inner.left(), valueTop, inner.width(), bigMetrics.height()), Qt::AlignLeft,
                         bigMetrics.elidedText(item.value, Qt::ElideRight, inner.width()));
        painter.setPen(kGrey);
        painter.setFont(small);
        const QStringList details = item.detail.split(QLatin1Char('\n'));
        for (int line = 0; line < std::min<int>(2, static_cast<int>(details.size())); ++line)
            painter.drawText(QRectF(inner.left(), valueTop + bigMetrics.height() * 1.05 + line * smallMetrics.height(),
                                    inner.width(), smallMetrics.height()),
                             Qt::AlignLeft, smallMetrics.elidedText(details[line], Qt::ElideRight, inner.width()));
    }
}

void Layout::paintTable(QPainter &painter, const Table &table, const Piece &piece) const
{
    const auto widths = columnWidths(table);
    double y = piece.y;
    auto drawRow = [&](const QStringList &row, bool bold, bool band, bool headerRow) {
        const double h = rowHeight(table, row, bold);
        if (band) {
            painter.setPen(Qt::NoPen);
            painter.setBrush(kBand);
            painter.drawRect(QRectF(m_body.left(), y, m_body.width(), h));
            painter.setBrush(Qt::NoBrush);
        }
        painter.setFont(baseFont(8.5, bold));
        painter.setPen(headerRow ? kGrey : kInk);
        double x = m_body.left();
        for (std::size_t c = 0; c < widths.size(); ++c) {
            const QRectF cell(x + cellPad(), y + cellPad(), widths[c] - 2 * cellPad(), h - 2 * cellPad());
            const Qt::Alignment align = (table.columns[c].numeric ? Qt::AlignRight : Qt::AlignLeft) | Qt::AlignTop;
            if (static_cast<int>(c) < row.size())
                painter.drawText(cell, int(align) | wrapFlags(painter.font(), row[static_cast<int>(c)], cell.width()),
                                 row[static_cast<int>(c)]);
            x += widths[c];
        }
        y += h;
        if (headerRow) {
            painter.setPen(QPen(kInk, pt(0.6)));
            painter.drawLine(QPointF(m_body.left(), y), QPointF(m_body.right(), y));
        }
    };
    if (table.header) {
        QStringList titles;
        for (std::size_t c = 0; c < table.columns.size(); ++c) {
            QString title = table.columns[c].title;
            if (c == 0 && piece.continued)
                title = QCoreApplication::translate("ReportPdf", "%1 (continued)").arg(title);
            titles << title;
        }
        drawRow(titles, true, false, true);
    }
    const int n = static_cast<int>(table.rows.size());
    for (int r = piece.rowBegin; r < piece.rowEnd; ++r) {
        const bool bold = r >= n - table.boldLastRows
                          || std::find(table.boldRows.begin(), table.boldRows.end(), r) != table.boldRows.end();
        if (r == n - table.boldLastRows && table.boldLastRows > 0) {
            painter.setPen(QPen(kInk, pt(0.5)));
            painter.drawLine(QPointF(m_body.left(), y), QPointF(m_body.right(), y));
        }
        drawRow(table.rows[static_cast<std::size_t>(r)], bold, r % 2 == 1, false);
    }
    if (table.header || piece.rowEnd == n) {
        painter.setPen(QPen(kRule, pt(0.5)));
        painter.drawLine(QPointF(m_body.left(), y), QPointF(m_body.right(), y));
    }
}

void Layout::paintPiece(QPainter &painter, const Piece &piece) const
{
    const Block &block = m_doc.blocks[piece.block];
    std::visit(Overloaded{
                   [&](const Text &t) {
                       painter.setFont(fontFor(t.style));
                       painter.setPen(t.style == TextStyle::Note ? kGrey : kInk);
                       painter.drawText(QRectF(m_body.left(), piece.y, m_body.width(), piece.height + pt(2)),
                                        Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, t.text);
                       if (t.style == TextStyle::Heading) {
                           painter.setPen(QPen(kRule, pt(0.5)));
                           const double under = piece.y + piece.height + pt(1.5);
                           painter.drawLine(QPointF(m_body.left(), under), QPointF(m_body.right(), under));
                       }
                   },
                   [&](const KeyFigures &k) { paintKeyFigures(painter, k, piece.y); },
                   [&](const Table &t) { paintTable(painter, t, piece); },
                   [&](const Figure &f) {
                       if (!f.paint)
                           return;
                       painter.save();
                       // Drawn smaller to fit (flow()), a figure keeps its shape and is centred.
                       const double full = height(block);
                       const double width = m_body.width() * std::min(1.0, piece.height / full);
                       const QRectF area(m_body.left() + (m_body.width() - width) / 2, piece.y, width, piece.height);
                       painter.setClipRect(area);
                       f.paint(painter, area);
                       painter.restore();
                   },
                   [](const PageBreak &) {},
               },
               block);
}

void Layout::paint(QPainter &painter, QPdfWriter &writer) const
{
    for (int p = 0; p < pageCount(); ++p) {
        if (p > 0)
            writer.newPage();
        painter.setRenderHint(QPainter::Antialiasing);
        paintHeaderFooter(painter, p);
        for (const Piece &piece : m_pages[static_cast<std::size_t>(p)])
            paintPiece(painter, piece);
    }
}

// The document's XMP packet (ISO 16684-1; Dublin Core title and description, the PDF schema's
// Keywords and Producer, the XMP basic CreatorTool): Qt writes it as the catalogue's /Metadata
// stream in place of its own, so it carries the title and creator too.
QByteArray xmpPacket(const Document &document)
{
    const auto esc = [](const QString &t) { return t.toHtmlEscaped().toUtf8(); };
    QByteArray x;
    x += "<?xpacket begin=\"\xEF\xBB\xBF\" id=\"W5M0MpCehiHzreSzNTczkc9d\"?>\n";
    x += "<x:xmpmeta xmlns:x=\"adobe:ns:meta/\">\n";
    x += " <rdf:RDF xmlns:rdf=\"http://www.w3.org/1999/02/22-rdf-syntax-ns#\">\n";
    x += "  <rdf:Description rdf:about=\"\" xmlns:dc=\"http://purl.org/dc/elements/1.1/\" "
         "xmlns:pdf=\"http://ns.adobe.com/pdf/1.3/\" xmlns:xmp=\"http://ns.adobe.com/xap/1.0/\">\n";
    x += "   <dc:format>application/pdf</dc:format>\n";
    x += "   <dc:title><rdf:Alt><rdf:li xml:lang=\"x-default\">" + esc(document.workbookName)
         + "</rdf:li></rdf:Alt></dc:title>\n";
    if (!document.subject.isEmpty())
        x += "   <dc:description><rdf:Alt><rdf:li xml:lang=\"x-default\">" + esc(document.subject)
             + "</rdf:li></rdf:Alt></dc:description>\n";
    if (!document.keywords.isEmpty())
        x += "   <pdf:Keywords>" + esc(document.keywords.join(QStringLiteral("; "))) + "</pdf:Keywords>\n";
    x += "   <pdf:Producer>Tailwise</pdf:Producer>\n";
    x += "   <xmp:CreatorTool>Tailwise</xmp:CreatorTool>\n";
    x += "  </rdf:Description>\n </rdf:RDF>\n</x:xmpmeta>\n<?xpacket end=\"w\"?>";
    return x;
}

void setUp(QPdfWriter &writer, const Document &document)
{
    writer.setPageSize(QPageSize(QPageSize::A4));
    writer.setPageOrientation(QPageLayout::Portrait);
    writer.setPageMargins(QMarginsF(0, 0, 0, 0));
    writer.setResolution(kDpi);
    writer.setTitle(document.workbookName);
    writer.setCreator(QStringLiteral("Tailwise"));
    writer.setDocumentXmpMetadata(xmpPacket(document));
}

} // namespace

int writePdf(const Document &document, QIODevice &device)
{
    QPdfWriter writer(&device);
    setUp(writer, document);
    Layout layout(document, writer);
    layout.flow();
    QPainter painter(&writer);
    layout.paint(painter, writer);
    painter.end();
    return layout.pageCount();
}

Result<int> writePdf(const Document &document, const QString &path)
{
    // Made in memory, then written the one checked way (document/savefile.h).
    QBuffer buffer;
    buffer.open(QIODevice::WriteOnly);
    const int pages = writePdf(document, buffer);
    buffer.close();
    if (auto saved = saveFile(path, buffer.data()); !saved)
        return saved.error();
    return pages;
}

} // namespace tailwise::ui::report

#include "reportdocument.h"

namespace tailwise::ui::report {

namespace {

template <class... Ts>
struct Overloaded : Ts... {
    using Ts::operator()...;
};
template <class... Ts>
Overloaded(Ts...) -> Overloaded<Ts...>;

} // namespace

QString Document::plainText() const
{
    QStringList lines;
    for (const Block &block : blocks) {
        std::visit(Overloaded{
                       [&](const Text &t) { lines << t.text; },
                       [&](const KeyFigures &k) {
                           for (const auto &item : k.items)
                               lines << item.label + QLatin1Char(' ') + item.value + QLatin1Char(' ') + item.detail;
                       },
                       [&](const Table &t) {
                           if (t.header) {
                               QStringList titles;
                               for (const Column &c : t.columns)
                                   titles << c.title;
                               lines << titles.join(QLatin1Char('\t'));
                           }
                           for (const QStringList &row : t.rows)
                               lines << row.join(QLatin1Char('\t'));
                       },
                       [](const Figure &) {},
                       [](const PageBreak &) {},
                   },
                   block);
    }
    return lines.join(QLatin1Char('\n'));
}

} // namespace tailwise::ui::report

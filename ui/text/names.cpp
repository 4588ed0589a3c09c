#include "names.h"

#include <QList>

#include <algorithm>

namespace tailwise::ui {

namespace {

// Counts code points (a surrogate pair is one character).
int characters(const QString &text) { return static_cast<int>(text.toUcs4().size()); }

} // namespace

QString shortText(const QString &text, int maxChars)
{
    maxChars = std::max(maxChars, 3);
    if (characters(text) <= maxChars)
        return text;
    const QList<uint> points = text.toUcs4();
    const int keep = maxChars - 1;    // one place for the ellipsis
    const int head = (keep * 2 + 2) / 3; // two thirds at the start
    const int tail = keep - head;
    QList<uint> shortened(points.begin(), points.begin() + head);
    // Spaces next to the ellipsis carry nothing.
    while (!shortened.isEmpty() && shortened.back() == ' ')
        shortened.removeLast();
    shortened.append(0x2026);
    auto end = points.end() - tail;
    while (end != points.end() && *end == ' ')
        ++end;
    shortened.append(QList<uint>(end, points.end()));
    return QString::fromUcs4(reinterpret_cast<const char32_t *>(shortened.constData()), shortened.size());
}

} // namespace tailwise::ui

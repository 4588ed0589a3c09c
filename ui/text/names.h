// Free text from files (asset and holding names, workbook titles) as it is shown where space is
// short: on a chart's axis, in a table on paper, in the window's title bar. The files' limits
// (tailwise/textlimits.h: 100 characters a name, 200 a title) keep text bounded; these keep it
// from pushing a column, an axis or a page apart. The full text stays in the workbook, the JSON
// and the window's tooltips.
#pragma once

#include <QString>

namespace tailwise::ui {

// Characters a name keeps on a chart axis or in a report table; a title in a title bar.
inline constexpr int shortNameChars = 32;
inline constexpr int shortTitleChars = 60;

// `text` when it has at most `maxChars` characters; otherwise its start and end joined by "…"
// (the end is kept because names that share a start — "Harbour Bond Fund A" and "… B" — differ
// there), `maxChars` characters in all. Never splits a surrogate pair.
QString shortText(const QString &text, int maxChars);
inline QString shortName(const QString &name) { return shortText(name, shortNameChars); }

} // namespace tailwise::ui

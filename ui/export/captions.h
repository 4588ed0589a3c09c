// Captions in plain words for every chart, built from the same results and with the same number
// text as the chart (chartstyle.h: money without decimals, percent, confidence), so the figures in
// a caption are the figures on the picture. Each says what the chart shows, the figure that
// matters with its horizon and confidence, the model and the data behind it, and one caution.
// The user edits the caption before export; this is only its first draft.
#pragma once

#include "charts/chartkind.h"
#include "export/workbookresults.h"

#include <QString>

namespace tailwise::ui {

QString captionFor(ChartKind kind, const WorkbookResults &results);

// The parts shared by the captions and the report: "the normal model fitted to the 500 daily
// returns from 4 Jan 2022 to 29 Dec 2023", and the short caution.
QString dataBehindText(const tailwise::RiskReport &report);
QString cautionText();

} // namespace tailwise::ui

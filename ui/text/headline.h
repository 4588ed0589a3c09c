// The headline in words: the sentence under the figures ("Over 10 trading days, with 99%
// confidence, the loss should not exceed …") and the model's name as that sentence gives it. The
// window's headline, the chart captions and the PDF report say it from these functions.
#pragma once

#include "tailwise/risk.h"

#include <QString>

namespace tailwise::ui {

QString headlineSentence(const tailwise::RiskReport &report);
// The model in running text: "normal", "Student-t", "historical-simulation", …
QString headlineModelName(const tailwise::RiskReport &report);

} // namespace tailwise::ui

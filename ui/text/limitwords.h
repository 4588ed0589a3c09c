// Limits (tailwise/limits.h) in words, the same in the window's headline and the report: the
// measure's name, and each state as a word, so that a breach is never shown by colour alone.
#pragma once

#include "tailwise/limits.h"

#include <QString>

namespace tailwise::ui {

QString limitMeasureName(tailwise::LimitMeasure measure); // "VaR", "ES"
QString limitStateWord(tailwise::LimitState state);       // "ok", "warning", "BREACHED"
// "2.5% of value" or "250,000": the limit as it was set.
QString limitSetText(const tailwise::Limit &limit);

} // namespace tailwise::ui

// The names the window gives each choice of an assumption ("Equal weights", "Recent days weigh
// more (EWMA)", …), in one place so that the assumptions pane and the report say the same.
#pragma once

#include "tailwise/assumptions.h"
#include "tailwise/risk.h"

#include <QString>

namespace tailwise::ui {

QString returnTypeLabel(tailwise::ReturnType returns);
QString estimatorLabel(tailwise::CovarianceEstimator estimator);
QString meanLabel(tailwise::MeanModel mean);
QString modelLabel(tailwise::RiskModel model);
// One sentence on what the model assumes ("Replays the window's actual daily moves …").
QString modelDescription(tailwise::RiskModel model);
QString historicalHorizonLabel(tailwise::HistoricalHorizon horizon);

// How the Student-t and Cornish–Fisher models reach a horizon longer than a day
// (multidayscaling.h): "Scale one day by √H" or "Apply the model to the H-day sum".
QString scalingLabel(tailwise::MultiDayScaling scaling);
// The same as a clause for a note under a chart: "Longer horizons scale one day by √H." …
QString scalingNote(tailwise::MultiDayScaling scaling);
// The models the choice applies to (Student-t, Cornish–Fisher).
bool modelHasScaling(tailwise::RiskModel model);
// The convention in words with what it used at the report's horizon, e.g. "One-day figure × √10,
// with one day's tails." or "Model applied to the 10-day sum: ν = 16.57 there (5.26 for one day)."
// Empty when the model that gave the figures has no such choice.
QString scalingSentence(const tailwise::RiskReport &report);

} // namespace tailwise::ui

// The names the window gives each choice of an assumption ("Equal weights", "Recent days weigh
// more (EWMA)", …), in one place so that the assumptions pane and the report say the same.
#pragma once

#include "tailwise/assumptions.h"

#include <QString>

namespace tailwise::ui {

QString returnTypeLabel(tailwise::ReturnType returns);
QString estimatorLabel(tailwise::CovarianceEstimator estimator);
QString meanLabel(tailwise::MeanModel mean);
QString modelLabel(tailwise::RiskModel model);
// One sentence on what the model assumes ("Replays the window's actual daily moves …").
QString modelDescription(tailwise::RiskModel model);
QString historicalHorizonLabel(tailwise::HistoricalHorizon horizon);

} // namespace tailwise::ui

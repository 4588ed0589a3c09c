#include "text/assumptionlabels.h"

#include <QCoreApplication>

namespace tailwise::ui {

namespace {
QString tr(const char *text) { return QCoreApplication::translate("AssumptionsPane", text); }
} // namespace

QString returnTypeLabel(ReturnType returns)
{
    return returns == ReturnType::Log ? tr("Log (continuously compounded)") : tr("Simple (percentage change)");
}

QString estimatorLabel(CovarianceEstimator estimator)
{
    return estimator == CovarianceEstimator::Ewma ? tr("Recent days weigh more (EWMA)") : tr("Equal weights");
}

QString meanLabel(MeanModel mean)
{
    return mean == MeanModel::Sample ? tr("Estimated from the window") : tr("Zero");
}

QString modelLabel(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal: return tr("Normal");
    case RiskModel::StudentT: return tr("Student-t");
    case RiskModel::CornishFisher: return tr("Cornish–Fisher");
    case RiskModel::Historical: return tr("Historical");
    case RiskModel::MonteCarlo: return tr("Monte Carlo");
    }
    return {};
}

QString modelDescription(RiskModel model)
{
    switch (model) {
    case RiskModel::Normal: return tr("P&L taken as normally distributed with the estimated mean and covariance.");
    case RiskModel::StudentT:
        return tr("Like normal, but with fatter tails fitted to the data: large losses are more likely.");
    case RiskModel::CornishFisher: return tr("Normal corrected for the skew and fat tails seen in the window.");
    case RiskModel::Historical:
        return tr("Replays the window's actual daily moves on today's holdings; no distribution assumed.");
    case RiskModel::MonteCarlo:
        return tr("Draws many random scenarios from the estimated model.");
    }
    return {};
}

QString historicalHorizonLabel(HistoricalHorizon horizon)
{
    return horizon == HistoricalHorizon::Overlapping
               ? QCoreApplication::translate("ModelSettings", "Sums of consecutive days (overlapping)")
               : QCoreApplication::translate("ModelSettings", "One-day figures × √horizon");
}

} // namespace tailwise::ui

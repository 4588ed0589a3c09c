#include "text/assumptionlabels.h"

#include <QCoreApplication>
#include <QLocale>

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

QString scalingLabel(MultiDayScaling scaling)
{
    return scaling == MultiDayScaling::Aggregate ? tr("Apply the model to the H-day sum") : tr("Scale one day by √H");
}

QString scalingNote(MultiDayScaling scaling)
{
    return scaling == MultiDayScaling::Aggregate
               ? tr("Longer horizons apply the model to the sum of H days rather than scaling one day by √H.")
               : tr("Longer horizons scale one day by √H, keeping one day's tails.");
}

bool modelHasScaling(RiskModel model) { return model == RiskModel::StudentT || model == RiskModel::CornishFisher; }

QString scalingSentence(const RiskReport &r)
{
    const ModelDetails &m = r.model;
    const Assumptions &a = r.assumptions;
    if (!modelHasScaling(m.used))
        return {};
    const QLocale locale;
    const int h = a.horizonDays;
    auto two = [&](double v) { return locale.toString(v, 'f', 2); };
    QString s;
    if (a.scaling == MultiDayScaling::SquareRoot) {
        s = h > 1 ? tr("One-day figure × √%1, with one day's tails.").arg(h)
                  : tr("One-day figure × √H, with one day's tails, at longer horizons.");
    } else if (h == 1) {
        s = tr("Model applied to the H-day sum at longer horizons.");
    } else if (m.used == RiskModel::StudentT && m.dof && m.horizonDof) {
        s = *m.dof > 4.0 ? tr("Model applied to the %1-day sum: ν = %2 there (%3 for one day).")
                               .arg(QString::number(h), two(*m.horizonDof), two(*m.dof))
                         : tr("Model applied to the %1-day sum, but ν = %2 (4 or less) has no finite kurtosis to "
                              "spread over the days, so ν is kept.")
                               .arg(QString::number(h), two(*m.dof));
    } else if (m.horizonShape) {
        s = tr("Model applied to the %1-day sum: skewness %2 and excess kurtosis %3 there.")
                .arg(QString::number(h), two(m.horizonShape->skewness), two(m.horizonShape->excessKurtosis));
    } else {
        s = tr("Model applied to the %1-day sum.").arg(h);
    }
    if (h == 1)
        s += QLatin1Char(' ') + tr("At one day both ways give the same figure.");
    return s;
}

} // namespace tailwise::ui

#include "text/headline.h"

#include "text/numbers.h"

#include <QCoreApplication>
#include <QLocale>

namespace tailwise::ui {

namespace {
QString tr(const char *text) { return QCoreApplication::translate("HeadlinePanel", text); }
} // namespace

QString headlineModelName(const RiskReport &report)
{
    // By the model's file name, so the text follows the core as models are added.
    const std::string_view name = toName(report.assumptions.model);
    if (name == "normal") return tr("normal");
    if (name == "student-t") return tr("Student-t");
    if (name == "cornish-fisher") return tr("Cornish–Fisher");
    if (name == "historical") return tr("historical-simulation");
    if (name == "monte-carlo") return tr("Monte Carlo");
    return QString::fromUtf8(name.data(), static_cast<qsizetype>(name.size()));
}

QString headlineSentence(const RiskReport &r)
{
    const QLocale locale;
    const QString confidence = confidenceText(r.assumptions.confidence);
    const QString tail = confidenceText(1.0 - r.assumptions.confidence);
    // The weighting shapes the covariance, which the historical figure does not use.
    const QString weighting = r.assumptions.estimator == CovarianceEstimator::Ewma && r.model.used != RiskModel::Historical
                                  ? tr(", recent days weighted more (λ %1)").arg(locale.toString(r.assumptions.lambda, 'f', 3))
                                  : QString();
    QString share = r.varFraction ? tr(" (%1 of the portfolio's value)").arg(percentText(r.varFraction)) : QString();
    return tr("Over %1, with %2 confidence, the loss should not exceed %3%4 — "
              "by the %5 model estimated from the %6 daily returns from %7 to %8%9. "
              "In the worst %10 of cases the loss averages %11 (Expected Shortfall).")
        .arg(tradingDaysText(r.assumptions.horizonDays), confidence, moneyText(r.figures.var), share, headlineModelName(r),
             locale.toString(r.windowReturns), dateText(r.windowFirst), dateText(r.windowLast), weighting)
        .arg(tail)
        .arg(moneyText(r.figures.es));
}

} // namespace tailwise::ui

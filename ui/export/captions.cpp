#include "export/captions.h"

#include "charts/chartstyle.h"
#include "text/headline.h"
#include "text/numbers.h"

#include <QCoreApplication>
#include <QLocale>

#include <algorithm>

namespace tailwise::ui {

namespace {

QString tr(const char *text) { return QCoreApplication::translate("Captions", text); }

using chartstyle::confidenceText;
using chartstyle::money;
using chartstyle::percent;

QString daysText(int days) { return tradingDaysText(days); }

// " (2.3% of the portfolio's value)" or nothing when the value is zero.
QString shareText(const std::optional<double> &fraction)
{
    return fraction ? tr(" (%1 of the portfolio's value)").arg(percent(*fraction, 1)) : QString();
}

QString lossTailCaption(const WorkbookResults &w)
{
    const RiskReport &r = w.report;
    const QString over = tr("Over %1, at %2 confidence, the loss that is not expected to be exceeded (Value-at-Risk) is "
                            "%3%4; the average loss beyond it (Expected Shortfall) is %5%6.")
                             .arg(daysText(r.assumptions.horizonDays), confidenceText(r.assumptions.confidence),
                                  money(r.figures.var), shareText(r.varFraction), money(r.figures.es),
                                  shareText(r.esFraction));
    QString curve = tr("The curve is how likely each profit or loss is under the model; the shaded tail lies beyond VaR.");
    if (w.lossTail.hasHistogram)
        curve += tr(" The bars are the window's daily P&L on today's holdings, scaled to the horizon.");
    return over + QLatin1Char(' ') + curve + QLatin1Char(' ') + tr("From %1.").arg(dataBehindText(r)) + QLatin1Char(' ')
         + cautionText();
}

QString tradeoffCaption(const WorkbookResults &w)
{
    const RiskReport &r = w.report;
    const TradeoffChartData &d = w.tradeoff;
    QString text = tr("How Value-at-Risk grows with the horizon (1 to %1 trading days) and the confidence (%2 to %3), "
                      "from the one-day spread and mean of the holdings scaled to each horizon. At the current "
                      "setting, %4 at %5, VaR is %6.")
                       .arg(QLocale().toString(d.daysPerYear), confidenceText(0.90), confidenceText(0.999),
                            daysText(d.horizonDays), confidenceText(d.confidence), money(d.currentVar));
    if (!d.lineTurns.empty()) {
        const TurningPoint &t = d.lineTurns.back();
        text += QLatin1Char(' ')
              + tr("With the expected gain, VaR at %1 stops growing after about %2 trading days, at %3.")
                    .arg(confidenceText(t.confidence), QLocale().toString(t.horizonDays, 'f', 0), money(t.var));
    }
    text += QLatin1Char(' ') + tr("Every cell follows the %1 model, as the headline.").arg(headlineModelName(r));
    return text + QLatin1Char(' ') + tr("From %1.").arg(dataBehindText(r)) + QLatin1Char(' ') + cautionText();
}

QString contributionsCaption(const WorkbookResults &w)
{
    const RiskReport &r = w.report;
    const ContributionsChartData &d = w.contributions;
    QString text = tr("Each holding's part of the Value-at-Risk over %1 at %2 confidence, %3; the parts add up to it.")
                       .arg(daysText(r.assumptions.horizonDays), confidenceText(r.assumptions.confidence),
                            money(d.portfolioVar));
    if (!d.bars.empty() && d.bars.front().componentVar > 0.0) {
        const ContributionBar &top = d.bars.front();
        text += QLatin1Char(' ') + tr("The largest is %1 with %2%3.")
                                       .arg(top.asset, money(top.componentVar),
                                            top.share ? tr(" (%1)").arg(percent(*top.share, 0)) : QString());
    }
    const auto hedges = std::count_if(d.bars.begin(), d.bars.end(), [](const ContributionBar &b) { return b.hedge; });
    if (hedges == 1)
        text += QLatin1Char(' ') + tr("One holding is a hedge and lowers VaR.");
    else if (hedges > 1)
        text += QLatin1Char(' ') + tr("Of the holdings, %1 are hedges and lower VaR.").arg(QLocale().toString(static_cast<int>(hedges)));
    if (d.diversificationBenefit >= 0.0)
        text += QLatin1Char(' ')
              + tr("Held on their own the holdings' VaRs would sum to %1; held together they offset each other by %2.")
                    .arg(money(d.undiversifiedVar), money(d.diversificationBenefit));
    else
        text += QLatin1Char(' ')
              + tr("Held on their own the holdings' VaRs would sum to %1, less than together by %2: VaR is not "
                   "subadditive under this model here.")
                    .arg(money(d.undiversifiedVar), money(-d.diversificationBenefit));
    text += QLatin1Char(' ') + tr("Every figure follows the %1 model, as the headline.").arg(headlineModelName(r));
    return text + QLatin1Char(' ') + tr("From %1.").arg(dataBehindText(r)) + QLatin1Char(' ') + cautionText();
}

QString backtestCaption(const WorkbookResults &w)
{
    if (!w.backtest)
        return tr("No backtest: %1").arg(w.backtestProblem);
    const BacktestResult &b = *w.backtest;
    const double size = w.backtestSettings.testSize;
    const BacktestVerdict v = verdictAt(b, size);
    const QLocale locale;
    const QString first = b.days.empty() ? QString() : dateText(b.days.front().date);
    const QString last = b.days.empty() ? QString() : dateText(b.days.back().date);
    QString text = tr("Each day's profit or loss of today's holdings against the one-day Value-at-Risk at %1 confidence "
                      "that the %2 model forecast the day before, from the %3 returns before it; %4 days from %5 to %6.")
                       .arg(confidenceText(b.assumptions.confidence), (b.assumptions.model == RiskModel::Normal ? tr("normal") : riskModelTitle(b.assumptions.model)),
                            locale.toString(b.window), locale.toString(b.observations), first, last);
    text += QLatin1Char(' ')
          + tr("%1 days lost more than VaR (exceptions); %2 were expected.")
                .arg(locale.toString(b.exceptions), locale.toString(b.expectedExceptions, 'f', 1));
    text += QLatin1Char(' ')
          + (v.passed ? tr("At the %1 test size no test rejects the model.").arg(percent(size, 0))
                      : tr("At the %1 test size the tests reject the model.").arg(percent(size, 0)));
    return text + QLatin1Char(' ') + tr("A good past record does not promise the next day.");
}

QString modelsCaption(const WorkbookResults &w)
{
    if (!w.modelsChart)
        return tr("No model comparison: %1").arg(w.modelsProblem);
    const ModelComparisonChartData &d = *w.modelsChart;
    const ModelComparisonGroup *low = nullptr;
    const ModelComparisonGroup *high = nullptr;
    for (const ModelComparisonGroup &g : d.groups) {
        if (!g.hasFigures)
            continue;
        if (!low || g.var < low->var)
            low = &g;
        if (!high || g.var > high->var)
            high = &g;
    }
    QString text = tr("Value-at-Risk and Expected Shortfall over %1 at %2 confidence under each model, for the same "
                      "holdings and data window.")
                       .arg(daysText(d.horizonDays), confidenceText(d.confidence));
    for (const ModelComparisonGroup &g : d.groups)
        if (g.current && g.hasFigures)
            text += QLatin1Char(' ') + tr("Under the headline figures' model (%1), VaR is %2 and ES %3.")
                                           .arg(g.model, money(g.var), money(g.es));
    if (low && high)
        text += QLatin1Char(' ') + tr("VaR ranges from %1 (%2) to %3 (%4).")
                                       .arg(money(low->var), low->model, money(high->var), high->model);
    for (const ModelComparisonGroup &g : d.groups)
        if (!g.hasFigures)
            text += QLatin1Char(' ') + tr("%1 gives no figure: %2.").arg(g.model, g.note);
    text += QLatin1Char(' ') + tr("Models differ most in the far tail, where the data say least.");
    return text + QLatin1Char(' ') + tr("From %1.").arg(dataBehindText(w.report)) + QLatin1Char(' ') + cautionText();
}

} // namespace

QString dataBehindText(const RiskReport &r)
{
    // The weighting shapes the covariance, which the historical figure does not use.
    const QString weighting = r.assumptions.estimator == CovarianceEstimator::Ewma && r.model.used != RiskModel::Historical
                                  ? tr(", recent days weighted more (λ %1)").arg(QLocale().toString(r.assumptions.lambda, 'f', 3))
                                  : QString();
    return tr("the %1 model fitted to the %2 daily returns from %3 to %4%5")
        .arg(headlineModelName(r), QLocale().toString(r.windowReturns), dateText(r.windowFirst),
             dateText(r.windowLast), weighting);
}

QString cautionText()
{
    return tr("An estimate from past prices, not the worst case and not advice.");
}

QString captionFor(ChartKind kind, const WorkbookResults &results)
{
    switch (kind) {
    case ChartKind::LossTail: return lossTailCaption(results);
    case ChartKind::Tradeoff: return tradeoffCaption(results);
    case ChartKind::Contributions: return contributionsCaption(results);
    case ChartKind::Backtest: return backtestCaption(results);
    case ChartKind::Models: return modelsCaption(results);
    }
    return {};
}

} // namespace tailwise::ui

#include "text/cautions.h"

#include "text/numbers.h"

#include <QLocale>

#include <cmath>

#include <QCoreApplication>

namespace tailwise::ui {

namespace {
QString tr(const char *text) { return QCoreApplication::translate("Cautions", text); }
} // namespace

QString onceInText(double confidence)
{
    const double n = std::isfinite(confidence) && confidence < 1.0 ? std::round(1.0 / (1.0 - confidence)) : 100.0;
    return tr("once in %1 horizons at %2").arg(QLocale().toString(n, 'f', 0), confidenceText(confidence));
}

QString cautionsShortText(double confidence)
{
    return tr("Estimates, not advice. VaR is not the worst case: larger losses happen, about %1, and Expected "
              "Shortfall is only their average under the model. The figures rest on the model and on the price "
              "history; a calm window understates risk. More in Help ▸ About.")
        .arg(onceInText(confidence));
}

QList<Caution> cautions(double confidence)
{
    return {
        {tr("What these figures are."),
         tr("Value-at-Risk (VaR) is the loss that, under the chosen model and assumptions, should not be exceeded "
            "over the horizon with the chosen confidence. Expected Shortfall (ES) is the average loss in the cases "
            "beyond VaR.")},
        {tr("What they are not."),
         tr("VaR is not the worst case: a larger loss is expected about %1, and it can be much larger. Neither "
            "figure is a forecast, a guarantee or advice to buy, sell or hedge.")
             .arg(onceInText(confidence))},
        {tr("Model and data limits."),
         tr("The figures assume the holdings stay unchanged over the horizon and that the past window describes "
            "the future. A calm window understates risk; prices carried forward over gaps, few returns, or more "
            "assets than returns make estimates unreliable. Scaling to long horizons by the square root of time "
            "assumes independent days. Different models give different figures; compare them before relying on "
            "one.")},
        {tr("Regulatory use."),
         tr("Capital, limit or disclosure figures follow the rules of your jurisdiction and the models your "
            "supervisor has approved; this program is not such a model.")},
    };
}

QString cautionsFullText(double confidence)
{
    QString html;
    for (const Caution &c : cautions(confidence))
        html += QStringLiteral("<p><b>%1</b> %2</p>").arg(c.title.toHtmlEscaped(), c.text.toHtmlEscaped());
    return html;
}

} // namespace tailwise::ui

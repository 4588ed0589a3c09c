#include "text/cautions.h"

#include <QCoreApplication>

namespace tailwise::ui {

namespace {
QString tr(const char *text) { return QCoreApplication::translate("Cautions", text); }
} // namespace

QString cautionsShortText()
{
    return tr("Estimates, not advice. VaR is not the worst case: larger losses happen, about once in 100 horizons "
              "at 99%, and Expected Shortfall is only their average under the model. The figures rest on the "
              "model and on the price history; a calm window understates risk. More in Help ▸ About.");
}

QList<Caution> cautions()
{
    return {
        {tr("What these figures are."),
         tr("Value-at-Risk (VaR) is the loss that, under the chosen model and assumptions, should not be exceeded "
            "over the horizon with the chosen confidence. Expected Shortfall (ES) is the average loss in the cases "
            "beyond VaR.")},
        {tr("What they are not."),
         tr("VaR is not the worst case: at 99% a larger loss is expected about once in every 100 horizons, and it "
            "can be much larger. Neither figure is a forecast, a guarantee or advice to buy, sell or hedge.")},
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

QString cautionsFullText()
{
    QString html;
    for (const Caution &c : cautions())
        html += QStringLiteral("<p><b>%1</b> %2</p>").arg(c.title.toHtmlEscaped(), c.text.toHtmlEscaped());
    return html;
}

} // namespace tailwise::ui

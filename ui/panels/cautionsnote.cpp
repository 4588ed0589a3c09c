#include "cautionsnote.h"

namespace tailwise::ui {

CautionsNote::CautionsNote(QWidget *parent) : QLabel(parent)
{
    setObjectName(QStringLiteral("cautions"));
    setWordWrap(true);
    setText(tr("Estimates, not advice. VaR is not the worst case: larger losses happen, about once in 100 horizons "
               "at 99 %, and Expected Shortfall is only their average under the model. The figures rest on the "
               "model and on the price history; a calm window understates risk. More in Help ▸ About."));
    setToolTip(fullText());
    setContentsMargins(6, 3, 6, 3);
    setStyleSheet(QStringLiteral("QLabel#cautions { background: palette(alternate-base); "
                                 "border-top: 1px solid palette(mid); }"));
}

QString CautionsNote::fullText()
{
    return tr("<p><b>What these figures are.</b> Value-at-Risk (VaR) is the loss that, under the chosen model and "
              "assumptions, should not be exceeded over the horizon with the chosen confidence. Expected Shortfall "
              "(ES) is the average loss in the cases beyond VaR.</p>"
              "<p><b>What they are not.</b> VaR is not the worst case: at 99 % a larger loss is expected about once "
              "in every 100 horizons, and it can be much larger. Neither figure is a forecast, a guarantee or "
              "advice to buy, sell or hedge.</p>"
              "<p><b>Model and data limits.</b> The figures assume the holdings stay unchanged over the horizon and "
              "that the past window describes the future. A calm window understates risk; prices carried forward "
              "over gaps, few returns, or more assets than returns make estimates unreliable. Scaling to long "
              "horizons by the square root of time assumes independent days. Different models give different "
              "figures; compare them before relying on one.</p>"
              "<p><b>Regulatory use.</b> Capital, limit or disclosure figures follow the rules of your "
              "jurisdiction and the models your supervisor has approved; this program is not such a model.</p>");
}

} // namespace tailwise::ui

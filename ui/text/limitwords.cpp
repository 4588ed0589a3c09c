#include "text/limitwords.h"

#include "text/numbers.h"

#include <QCoreApplication>

namespace tailwise::ui {

namespace {
QString tr(const char *text) { return QCoreApplication::translate("Limits", text); }
} // namespace

QString limitMeasureName(LimitMeasure measure) { return measure == LimitMeasure::Var ? tr("VaR") : tr("ES"); }

QString limitStateWord(LimitState state)
{
    switch (state) {
    case LimitState::Ok: return tr("ok");
    case LimitState::Warning: return tr("warning");
    case LimitState::Breached: return tr("BREACHED");
    }
    return {};
}

QString limitSetText(const Limit &limit)
{
    return limit.percentOfValue ? tr("%1 of value").arg(percentText(limit.amount / 100.0))
                                : moneyText(limit.amount, 0);
}

} // namespace tailwise::ui

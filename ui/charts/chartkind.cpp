#include "charts/chartkind.h"

#include <QCoreApplication>

namespace tailwise::ui {

QString chartKindName(ChartKind kind)
{
    switch (kind) {
    case ChartKind::LossTail: return QStringLiteral("loss-tail");
    case ChartKind::Tradeoff: return QStringLiteral("tradeoff");
    case ChartKind::Contributions: return QStringLiteral("contributions");
    case ChartKind::Backtest: return QStringLiteral("backtest");
    case ChartKind::Models: return QStringLiteral("models");
    }
    return {};
}

std::optional<ChartKind> parseChartKind(const QString &name)
{
    for (const ChartKind kind : allChartKinds)
        if (chartKindName(kind) == name)
            return kind;
    return std::nullopt;
}

QStringList chartKindNames()
{
    QStringList names;
    for (const ChartKind kind : allChartKinds)
        names << chartKindName(kind);
    return names;
}

QString chartKindTitle(ChartKind kind)
{
    // The window's tab names, so a chart is called the same wherever it appears.
    switch (kind) {
    case ChartKind::LossTail: return QCoreApplication::translate("ChartKind", "Loss tail");
    case ChartKind::Tradeoff: return QCoreApplication::translate("ChartKind", "Horizon and confidence");
    case ChartKind::Contributions: return QCoreApplication::translate("ChartKind", "What drives it");
    case ChartKind::Backtest: return QCoreApplication::translate("ChartKind", "Backtest");
    case ChartKind::Models: return QCoreApplication::translate("ChartKind", "Models side by side");
    }
    return {};
}

} // namespace tailwise::ui

// The charts that can be exported, with the names the command line and files use
// ("loss-tail", "tradeoff", "contributions", "backtest", "models") and their titles for people.
#pragma once

#include <QString>
#include <QStringList>

#include <array>
#include <optional>

namespace tailwise::ui {

enum class ChartKind { LossTail, Tradeoff, Contributions, Backtest, Models };

inline constexpr std::array<ChartKind, 5> allChartKinds{ChartKind::LossTail, ChartKind::Tradeoff, ChartKind::Contributions,
                                                        ChartKind::Backtest, ChartKind::Models};

// The command-line name: "loss-tail", "tradeoff", "contributions", "backtest", "models".
QString chartKindName(ChartKind kind);
// The kind named so (exactly, lower case); nullopt for anything else.
std::optional<ChartKind> parseChartKind(const QString &name);
// Every name, in the order of allChartKinds (for help and error texts).
QStringList chartKindNames();
// The title a person reads, e.g. "Loss tail", "Horizon and confidence" (translated).
QString chartKindTitle(ChartKind kind);

} // namespace tailwise::ui

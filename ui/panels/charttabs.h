// ChartTabs: the three pictures of the figures as tabs — the loss tail, horizon and confidence,
// contributions — fed from the workbook's report through each chart's pure build function.
// A click on the horizon × confidence map becomes an assumptions edit. Three more tabs hold the
// panels that go beyond one model's figures: every model side by side, trying a trade, and stress.
#pragma once

#include "charts/chartkind.h"

#include "tailwise/risk.h"

#include <QWidget>

#include <array>
#include <optional>
#include <vector>

class QAction;
class QCheckBox;
class QLabel;
class QProgressBar;
class QPushButton;
class QStackedWidget;
class QTabWidget;

namespace tailwise::ui {

class BacktestView;
class ContributionsChart;
class LossTailChart;
class ModelComparisonView;
class StressPanel;
class WhatIfPanel;
class TradeoffChart;
class Workbook;

class ChartTabs : public QWidget {
    Q_OBJECT
public:
    explicit ChartTabs(Workbook &workbook, QWidget *parent = nullptr);

    LossTailChart *lossTailChart() const { return m_lossTail; }
    TradeoffChart *tradeoffChart() const { return m_tradeoff; }
    ContributionsChart *contributionsChart() const { return m_contributions; }
    QTabWidget *tabs() const { return m_tabs; }
    BacktestView *backtestView() const { return m_backtest; }
    ModelComparisonView *modelComparison() const { return m_comparison; }
    WhatIfPanel *whatIfPanel() const { return m_whatIf; }
    StressPanel *stressPanel() const { return m_stress; }
    QCheckBox *modelOverlayOption() const { return m_overlay; }

    // The chart of the tab in view, for Export Chart and Copy Chart; nullopt on the tabs without
    // one (trying a trade, stress) and without figures.
    std::optional<ChartKind> currentChartKind() const;
    // The loss tail is drawn in % of portfolio value (its option under the chart).
    bool lossTailInPercent() const;
    // The window's Export Chart and Copy Chart, shown as buttons beside the tabs and enabled
    // while the tab in view has a chart.
    void setChartActions(QAction *exportChart, QAction *copyChart);

private:
    void refresh();
    void refreshLossTail();
    void watchOverlays();
    void refreshTab(int tab);
    void refreshTradeoff();
    void watchGrid();
    void refreshGridStatus();
    void updateChartActions();

    Workbook &m_workbook;
    QStackedWidget *m_stack = nullptr;
    QLabel *m_empty = nullptr;
    QTabWidget *m_tabs = nullptr;
    LossTailChart *m_lossTail = nullptr;
    QCheckBox *m_percent = nullptr;
    QCheckBox *m_history = nullptr;
    TradeoffChart *m_tradeoff = nullptr;
    ContributionsChart *m_contributions = nullptr;
    BacktestView *m_backtest = nullptr;
    QCheckBox *m_overlay = nullptr; // draw the other models' densities on the loss tail
    ModelComparisonView *m_comparison = nullptr;
    WhatIfPanel *m_whatIf = nullptr;
    StressPanel *m_stress = nullptr;
    // The horizon-and-confidence grid's run (the store's Grid part, computed in the background).
    QWidget *m_gridRow = nullptr;
    QLabel *m_gridStatus = nullptr;
    QProgressBar *m_gridProgress = nullptr;
    QPushButton *m_gridStop = nullptr;
    QPushButton *m_gridAgain = nullptr;
    bool m_gridStopped = false; // until "Compute again" or a change of its inputs
    QAction *m_exportChart = nullptr;
    QAction *m_copyChart = nullptr;
    std::array<bool, 3> m_stale{true, true, true}; // tab needs new data before it is drawn
};

} // namespace tailwise::ui

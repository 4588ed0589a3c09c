// ChartTabs: the three pictures of the figures as tabs — the loss tail, horizon and confidence,
// contributions — fed from the workbook's report through each chart's pure build function.
// A click on the horizon × confidence map becomes an assumptions edit.
#pragma once

#include <QWidget>

#include <array>

class QCheckBox;
class QLabel;
class QStackedWidget;
class QTabWidget;

namespace tailwise::ui {

class ContributionsChart;
class LossTailChart;
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

private:
    void refresh();
    void refreshLossTail();
    void refreshTab(int tab);

    Workbook &m_workbook;
    QStackedWidget *m_stack = nullptr;
    QLabel *m_empty = nullptr;
    QTabWidget *m_tabs = nullptr;
    LossTailChart *m_lossTail = nullptr;
    QCheckBox *m_percent = nullptr;
    QCheckBox *m_history = nullptr;
    TradeoffChart *m_tradeoff = nullptr;
    ContributionsChart *m_contributions = nullptr;
    std::array<bool, 3> m_stale{true, true, true}; // tab needs new data before it is drawn
};

} // namespace tailwise::ui

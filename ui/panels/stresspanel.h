// StressPanel: named scenarios of per-asset price shocks, kept in the workbook, and the P&L of
// each on the current holdings; below them, the window's five worst days replayed on today's
// holdings, with their dates (core runStress, stress.h). Scenario edits (add, rename, remove, a
// shock) are undo commands (edit::setScenarios); the P&L is core's, the results store's stress
// part (document/resultsstore.h), computed in the background while the panel is shown.
#pragma once

#include "document/resultsstore.h"

#include "tailwise/stress.h"

#include <QWidget>

#include <vector>

class QLabel;
class QListWidget;
class QTableWidget;
class QToolButton;

namespace tailwise::ui {

class Workbook;

class StressPanel : public QWidget {
    Q_OBJECT
public:
    explicit StressPanel(Workbook &workbook, QWidget *parent = nullptr);

    // The outcomes shown: every scenario in order, then the worst days.
    const std::vector<tailwise::StressOutcome> &outcomes() const;
    QTableWidget *outcomesTable() const { return m_outcomesTable; }
    QListWidget *scenarioList() const { return m_list; }

    static constexpr int worstDayCount = ResultsStore::stressWorstDays;

protected:
    void showEvent(QShowEvent *event) override;
    void hideEvent(QHideEvent *event) override;

private:
    void rebuild();          // the list and the selected scenario's shocks, from the workbook
    void showShocks();
    void refreshOutcomes();
    void commit(std::vector<tailwise::StressScenario> scenarios, const QString &text);
    void commitShocksFromTable();
    void addShockRow(const std::string &asset, double shock);
    int current() const;

    Workbook &m_workbook;
    QListWidget *m_list = nullptr;
    QTableWidget *m_shocks = nullptr;
    QTableWidget *m_outcomesTable = nullptr;
    QLabel *m_note = nullptr;
    QToolButton *m_addShock = nullptr;
    QToolButton *m_removeShock = nullptr;
    bool m_committing = false; // our own edit is being applied: widgets already show it
    bool m_filling = false;
};

} // namespace tailwise::ui

// WhatIfPanel: proposed trades and what they would do to the risk, before anything changes.
//
// The user lists trades (an asset of the price history, held or not, and a change in quantity).
// Core's whatIf (whatif.h) gives VaR before and after, the incremental VaR, the marginal-VaR
// estimate of the same change and the gap between the two, and both portfolios' contributions;
// the panel shows them, and draws the after-trade loss tail with the current portfolio as a ghost
// curve. Apply makes the trades one undo step (edit::replaceHoldings with core's applyTrades);
// Discard clears the proposal. Monte Carlo runs in the background with progress and a stop
// button; the closed-form models inline. The proposal is the results store's what-if input, and
// the figures are its what-if part (document/resultsstore.h), recomputed while the panel is shown.
#pragma once

#include "tailwise/whatif.h"

#include <QWidget>

#include <optional>
#include <vector>

class QLabel;
class QProgressBar;
class QPushButton;
class QTableWidget;
class QToolButton;

namespace tailwise::ui {

class LossTailChart;
class Workbook;

class WhatIfPanel : public QWidget {
    Q_OBJECT
public:
    explicit WhatIfPanel(Workbook &workbook, QWidget *parent = nullptr);

    // The proposal as the table holds it (rows with no asset are left out).
    std::vector<tailwise::Trade> trades() const;
    // Replaces the proposal (tests, and the Discard button with an empty list).
    void setTrades(const std::vector<tailwise::Trade> &trades);
    // The latest figures for the proposal; empty without trades, or when core refused them.
    std::optional<tailwise::WhatIf> result() const;
    QString problem() const;
    // Computes now, on this thread, whatever the model (tests, screenshots).
    void computeNow();
    // Applies the proposal as one undo step; false (and nothing changes) when it cannot.
    bool apply();
    void discard();

    LossTailChart *chart() const { return m_chart; }
    QTableWidget *contributionsTable() const { return m_contributions; }

protected:
    void showEvent(QShowEvent *event) override;
    void hideEvent(QHideEvent *event) override;

private:
    void addTradeRow(const tailwise::Trade &trade);
    void proposalEdited();
    void recompute();
    void refresh();
    void refreshAssets();

    Workbook &m_workbook;
    QTableWidget *m_trades = nullptr;
    QToolButton *m_addTrade = nullptr;
    QToolButton *m_removeTrade = nullptr;
    QLabel *m_figures = nullptr;
    QLabel *m_status = nullptr;
    QTableWidget *m_contributions = nullptr;
    LossTailChart *m_chart = nullptr;
    QPushButton *m_apply = nullptr;
    QPushButton *m_discard = nullptr;
    QProgressBar *m_progress = nullptr;
    QToolButton *m_stop = nullptr;
    bool m_filling = false; // the table is being filled by code, not edited
};

} // namespace tailwise::ui

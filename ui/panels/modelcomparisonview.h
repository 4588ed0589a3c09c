// ModelComparisonView: every model side by side at the workbook's current assumptions (core
// compareModels), as a table of VaR and ES in money and % with each model's difference from the
// normal. The rows are the results store's comparison part (document/resultsstore.h), computed in
// the background (Monte Carlo takes most of it) while the view is shown, with progress and a
// stop button; a hidden view costs nothing and catches up when it is shown again.
#pragma once

#include <QWidget>

class QLabel;
class QProgressBar;
class QTableView;
class QToolButton;

namespace tailwise::ui {

class ModelComparisonModel;
class Workbook;

class ModelComparisonView : public QWidget {
    Q_OBJECT
public:
    explicit ModelComparisonView(Workbook &workbook, QWidget *parent = nullptr);

    ModelComparisonModel *model() const { return m_model; }
    QTableView *table() const { return m_table; }
    // Computes the table now, on this thread (tests, screenshots).
    void computeNow();
    bool isComputing() const;
    // The table holds the comparison of the current figures (not one of older inputs, not one
    // still being computed).
    bool isCurrent() const;

protected:
    void showEvent(QShowEvent *event) override;
    void hideEvent(QHideEvent *event) override;

private:
    void refresh();
    void refreshStatus();
    void stop();

    Workbook &m_workbook;
    ModelComparisonModel *m_model = nullptr;
    QTableView *m_table = nullptr;
    QLabel *m_status = nullptr;
    QProgressBar *m_progress = nullptr;
    QToolButton *m_stop = nullptr;
    bool m_stopped = false; // stopped by the user: not restarted by being shown again
};

} // namespace tailwise::ui

// BacktestView: would the model's one-day VaR have held up over the workbook's price history?
//
// Top: the backtest settings (rolling window W, the test size of the verdict, the model, and
// whether to compare the other models), each edit an undo command (edit::setBacktestSettings),
// with the run's progress and a stop button. Then the traffic-light zone in words, the verdict
// in words at the chosen test size (core: verdictAt), the chart of daily P&L against −VaR with
// the exceptions marked, the test figures (observations, exceptions, expected, Kupiec,
// Christoffersen), the list of exceptions with their dates and losses against VaR, and — when
// more than one model is run — the models side by side. Every figure comes from core through
// the results store's backtest part (document/resultsstore.h), computed while the view is shown
// (or on request: an export); the view computes none and holds none.
#pragma once

#include "document/workbookcontents.h"

#include "tailwise/backtest.h"

#include <QWidget>

class QCheckBox;
class QComboBox;
class QDoubleSpinBox;
class QGroupBox;
class QLabel;
class QProgressBar;
class QPushButton;
class QSpinBox;
class QStackedWidget;
class QTableWidget;

namespace tailwise::ui {

class BacktestChart;
class Workbook;

class BacktestView : public QWidget {
    Q_OBJECT
public:
    explicit BacktestView(Workbook &workbook, QWidget *parent = nullptr);

    // The texts a user reads, for tests: the zone line, the verdict line, the message shown
    // instead of results (empty when results are shown).
    QString zoneText() const;
    QString verdictText() const;
    QString messageText() const;
    BacktestChart *chart() const { return m_chart; }
    QTableWidget *exceptionsTable() const { return m_exceptions; }
    QTableWidget *comparisonTable() const { return m_comparison; }
    QSpinBox *windowField() const { return m_window; }
    QDoubleSpinBox *testSizeField() const { return m_testSize; }
    QComboBox *modelField() const { return m_model; }
    QCheckBox *compareField() const { return m_compare; }
    QPushButton *stopButton() const { return m_stop; }

    // The window's name of a model ("Normal", "Student-t", …).
    static QString modelTitle(tailwise::RiskModel model);

protected:
    void showEvent(QShowEvent *event) override;
    void hideEvent(QHideEvent *event) override;

private:
    void refreshSettings();
    void refreshStatus();
    void refreshResults();
    void showResult(const tailwise::BacktestResult &result);
    void fillComparison();
    void editSettings(const BacktestSettings &settings, const QString &text, int mergeKey);

    Workbook &m_workbook;
    bool m_stopped = false; // the user stopped the run; it waits for "Run again" or a new input

    QSpinBox *m_window = nullptr;
    QDoubleSpinBox *m_testSize = nullptr;
    QComboBox *m_model = nullptr;
    QCheckBox *m_compare = nullptr;
    QLabel *m_status = nullptr;
    QProgressBar *m_progress = nullptr;
    QPushButton *m_stop = nullptr;
    QPushButton *m_again = nullptr;

    QStackedWidget *m_stack = nullptr;
    QLabel *m_message = nullptr;
    QLabel *m_zone = nullptr;
    QLabel *m_verdict = nullptr;
    BacktestChart *m_chart = nullptr;
    QLabel *m_tests = nullptr;
    QGroupBox *m_exceptionsBox = nullptr;
    QTableWidget *m_exceptions = nullptr;
    QGroupBox *m_comparisonBox = nullptr;
    QTableWidget *m_comparison = nullptr;
    QLabel *m_warnings = nullptr;
};

} // namespace tailwise::ui

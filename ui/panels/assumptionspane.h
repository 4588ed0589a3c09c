// AssumptionsPane: the assumptions behind the figures. Each widget edit becomes an
// edit::setAssumptions command; runs of edits to one field (a slider drag, spin-box steps) merge
// into one undo step. The pane refreshes from the workbook under QSignalBlocker, so a refresh is
// never taken for an edit.
#pragma once

#include "document/commands.h"

#include <QWidget>

class QButtonGroup;
class QCheckBox;
class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QSlider;
class QSpinBox;
class QToolButton;

namespace tailwise {
struct Assumptions;
}

namespace tailwise::ui {

class Workbook;

class AssumptionsPane : public QWidget {
    Q_OBJECT
public:
    explicit AssumptionsPane(Workbook &workbook, QWidget *parent = nullptr);

    // The quick choices of the horizon, in trading days (1 year = the workbook's days per year).
    static QList<int> horizonChoices(int daysPerYear);

private:
    void buildWidgets();
    void connectWidgets();
    void refresh();
    void refreshWindowRange();
    void commit(const tailwise::Assumptions &a, const QString &text, edit::MergeKey key);
    void setConfidence(double confidence, edit::MergeKey key);
    void setHorizon(int days);

    Workbook &m_workbook;
    QDoubleSpinBox *m_confidence = nullptr;
    QSlider *m_confidenceSlider = nullptr;
    QSpinBox *m_horizon = nullptr;
    QList<QToolButton *> m_horizonButtons;
    QSpinBox *m_daysPerYear = nullptr;
    QCheckBox *m_allReturns = nullptr;
    QSpinBox *m_window = nullptr;
    QLabel *m_windowRange = nullptr;
    QComboBox *m_estimator = nullptr;
    QDoubleSpinBox *m_lambda = nullptr;
    QLabel *m_lambdaEffective = nullptr;
    QComboBox *m_mean = nullptr;
    QComboBox *m_returns = nullptr;
    QComboBox *m_model = nullptr;
    bool m_dragOpen = false; // an undo macro is open for a slider drag
};

} // namespace tailwise::ui

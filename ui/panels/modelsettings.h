// ModelSettings: the parameters of the chosen model, shown below the model choice in the
// assumptions pane — degrees of freedom ν (Student-t; Monte Carlo's t draws), how historical
// simulation reaches the horizon, how Student-t and Cornish–Fisher reach it (the multi-day
// scaling), and the number of draws and seed of Monte Carlo. Only the rows
// the current model uses are shown. Each edit is an edit::setAssumptions command; the widget
// refreshes from the workbook under QSignalBlocker.
#pragma once

#include <QWidget>

class QComboBox;
class QDoubleSpinBox;
class QFormLayout;
class QLabel;
class QLineEdit;
class QSpinBox;

namespace tailwise {
struct Assumptions;
}

namespace tailwise::ui {

class Workbook;

class ModelSettings : public QWidget {
    Q_OBJECT
public:
    explicit ModelSettings(Workbook &workbook, QWidget *parent = nullptr);

private:
    void refresh();
    void commitDof();
    void commitSeed();
    void showRow(QWidget *field, bool visible);

    Workbook &m_workbook;
    QFormLayout *m_form = nullptr;
    QComboBox *m_dofKind = nullptr;     // fit / given / (monte carlo) normal draws
    QDoubleSpinBox *m_dof = nullptr;
    QComboBox *m_historicalHorizon = nullptr;
    QComboBox *m_scaling = nullptr; // student-t, cornish-fisher: √H or the H-day sum
    QSpinBox *m_simulations = nullptr;
    QLineEdit *m_seed = nullptr;
    QLabel *m_note = nullptr;
};

} // namespace tailwise::ui

// The workbook's own details at the top of the assumptions pane: its title (window title, report)
// and the currency its money is in (named on money axes and in reports). Each edit is an undo step;
// a currency that is not a code of three capital letters is refused with the reason beside it,
// and the workbook keeps the one it had.
#pragma once

#include <QWidget>

class QLabel;
class QLineEdit;

namespace tailwise::ui {

class Workbook;

class WorkbookDetails : public QWidget {
    Q_OBJECT
public:
    explicit WorkbookDetails(Workbook &workbook, QWidget *parent = nullptr);

    QLineEdit *titleEdit() const { return m_title; }
    QLineEdit *currencyEdit() const { return m_currency; }
    QLabel *problemLabel() const { return m_problem; }

private:
    void commitTitle();
    void commitCurrency();
    void refresh();

    Workbook &m_workbook;
    QLineEdit *m_title = nullptr;
    QLineEdit *m_currency = nullptr;
    QLabel *m_problem = nullptr;
};

} // namespace tailwise::ui

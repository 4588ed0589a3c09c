// HeadlinePanel: the figures at a glance — VaR and ES in money and as a share of the portfolio's
// value, one sentence that reads them in words, the warnings that came with them, and the result
// error in plain words when there is no figure. It only shows what the workbook's report says.
#pragma once

#include <QWidget>

class QLabel;

namespace tailwise {
struct RiskReport;
}

namespace tailwise::ui {

class ElidedLabel;
class Workbook;

class HeadlinePanel : public QWidget {
    Q_OBJECT
public:
    explicit HeadlinePanel(Workbook &workbook, QWidget *parent = nullptr);


private:
    void refresh();
    void refreshLimits(const tailwise::RiskReport &report);

    Workbook &m_workbook;
    ElidedLabel *m_title = nullptr;
    QLabel *m_varMoney = nullptr;
    QLabel *m_varShare = nullptr;
    QLabel *m_esMoney = nullptr;
    QLabel *m_esShare = nullptr;
    QLabel *m_value = nullptr;
    QLabel *m_currency = nullptr; // the workbook's currency code, beside the portfolio value
    QLabel *m_sentence = nullptr;
    QLabel *m_notes = nullptr;
    QLabel *m_limits = nullptr; // the workbook's limits: each one's use and state, in words
    QWidget *m_figures = nullptr;
};

} // namespace tailwise::ui

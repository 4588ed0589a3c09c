// The contributions view: component VaR per holding as sorted horizontal bars (hedges in their
// own colour, with a legend entry) and, beside them, the diversification step from the sum of
// standalone VaRs down to the portfolio VaR. Fed only by setData().
#pragma once

#include "charts/contributionschartdata.h"

#include <QPointer>
#include <QWidget>

#include <utility>
#include <vector>

class QCustomPlot;
class QCPAxisRect;
class QCPBars;
class QCPItemText;

namespace tailwise::ui {

class ContributionsChart : public QWidget {
    Q_OBJECT
public:
    explicit ContributionsChart(QWidget *parent = nullptr);

    void setData(const ContributionsChartData &data);
    const ContributionsChartData &data() const { return m_data; }

    QCustomPlot *plot() const { return m_plot; }

    QSize sizeHint() const override { return {640, 360}; }

    // The diversification step's sentence (paper leaves it to the caption); null when not drawn.
    QCPItemText *benefitNote() const;

private:
    void build();
    void fillBars();
    void fillDiversification();
    void fitLabelsInside();

    ContributionsChartData m_data;
    QCustomPlot *m_plot = nullptr;
    QCPAxisRect *m_barsRect = nullptr;
    QCPAxisRect *m_stepRect = nullptr;
    QCPBars *m_adders = nullptr;
    QCPBars *m_hedges = nullptr;
    QCPBars *m_stepBars = nullptr;
    // Guarded: the print layout removes items of a panel it leaves out.
    std::vector<QPointer<QCPItemText>> m_barLabels; // one per bar, at the bar's end
    std::vector<std::pair<QPointer<QCPItemText>, double>> m_stepLabels; // the step's figures, their home key
    QPointer<QCPItemText> m_benefitNote;
};

} // namespace tailwise::ui

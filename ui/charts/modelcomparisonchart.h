// The model-comparison chart: VaR and ES of every model as grouped bars (VaR dark, ES light and
// outlined, so they part in greyscale), each bar labelled with its money figure, the workbook's
// own model marked on its axis label, and a model without a figure shown by its reason in place
// of bars. Fed only by setData(); it computes nothing.
#pragma once

#include "charts/modelcomparisonchartdata.h"

#include <QWidget>

class QCustomPlot;
class QCPBars;

namespace tailwise::ui {

class ModelComparisonChart : public QWidget {
    Q_OBJECT
public:
    explicit ModelComparisonChart(QWidget *parent = nullptr);

    void setData(const ModelComparisonChartData &data);
    const ModelComparisonChartData &data() const { return m_data; }

    // The plot itself, for export.
    QCustomPlot *plot() const { return m_plot; }

    QSize sizeHint() const override { return {640, 360}; }

private:
    ModelComparisonChartData m_data;
    QCustomPlot *m_plot = nullptr;
    QCPBars *m_var = nullptr;
    QCPBars *m_es = nullptr;
};

} // namespace tailwise::ui

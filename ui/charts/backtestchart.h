// The backtest chart: each tested day's P&L as a thin bar from zero, the −VaR forecast as a line,
// and the exceptions (losses beyond VaR) as large downward triangles in a colour of their own, so
// they stand out by shape as well as colour (and in greyscale). Dates along the x axis, money in
// the user's locale along the y axis. Fed only by setData(); it computes nothing.
#pragma once

#include "charts/backtestchartdata.h"

#include <QWidget>

class QCustomPlot;
class QCPGraph;
class QLabel;

namespace tailwise::ui {

class BacktestChart : public QWidget {
    Q_OBJECT
public:
    explicit BacktestChart(QWidget *parent = nullptr);

    void setData(const BacktestChartData &data);
    const BacktestChartData &data() const { return m_data; }

    // The plot itself, for export.
    QCustomPlot *plot() const { return m_plot; }

    QSize sizeHint() const override { return {640, 300}; }

private:
    BacktestChartData m_data;
    QCustomPlot *m_plot = nullptr;
    QLabel *m_note = nullptr;
    QCPGraph *m_pnl = nullptr;
    QCPGraph *m_var = nullptr;
    QCPGraph *m_exceptions = nullptr;
};

} // namespace tailwise::ui

// The horizon-and-confidence view: VaR against horizon for several confidences, VaR against
// confidence at the current horizon, and a map over horizon × confidence coloured by VaR with
// round-money contour lines, the current setting marked and, with an expected gain, the ridge
// where VaR turns down. Clicking the map emits assumptionsPicked; the view itself changes nothing.
#pragma once

#include <cstddef>
#include <utility>
#include <vector>

#include "charts/tradeoffchartdata.h"

#include <QWidget>

class QCustomPlot;
class QCPColorMap;
class QCPColorScale;
class QCPGraph;
class QCPItemStraightLine;
class QCPItemText;
class QCPTextElement;
class QLabel;
class QMouseEvent;

namespace tailwise::ui {

class TradeoffChart : public QWidget {
    Q_OBJECT
public:
    explicit TradeoffChart(QWidget *parent = nullptr);

    void setData(const TradeoffChartData &data);
    const TradeoffChartData &data() const { return m_data; }

    QCustomPlot *horizonPlot() const { return m_horizonPlot; }
    QCustomPlot *confidencePlot() const { return m_confidencePlot; }
    QCustomPlot *mapPlot() const { return m_mapPlot; }

    // For paper: the map's title without the invitation to click it, and the confidence line's
    // axis with the ticks that do not touch at print sizes (90%, 95%, 99%, 99.9%).
    void setForPaper();

    // The widget pixel (in mapPlot()) of a horizon and confidence, e.g. for tests that click.
    QPoint mapPixel(int horizonDays, double confidence) const;

    QSize sizeHint() const override { return {900, 500}; }

signals:
    // The user clicked the map at this horizon (whole trading days) and confidence (0 < C < 1).
    void assumptionsPicked(int horizonDays, double confidence);

private:
    void buildHorizonPlot();
    void buildConfidencePlot();
    void buildMapPlot();
    void fillHorizonPlot();
    void fillConfidencePlot();
    void fillMapPlot();
    void mapClicked(QMouseEvent *event);
    void placeContourLabels();

    TradeoffChartData m_data;
    QLabel *m_note = nullptr;
    QCustomPlot *m_horizonPlot = nullptr;
    QCustomPlot *m_confidencePlot = nullptr;
    QCustomPlot *m_mapPlot = nullptr;
    QCPColorMap *m_map = nullptr;
    QCPColorScale *m_scale = nullptr;
    QCPTextElement *m_mapTitle = nullptr;
    // The map's labels, placed in pixels once the map is laid out (placeContourLabels).
    std::vector<std::pair<QCPItemText *, std::size_t>> m_contourLabels; // label, its level
    std::vector<QCPItemText *> m_fixedLabels;                           // "now", the ridge's note
};

} // namespace tailwise::ui

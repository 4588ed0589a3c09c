// The loss-tail chart: the model's horizon P&L density with the tail beyond −VaR shaded,
// markers at −VaR and −ES, an optional histogram of the window's P&L, and a hover read-out of
// the model's probability of a P&L below the pointer. Fed only by setData(); it computes no
// risk figure (the read-out asks core through lossTailProbabilityBelow).
#pragma once

#include "charts/losstailchartdata.h"

#include <QVector>
#include <QWidget>

class QCustomPlot;
class QCPGraph;
class QCPBars;
class QCPItemStraightLine;
class QCPItemText;
class QLabel;

namespace tailwise::ui {

class LossTailChart : public QWidget {
    Q_OBJECT
public:
    explicit LossTailChart(QWidget *parent = nullptr);

    void setData(const LossTailChartData &data);
    const LossTailChartData &data() const { return m_data; }

    // The hover read-out for a pointer at x (x units), as the mouse would show it; empty clears it.
    void showPointer(double x);
    void clearPointer();
    QString pointerText() const;

    // The plot itself, for export (savePng, savePdf, toPixmap).
    QCustomPlot *plot() const { return m_plot; }

    // The labels of the VaR and ES lines (a layout for paper places them itself).
    QCPItemText *varLabel() const { return m_varText; }
    QCPItemText *esLabel() const { return m_esText; }
    QSize sizeHint() const override { return {640, 360}; }

protected:
    bool eventFilter(QObject *watched, QEvent *event) override;

private:
    void build();

    LossTailChartData m_data;
    QCustomPlot *m_plot = nullptr;
    QLabel *m_note = nullptr;
    QCPBars *m_history = nullptr;
    QCPGraph *m_tail = nullptr;
    QCPGraph *m_curve = nullptr;
    QCPItemStraightLine *m_varLine = nullptr;
    QCPItemStraightLine *m_esLine = nullptr;
    QCPItemText *m_varText = nullptr;
    QCPItemText *m_esText = nullptr;
    QVector<QCPGraph *> m_overlays; // LossTailChartData::overlays, in order
    QCPItemStraightLine *m_pointerLine = nullptr;
    QCPItemText *m_pointerText = nullptr;
};

} // namespace tailwise::ui

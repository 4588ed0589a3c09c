// The numbers behind the horizon-and-confidence view, built from a core RiskReport.
//
// Three pictures, all cells of core's normalRiskGrid (VaR(H, C) = z(C) √H σ_1 − H μ_1, grid.h):
//   byHorizon    — horizons 1 … daysPerYear (every trading day) × the line confidences;
//   byConfidence — the current horizon × confidences from minConfidence to maxConfidence;
//   map          — horizons 1 … daysPerYear × confidences evenly spaced in the "tail scale"
//                  t = −log10(1 − C) (90% → 1, 99% → 2, 99.9% → 3), so the high confidences
//                  that matter get as much room as the low ones.
// The map keeps whole trading days on a linear horizon axis: core's grid is defined at whole
// days, and a linear axis shows the long-horizon turn of VaR plainly. Contours at round money
// levels come from marching squares (contours.h) in (horizon, tail scale) coordinates. With an
// expected gain (μ_1 > 0) the ridge H*(C) = (z σ_1 / (2 μ_1))² (core: normalVarTurningHorizon)
// is where VaR stops growing with horizon; it is given where it falls inside 1 … daysPerYear.
#pragma once

#include "charts/contours.h"

#include "tailwise/grid.h"
#include "tailwise/result.h"
#include "tailwise/risk.h"

#include <QString>

#include <optional>
#include <vector>

namespace tailwise::ui {

struct TradeoffOptions {
    std::vector<double> lineConfidences{0.95, 0.975, 0.99, 0.995, 0.999};
    double minConfidence = 0.90;
    double maxConfidence = 0.999;
    int confidenceSteps = 61; // rows of the map and points of the VaR-against-confidence line
    int contourTarget = 7;    // about this many contour levels
    QString currency{};       // the workbook's code, named on the VaR axis; empty: "money"
};

struct ContourLevel {
    double level = 0.0;         // money
    QString label;              // the level in the user's locale
    std::vector<ContourLine> lines;
    ContourPoint labelAt;       // where to write the label: on a line, as far from the map's edges as it gets
};

struct TurningPoint {
    double confidence = 0.0;
    double horizonDays = 0.0;   // H*, not rounded
    double var = 0.0;           // the peak VaR z²σ_1²/(4μ_1) = VaR at H*, money
};

struct TradeoffChartData {
    bool valid = false;         // false without a finite one-day spread; `note` says why
    QString note;
    int horizonDays = 1;        // the current setting
    double confidence = 0.99;
    double currentVar = 0.0;    // the report's VaR (= the grid's value at the current setting)
    int daysPerYear = 252;

    RiskGrid byHorizon;
    RiskGrid byConfidence;
    RiskGrid map;
    std::vector<double> mapTail;        // tail-scale value of each map confidence (y of the map)
    double varMin = 0.0, varMax = 0.0;  // over the map, for the colour scale
    std::vector<ContourLevel> contours;

    std::vector<TurningPoint> lineTurns; // for the line confidences whose H* lies inside the range
    std::vector<ContourPoint> ridge;     // (H*, tail scale) across the map's confidences, inside the range
    QString ridgeLabel;

    QString horizonLabel, confidenceLabel, varLabel;
};

// The grid the three pictures are slices of: rows gridHorizons(report) (document/gridaxes.h),
// columns tradeoffGridConfidences(options) — the map's confidences, then the line confidences —
// every cell core's modelRiskGrid (modelgrid.h) under the report's model.
std::vector<double> tradeoffGridConfidences(const TradeoffOptions &options = {});
tailwise::Result<tailwise::RiskGrid> computeTradeoffGrid(const RiskReport &report, const TradeoffOptions &options = {});

// The pictures from a grid already computed (the results store's Grid part computes it in the
// background); a grid of other rows or columns than the report and options ask for gives no figures.
TradeoffChartData buildTradeoffChartData(const RiskReport &report, const tailwise::Result<tailwise::RiskGrid> &grid,
                                         const TradeoffOptions &options = {});
// The same, computing the grid on the calling thread.
TradeoffChartData buildTradeoffChartData(const RiskReport &report, const TradeoffOptions &options = {});

// The map's confidence axis: t = −log10(1 − C) and back.
double confidenceToTailScale(double confidence);
double tailScaleToConfidence(double tail);

// What a click at map coordinates (x = horizon days, y = tail scale) picks: the nearest whole day
// in 1 … daysPerYear and the confidence rounded to 0.1% within [minConfidence, maxConfidence].
struct TradeoffPick {
    int horizonDays = 1;
    double confidence = 0.99;
};
TradeoffPick pickOnMap(double x, double y, int daysPerYear, const TradeoffOptions &options = {});

// Round money levels covering [lo, hi], about `target` of them.
std::vector<double> roundLevels(double lo, double hi, int target);

} // namespace tailwise::ui

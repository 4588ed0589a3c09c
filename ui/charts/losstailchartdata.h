// The numbers behind the loss-tail chart, built from a core RiskReport without drawing anything.
//
// The curve is the model's horizon P&L density N(μ_h, σ_h²) (core: normalPnlDensity); the shaded
// tail is every P&L below −VaR; markers sit at −VaR and −ES. All x values are in the chosen unit:
// money, or percent of portfolio value (x% = 100 · P&L / V). Densities are per x unit, so the
// curve and the histogram integrate to 1 over x.
//
// The optional histogram is the window's historical daily P&L p_t = Σ_i e_i r_{i,t} (today's
// exposures applied to each day's returns) multiplied by √H, the same square-root-of-time
// scaling the model uses for its spread (common practice; the mean term is not rescaled). It is
// a picture of the data the model was fitted to, not a historical-simulation VaR.
//
// With a model other than normal (Assumptions::model) the figures come from that model and the
// curve is the normal distribution with the same μ_h and σ_h, labelled so; the note says so.
// Overlays (optional): other models' horizon P&L densities (core modelPnlDensity: student-t,
// Cornish–Fisher; models without a closed density are skipped) drawn over the same x range, and a
// ghost — the density of the portfolio before a proposed trade (its model's density, or the normal
// one with its μ_h, σ_h when that model has none) — drawn faint behind the curve.
// Degenerate inputs never produce NaN: with σ_h = 0 there is no curve (hasCurve false) and
// `note` says why; percent of value is refused (falls back to money, with a note) when V ≤ 0.
#pragma once

#include "tailwise/parametric.h"
#include "tailwise/risk.h"

#include <QString>
#include <QVector>

#include <optional>
#include <vector>

namespace tailwise::ui {

enum class LossTailUnit { Money, PercentOfValue };

struct LossTailOptions {
    LossTailUnit unit = LossTailUnit::Money;
    bool showHistory = true;
    int curvePoints = 401;  // samples of the density across the x range
    int histogramBins = 0;  // 0: choose by the Freedman–Diaconis rule (clamped to 12…80)
    double spanSd = 4.5;    // the x range covers μ_h ± spanSd·σ_h (and the whole histogram)
    // Reports of other models at the same inputs, each drawn as a line with its legend; not owned.
    // (Default member initialisers keep brace-initialised options of the fields above warning-free.)
    std::vector<std::pair<QString, const RiskReport *>> overlays{};
    const RiskReport *ghost = nullptr; // what-if: the portfolio before the trades; not owned
    QString ghostLegend{};
    QString currency{}; // the workbook's code, named on the money axis; empty: "money"
};

struct LossTailOverlay {
    QString legend;
    QVector<double> density; // at LossTailChartData::x, per x unit
    bool ghost = false;
};

struct LossTailChartData {
    LossTailUnit unit = LossTailUnit::Money;
    double moneyPerUnit = 1.0;   // money of one x unit: 1, or V/100 in percent of value
    HorizonMoments model;        // μ_h, σ_h in x units
    double confidence = 0.99;
    int horizonDays = 1;

    bool hasCurve = false;
    QVector<double> x, density;         // the model curve
    QVector<double> tailX, tailDensity; // the shaded part: x from the left edge up to tailBoundary
    double tailBoundary = 0.0;          // −VaR in x units (exactly −report.figures.var in money)
    double esMarker = 0.0;              // −ES in x units
    double tailProbability = 0.01;      // 1 − C, the model's mass of the shaded part
    QString varLabel, esLabel;          // marker labels with the money figures

    QVector<LossTailOverlay> overlays;  // ghost first, then the models in the order given

    bool hasHistogram = false;
    QVector<double> binCenters, binDensity; // density per x unit
    double binWidth = 0.0;
    int historyCount = 0;

    double xMin = 0.0, xMax = 1.0;
    double densityMax = 0.0;            // the tallest of curve and bars, for the y range
    double densityDisplayPer = 1.0;     // y axis shows probability per this many x units
    QString xLabel, yLabel, curveLegend, tailLegend, histogramLegend;
    QString note;                       // shown instead of, or beside, the curve
};

LossTailChartData buildLossTailChartData(const RiskReport &report, const LossTailOptions &options = {});

// P(P&L < x) under the model for a pointer at x (x units); nullopt without a curve.
std::optional<double> lossTailProbabilityBelow(const LossTailChartData &data, double x);

// The read-out shown while hovering at x, e.g. "P&L below −12,000: 2.4% (model)".
QString lossTailHoverText(const LossTailChartData &data, double x);

} // namespace tailwise::ui

// ResultsStore: every figure the window computes for one workbook, in one place.
//
// The workbook owns one (Workbook::results()). Each part is one computed result:
//   Headline    computeRisk at the workbook's assumptions (risk.h): the headline, the holdings'
//               contributions and the loss tail;
//   Grid        modelRiskGrid (modelgrid.h) of the headline's report over gridHorizons(report)
//               (gridaxes.h) × the confidences its view asks for (setGridConfidences): the
//               horizon-and-confidence tab's three pictures are slices of it. It waits for the
//               headline of the same inputs, then runs in the background (Monte Carlo draws
//               afresh for it);
//   Overlays    the same at the other closed-density models (Student-t, Cornish–Fisher), for the
//               loss tail's "other models' curves";
//   Comparison  compareModels (comparison.h);
//   Backtest    runBacktest of each of the backtest settings' models (backtest.h);
//   Stress      runStress: the workbook's scenarios, then the window's worst days (stress.h);
//   WhatIf      whatIf of the proposal set with setWhatIfTrades (whatif.h).
// Each part has a status: its state (pending, running with progress, ready, failed with its
// message, out of date), and the input generation its figures came from. A part's input
// generation counts the changes of what it depends on:
//   prices, holdings, assumptions, New/Open → every part;
//   the grid's confidences → Grid;
//   the scenarios → Stress; the backtest's window or models → Backtest; the proposal → WhatIf;
//   the title, the currency and the backtest's test size → none (they only label or read figures).
// A change marks the dependent parts out of date at once (their last figures stay, marked so).
// A part is recomputed right away (after a coalescing delay) only while someone watches it
// (setWatched: the headline always; a view while it is shown); otherwise it waits for request()
// (an export, a view being shown). Jobs go through the one JobRunner: inline where the part is
// cheap (the headline and what-if under the closed-form and historical models), in the
// background otherwise. A result that arrives for an older input generation is dropped; a
// cancelled part keeps its previous figures, marked out of date, never half-updated.
#pragma once

#include "document/jobrunner.h"
#include "document/workbookcontents.h"

#include "tailwise/backtest.h"
#include "tailwise/comparison.h"
#include "tailwise/estimatecache.h"
#include "tailwise/grid.h"
#include "tailwise/risk.h"
#include "tailwise/stress.h"
#include "tailwise/whatif.h"

#include <QObject>
#include <QString>
#include <QTimer>

#include <array>
#include <optional>
#include <vector>

namespace tailwise::ui {

class Workbook;

enum class Part { Headline, Overlays, Comparison, Backtest, Stress, WhatIf, Grid };
inline constexpr int partCount = 7;

enum class PartState {
    Pending,   // never computed
    Running,   // a job runs for the current inputs (progress in PartStatus)
    Ready,     // the figures are of the current inputs
    Failed,    // core refused the current inputs (message in PartStatus)
    OutOfDate, // an input changed (or the run was stopped); the figures held are older ones
};

struct PartStatus {
    PartState state = PartState::Pending;
    double progress = 0.0;    // 0…1 while Running in the background
    QString message;          // Failed: core's sentence
    quint64 generation = 0;   // the input generation of the figures held (0: none yet)
};

// One model's part of a backtest run: its result once done (unset while it is still running).
struct BacktestModelRun {
    tailwise::RiskModel model = tailwise::RiskModel::Normal;
    std::optional<tailwise::Result<tailwise::BacktestResult>> result;
};

// The backtest part's figures.
struct BacktestRun {
    quint64 generation = 0;
    BacktestSettings settings;
    std::vector<BacktestModelRun> models;   // in the settings' order; models[0] is the one drawn
    std::optional<tailwise::Error> problem; // refused before any model ran (no prices, no holdings)
};

// The grid part's figures: the grid and the headline report it was computed from (so a view
// draws the two together even while a newer headline is in).
struct GridRun {
    quint64 generation = 0;
    std::optional<tailwise::RiskReport> report;           // the headline the grid rescales
    std::optional<tailwise::Result<tailwise::RiskGrid>> grid; // rows gridHorizons(*report), columns as asked
};

class ResultsStore : public QObject {
    Q_OBJECT
public:
    static constexpr int stressWorstDays = 5; // the window's worst days the stress part replays

    explicit ResultsStore(Workbook &workbook);
    ~ResultsStore() override;

    const PartStatus &status(Part part) const { return m_status[index(part)]; }
    PartState state(Part part) const { return status(part).state; }
    // The generation of the part's current inputs (its figures are current when status().generation equals it).
    quint64 inputGeneration(Part part) const { return m_inputs[index(part)]; }
    bool isReady(Part part) const { return state(part) == PartState::Ready; }
    bool isRunning(Part part) const { return state(part) == PartState::Running; }

    // --- Demand ---
    // A watched part is recomputed after every change of its inputs; an unwatched one waits for
    // request(). Watching an out-of-date part requests it.
    void setWatched(Part part, bool watched);
    bool isWatched(Part part) const { return m_watched[index(part)]; }
    // Computes the part unless it is current or already running (inline or in the background,
    // as the part and model need).
    void request(Part part);
    // Computes the part now on this thread, whatever the model (tests, the screenshot mode).
    void computeNow(Part part);
    // Stops the part's job; its previous figures stay, marked out of date.
    void cancel(Part part);
    // The coalescing delay after an input change, in milliseconds (0 for all but the backtest: 150).
    void setDelay(Part part, int milliseconds) { m_timers[index(part)].setInterval(milliseconds); }

    // --- The parts' figures (each valid as its status says) ---
    const std::optional<tailwise::RiskReport> &report() const { return m_report; }
    const std::optional<tailwise::Error> &headlineError() const { return m_headlineError; }
    const std::vector<tailwise::RiskReport> &overlays() const { return m_overlays; }
    const std::optional<tailwise::Result<std::vector<tailwise::ModelRow>>> &comparison() const { return m_comparison; }
    // The portfolio value the comparison's rows are shares of.
    double comparisonValue() const { return m_comparisonValue; }
    const BacktestRun &backtest() const { return m_backtest; }
    const std::optional<tailwise::Result<std::vector<tailwise::StressOutcome>>> &stress() const { return m_stress; }
    const std::optional<tailwise::Result<tailwise::WhatIf>> &whatIf() const { return m_whatIf; }
    const GridRun &grid() const { return m_grid; }

    // The grid's columns (the grid part's own input, set by its view: charts/tradeoffchartdata.h's
    // tradeoffGridConfidences). A change marks the grid out of date.
    const std::vector<double> &gridConfidences() const { return m_gridConfidences; }
    void setGridConfidences(std::vector<double> confidences);

    // The what-if proposal (the what-if part's own input; not part of the workbook).
    const std::vector<tailwise::Trade> &whatIfTrades() const { return m_trades; }
    void setWhatIfTrades(std::vector<tailwise::Trade> trades);

    JobRunner &runner() { return m_runner; }

signals:
    void statusChanged(tailwise::ui::Part part);
    void progress(tailwise::ui::Part part, double fraction);
    // The figures of one part changed (a new result, or cleared).
    void headlineChanged();
    void overlaysChanged();
    void comparisonChanged();
    void backtestChanged();
    void stressChanged();
    void whatIfChanged();
    void gridChanged();
    // The headline runs in the background (Monte Carlo) or stopped doing so.
    void headlineRunning(bool running);

private:
    static std::size_t index(Part part) { return static_cast<std::size_t>(part); }
    void inputsChanged(std::initializer_list<Part> parts);
    void markOutOfDate(Part part);
    void start(Part part, bool inlineAlways);
    void setStatus(Part part, PartState state, const QString &message = {});
    void emitChanged(Part part);
    bool hasData() const;
    QString noDataMessage(const char *withoutPrices, const char *withoutHoldings) const;

    void startHeadline(bool inlineAlways);
    void startOverlays(bool inlineAlways);
    void startComparison(bool inlineAlways);
    void startBacktest(bool inlineAlways);
    void runBacktestModel(std::size_t i, quint64 generation, bool inlineAlways);
    void startStress(bool inlineAlways);
    void startWhatIf(bool inlineAlways);
    void startGrid(bool inlineAlways);
    void headlineSettled();
    void backtestSettingsChanged();

    Workbook &m_workbook;
    JobRunner m_runner;
    std::array<PartStatus, partCount> m_status{};
    std::array<quint64, partCount> m_inputs{};
    std::array<bool, partCount> m_watched{};
    std::array<QTimer, partCount> m_timers;

    // Inline headlines reuse the window and covariance while only quantities, confidence, horizon
    // or the model change (core's estimatecache.h); the revision counts price histories.
    tailwise::EstimateCache m_estimates;
    std::uint64_t m_pricesRevision = 1;

    std::optional<tailwise::RiskReport> m_report;
    std::optional<tailwise::Error> m_headlineError;
    std::vector<tailwise::RiskReport> m_overlays;
    std::optional<tailwise::Result<std::vector<tailwise::ModelRow>>> m_comparison;
    double m_comparisonValue = 0.0;
    BacktestRun m_backtest;         // shown: the running generation's, or the last complete one
    BacktestRun m_backtestComplete; // the last run with every model done (what a cancel falls back to)
    std::optional<tailwise::Result<std::vector<tailwise::StressOutcome>>> m_stress;
    std::vector<tailwise::Trade> m_trades;
    std::optional<tailwise::Result<tailwise::WhatIf>> m_whatIf;
    std::vector<double> m_gridConfidences;
    GridRun m_grid;
    bool m_gridAwaitsHeadline = false; // the grid is wanted and starts once the headline is current
};

} // namespace tailwise::ui

Q_DECLARE_METATYPE(tailwise::ui::Part)

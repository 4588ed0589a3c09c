// BacktestRunner: runs the workbook's backtest (core: runBacktest, backtest.h) in the background
// and keeps the latest results for the backtest view.
//
// The backtest is heavy (one VaR forecast per tested day, per model), so it never runs on the GUI
// thread except through runNow() (tests, the screenshot mode). Any change of the inputs
// (Workbook::inputsChanged) or of the backtest settings (Workbook::backtestSettingsChanged)
// starts a new generation: the running job is asked to stop through its std::stop_token, the
// shown results are cleared, and after a short coalescing delay a new job copies the inputs and
// runs the settings' models one after another on the runner's own one-thread pool. Each model's
// result is posted back as it is done, tagged with its generation; one from an older generation
// is dropped, so a stale figure is never shown. Progress reaches the GUI thread as progress()
// signals, at most one per percent.
//
// The method is the workbook's assumptions (confidence, returns, estimator, λ, mean, ν) with the
// settings' window W and model, at a horizon of one day (a backtest of one-day VaR).
#pragma once

#include "document/workbookcontents.h"

#include "tailwise/backtest.h"
#include "tailwise/result.h"

#include <QObject>
#include <QThreadPool>
#include <QTimer>

#include <memory>
#include <optional>
#include <stop_token>
#include <vector>

namespace tailwise::ui {

class Workbook;

// One model's part of a run: its result once done (unset while it is still running).
struct BacktestModelRun {
    tailwise::RiskModel model = tailwise::RiskModel::Normal;
    std::optional<tailwise::Result<tailwise::BacktestResult>> result;
};

// What the runner holds for the current generation.
struct BacktestRun {
    quint64 generation = 0;
    BacktestSettings settings;
    std::vector<BacktestModelRun> models;  // in the settings' order; models[0] is the one drawn
    std::optional<tailwise::Error> problem; // refused before any model ran (no prices, no holdings)
};

class BacktestRunner : public QObject {
    Q_OBJECT
public:
    enum class State {
        Idle,      // nothing to run yet
        Running,   // a job is scheduled or running for the current generation
        Finished,  // every model of the current generation has its result (or the run was refused)
        Cancelled, // stopped by cancel(); start() runs it again
    };
    Q_ENUM(State)

    explicit BacktestRunner(Workbook &workbook, QObject *parent = nullptr);
    ~BacktestRunner() override; // stops a running job and waits for it (it checks its token daily)

    const BacktestRun &run() const { return m_run; }
    State state() const { return m_state; }
    quint64 generation() const { return m_generation; }
    double progressFraction() const { return m_progress; }

    // The request a model's backtest gets from the workbook (the assumptions with W, the model
    // and a one-day horizon).
    static tailwise::BacktestRequest requestFor(const Workbook &workbook, const BacktestSettings &settings,
                                                tailwise::RiskModel model);

    // Starts the current inputs' backtest in the background now (also "run again" after cancel).
    void start();
    // Runs it on the calling thread and returns when every model is done (tests, screenshot).
    void runNow();
    // Stops the running job; its results are discarded and the state becomes Cancelled.
    void cancel();
    // The coalescing delay after an input change, in milliseconds (default 150).
    void setDelay(int milliseconds) { m_timer.setInterval(milliseconds); }

signals:
    void stateChanged(tailwise::ui::BacktestRunner::State state);
    void progress(double fraction);      // 0…1 over all models of the job
    void resultsChanged();               // run() changed: cleared, or one more model's result

private:
    void inputsChanged();
    void settingsChanged();
    void newGeneration();
    void setState(State state);
    bool refuseIfNoData();
    void accept(quint64 generation, std::size_t index, tailwise::Result<tailwise::BacktestResult> result);
    void stopJob();

    Workbook &m_workbook;
    QTimer m_timer;
    QThreadPool m_pool;
    std::shared_ptr<std::stop_source> m_stop; // of the running job, if any
    BacktestRun m_run;
    State m_state = State::Idle;
    quint64 m_generation = 0;
    double m_progress = 0.0;
};

} // namespace tailwise::ui

#include "document/backtestrunner.h"

#include "document/backtestrequest.h"
#include "document/workbook.h"

#include <QPointer>

#include <algorithm>
#include <atomic>
#include <cmath>

namespace tailwise::ui {

BacktestRunner::BacktestRunner(Workbook &workbook, QObject *parent) : QObject(parent), m_workbook(workbook)
{
    // One job at a time: a stopped job ends within a day's work, and the next waits for it.
    m_pool.setMaxThreadCount(1);
    m_timer.setSingleShot(true);
    m_timer.setInterval(150);
    connect(&m_timer, &QTimer::timeout, this, &BacktestRunner::start);
    connect(&m_workbook, &Workbook::inputsChanged, this, &BacktestRunner::inputsChanged);
    connect(&m_workbook, &Workbook::backtestSettingsChanged, this, &BacktestRunner::settingsChanged);
    newGeneration();
    m_timer.start();
}

BacktestRunner::~BacktestRunner()
{
    stopJob();
    m_pool.waitForDone();
}

BacktestRequest BacktestRunner::requestFor(const Workbook &workbook, const BacktestSettings &settings, RiskModel model)
{
    return backtestRequestFor(workbook.contents(), settings, model);
}

void BacktestRunner::inputsChanged()
{
    newGeneration();
    m_timer.start();
}

void BacktestRunner::settingsChanged()
{
    const BacktestSettings s = m_workbook.backtestSettings();
    if (s.window == m_run.settings.window && s.models == m_run.settings.models) {
        // Only the test size changed: the same results, read at the new size.
        m_run.settings = s;
        emit resultsChanged();
        return;
    }
    inputsChanged();
}

void BacktestRunner::stopJob()
{
    if (m_stop)
        m_stop->request_stop();
    m_stop.reset();
}

void BacktestRunner::newGeneration()
{
    stopJob();
    ++m_generation;
    m_run = BacktestRun{};
    m_run.generation = m_generation;
    m_run.settings = m_workbook.backtestSettings();
    for (const RiskModel m : m_run.settings.models)
        m_run.models.push_back(BacktestModelRun{m, std::nullopt});
    m_progress = 0.0;
    emit resultsChanged();
    setState(m_workbook.hasPrices() ? State::Running : State::Idle);
}

void BacktestRunner::setState(State state)
{
    if (state == m_state)
        return;
    m_state = state;
    emit stateChanged(state);
}

bool BacktestRunner::refuseIfNoData()
{
    if (m_workbook.hasPrices() && !m_workbook.holdings().empty() && !m_run.models.empty())
        return false;
    m_run.problem = fieldError(ErrorKind::InsufficientData, "holdings",
                               m_workbook.hasPrices() ? "add a holding to backtest it"
                                                      : "import a price history to backtest the holdings");
    emit resultsChanged();
    setState(m_workbook.hasPrices() ? State::Finished : State::Idle);
    return true;
}

void BacktestRunner::accept(quint64 generation, std::size_t index, Result<BacktestResult> result)
{
    if (generation != m_generation || index >= m_run.models.size())
        return; // computed from inputs or settings that have changed since: never shown
    m_run.models[index].result = std::move(result);
    emit resultsChanged();
    const bool done = std::all_of(m_run.models.begin(), m_run.models.end(),
                                  [](const BacktestModelRun &m) { return m.result.has_value(); });
    if (done) {
        m_stop.reset();
        m_progress = 1.0;
        setState(State::Finished);
    }
}

void BacktestRunner::runNow()
{
    m_timer.stop();
    if (m_state == State::Finished || m_state == State::Cancelled || m_stop)
        newGeneration(); // a fresh generation: whatever a background job still posts is dropped
    if (refuseIfNoData())
        return;
    const quint64 generation = m_generation;
    for (std::size_t i = 0; i < m_run.models.size(); ++i)
        accept(generation, i, runBacktest(requestFor(m_workbook, m_run.settings, m_run.models[i].model)));
}

void BacktestRunner::start()
{
    m_timer.stop();
    if (m_state == State::Finished || m_state == State::Cancelled || m_stop)
        newGeneration();
    if (refuseIfNoData())
        return;
    setState(State::Running);

    // Copies: the worker never touches the workbook. One request, its model changed per run.
    auto request = std::make_shared<BacktestRequest>(requestFor(m_workbook, m_run.settings, m_run.models.front().model));
    std::vector<RiskModel> models;
    for (const auto &m : m_run.models)
        models.push_back(m.model);
    const quint64 generation = m_generation;
    auto stop = std::make_shared<std::stop_source>();
    m_stop = stop;
    QPointer<BacktestRunner> self(this);

    m_pool.start([=]() {
        const double n = static_cast<double>(models.size());
        auto lastPercent = std::make_shared<std::atomic<int>>(-1);
        for (std::size_t i = 0; i < models.size(); ++i) {
            if (stop->stop_requested())
                return;
            request->assumptions.model = models[i];
            RunControl control;
            control.stop = stop->get_token();
            control.progress = [=](double fraction) {
                const double overall = (static_cast<double>(i) + std::clamp(fraction, 0.0, 1.0)) / n;
                const int percent = static_cast<int>(std::floor(overall * 100.0));
                if (percent <= lastPercent->load())
                    return;
                lastPercent->store(percent);
                // The runner outlives the job (its destructor waits), so it is a safe context.
                QMetaObject::invokeMethod(
                    self.data(),
                    [=]() {
                        if (self && !stop->stop_requested() && self->m_generation == generation) {
                            self->m_progress = percent / 100.0;
                            emit self->progress(self->m_progress);
                        }
                    },
                    Qt::QueuedConnection);
            };
            auto result = std::make_shared<Result<BacktestResult>>(runBacktest(*request, control));
            if (stop->stop_requested())
                return; // inputs changed, cancelled or closing: nobody wants this result
            QMetaObject::invokeMethod(
                self.data(),
                [=]() {
                    if (self && !stop->stop_requested())
                        self->accept(generation, i, std::move(*result));
                },
                Qt::QueuedConnection);
        }
    });
}

void BacktestRunner::cancel()
{
    if (m_state != State::Running)
        return;
    m_timer.stop();
    stopJob();
    // Keep the generation's settings but none of its partial results: a cancelled run shows nothing.
    ++m_generation;
    m_run.generation = m_generation;
    for (auto &m : m_run.models)
        m.result.reset();
    m_progress = 0.0;
    emit resultsChanged();
    setState(State::Cancelled);
}

} // namespace tailwise::ui

#include "recomputescheduler.h"

#include "workbook.h"

#include "tailwise/risk.h"

#include <QCoreApplication>
#include <QPointer>
#include <QThreadPool>

#include <algorithm>
#include <atomic>
#include <cmath>

namespace tailwise::ui {

namespace {

// Closed-form and historical models are cheap enough to run on the GUI thread within a frame;
// simulation is not.
bool runsInBackground(const Assumptions &assumptions)
{
    return toName(assumptions.model) == "monte-carlo";
}

} // namespace

RecomputeScheduler::RecomputeScheduler(Workbook &workbook, QObject *parent) : QObject(parent), m_workbook(workbook)
{
    m_timer.setSingleShot(true);
    m_timer.setInterval(0);
    connect(&m_timer, &QTimer::timeout, this, &RecomputeScheduler::run);
    connect(&m_workbook, &Workbook::inputsChanged, this, &RecomputeScheduler::schedule);
    // A new price history invalidates the cached estimate (see m_estimates).
    connect(&m_workbook, &Workbook::pricesChanged, this, [this] { ++m_pricesRevision; });
    connect(&m_workbook, &Workbook::contentsReset, this, [this] { ++m_pricesRevision; });
}

RecomputeScheduler::~RecomputeScheduler()
{
    cancel();
}

void RecomputeScheduler::schedule()
{
    cancel();
    m_timer.start();
}

void RecomputeScheduler::cancel()
{
    if (m_stop)
        m_stop->request_stop();
    m_stop.reset();
}

void RecomputeScheduler::computeNow()
{
    m_timer.stop();
    cancel();
    if (!m_workbook.hasPrices() || m_workbook.holdings().empty()) {
        m_workbook.publishResult(m_workbook.inputGeneration(),
                                 fieldError(ErrorKind::InsufficientData, "holdings",
                                            m_workbook.hasPrices() ? "add a holding to see its risk"
                                                                   : "import a price history to start"));
        return;
    }
    m_workbook.publishResult(m_workbook.inputGeneration(),
                             computeRisk(m_workbook.prices(), m_workbook.holdings(), m_workbook.assumptions(),
                                         RunControl{}, m_estimates, m_pricesRevision));
    m_workbook.setComputing(false);
}

void RecomputeScheduler::run()
{
    if (!runsInBackground(m_workbook.assumptions()) || !m_workbook.hasPrices() || m_workbook.holdings().empty()) {
        computeNow();
        return;
    }
    // Copies: the worker never touches the workbook.
    const quint64 generation = m_workbook.inputGeneration();
    auto prices = std::make_shared<PriceHistory>(m_workbook.prices());
    auto holdings = std::make_shared<Holdings>(m_workbook.holdings());
    const Assumptions assumptions = m_workbook.assumptions();
    auto stop = std::make_shared<std::stop_source>();
    m_stop = stop;
    m_workbook.setComputing(true);
    QPointer<Workbook> target(&m_workbook);
    QPointer<RecomputeScheduler> self(this);
    QThreadPool::globalInstance()->start([=]() {
        RunControl control;
        control.stop = stop->get_token();
        // Whole percents only: one queued signal per step at most.
        auto lastPercent = std::make_shared<std::atomic<int>>(-1);
        control.progress = [=](double fraction) {
            const int percent = static_cast<int>(std::floor(std::clamp(fraction, 0.0, 1.0) * 100.0));
            if (percent <= lastPercent->load())
                return;
            lastPercent->store(percent);
            QMetaObject::invokeMethod(
                QCoreApplication::instance(), // outlives the job; `self` is checked on arrival
                [=]() {
                    if (self && !stop->stop_requested())
                        emit self->progress(percent / 100.0);
                },
                Qt::QueuedConnection);
        };
        auto result = std::make_shared<Result<RiskReport>>(computeRisk(*prices, *holdings, assumptions, control));
        if (stop->stop_requested())
            return; // inputs changed or the window closed: nobody wants this result
        QMetaObject::invokeMethod(
            target.data(),
            [=]() {
                if (!target || stop->stop_requested())
                    return;
                if (self && self->m_stop == stop)
                    self->m_stop.reset();
                target->publishResult(generation, std::move(*result));
                target->setComputing(false);
            },
            Qt::QueuedConnection);
    });
}

} // namespace tailwise::ui

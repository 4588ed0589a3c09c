#include "document/jobrunner.h"

#include <QMetaObject>
#include <QPointer>

#include <algorithm>
#include <atomic>
#include <cmath>

namespace tailwise::ui {

JobRunner::JobRunner(QObject *parent) : QObject(parent)
{
    // Every part can run at once; Monte Carlo inside a job spreads over the cores itself.
    m_pool.setMaxThreadCount(std::max(2, QThread::idealThreadCount()));
}

JobRunner::~JobRunner()
{
    stopAll();
    m_pool.waitForDone();
}

void JobRunner::stop(int key)
{
    const auto it = m_jobs.find(key);
    if (it == m_jobs.end())
        return;
    it->second->request_stop();
    m_jobs.erase(it);
}

void JobRunner::stopAll()
{
    for (auto &[key, stop] : m_jobs)
        stop->request_stop();
    m_jobs.clear();
}

void JobRunner::waitForDone()
{
    m_pool.waitForDone();
}

void JobRunner::launch(int key, Where where, Work work, std::function<void(double)> progress)
{
    stop(key);
    if (where == Where::Inline) {
        work(tailwise::RunControl{})();
        return;
    }
    auto stop = std::make_shared<std::stop_source>();
    m_jobs[key] = stop;
    QPointer<JobRunner> self(this);
    // Still the key's current job (not stopped, not superseded): checked on this thread only.
    auto current = [self, key, stop]() {
        if (!self || stop->stop_requested())
            return false;
        const auto it = self->m_jobs.find(key);
        return it != self->m_jobs.end() && it->second == stop;
    };
    m_pool.start([this, key, stop, current, work = std::move(work), progress = std::move(progress)]() {
        tailwise::RunControl control;
        control.stop = stop->get_token();
        if (progress) {
            auto last = std::make_shared<std::atomic<int>>(-1);
            control.progress = [this, stop, last, current, progress](double fraction) {
                const int percent = static_cast<int>(std::floor(std::clamp(fraction, 0.0, 1.0) * 100.0));
                if (percent <= last->load() || stop->stop_requested())
                    return;
                last->store(percent);
                // The runner outlives its jobs (its destructor waits), so it is a safe context.
                QMetaObject::invokeMethod(
                    this,
                    [current, progress, percent]() {
                        if (current())
                            progress(percent / 100.0);
                    },
                    Qt::QueuedConnection);
            };
        }
        auto deliver = work(control);
        if (stop->stop_requested())
            return; // stopped or superseded: nobody wants this result
        QMetaObject::invokeMethod(
            this,
            [this, key, current, deliver = std::move(deliver)]() {
                if (!current())
                    return;
                m_jobs.erase(key);
                deliver();
            },
            Qt::QueuedConnection);
    });
}

} // namespace tailwise::ui

// BackgroundRun: one long core computation at a time, off the GUI thread, for a panel.
//
// start() cancels the previous run (through core's RunControl stop token) and runs `work` on the
// global thread pool; its result comes back on the GUI thread to `done`, unless the run was
// cancelled or superseded meanwhile (a stale result is never shown). Progress arrives as whole
// percents through `progress`. Plain value in, plain value out: `work` must not touch widgets or
// the workbook (copy what it needs into the lambda).
#pragma once

#include "tailwise/result.h"
#include "tailwise/runcontrol.h"

#include <QCoreApplication>
#include <QMetaObject>
#include <QObject>
#include <QPointer>
#include <QThreadPool>

#include <algorithm>
#include <atomic>
#include <cmath>
#include <functional>
#include <memory>
#include <stop_token>

namespace tailwise::ui {

class BackgroundRun : public QObject {
    Q_OBJECT
public:
    explicit BackgroundRun(QObject *parent = nullptr) : QObject(parent) {}
    ~BackgroundRun() override { cancel(); }

    template <class T>
    void start(std::function<Result<T>(const RunControl &)> work, std::function<void(Result<T>)> done)
    {
        cancel();
        auto stop = std::make_shared<std::stop_source>();
        m_stop = stop;
        QPointer<BackgroundRun> self(this);
        emit runningChanged(true);
        QThreadPool::globalInstance()->start([self, stop, work = std::move(work), done = std::move(done)]() {
            RunControl control;
            control.stop = stop->get_token();
            auto last = std::make_shared<std::atomic<int>>(-1);
            // Replies go through the application object, which outlives this run, and check `self`
            // there: the panel may be gone by the time they arrive.
            QObject *app = QCoreApplication::instance();
            control.progress = [app, stop, last, self](double fraction) {
                const int percent = static_cast<int>(std::floor(std::clamp(fraction, 0.0, 1.0) * 100.0));
                if (percent <= last->load())
                    return;
                last->store(percent);
                QMetaObject::invokeMethod(
                    app,
                    [self, stop, percent]() {
                        if (self && !stop->stop_requested())
                            emit self->progress(percent / 100.0);
                    },
                    Qt::QueuedConnection);
            };
            auto result = std::make_shared<Result<T>>(work(control));
            if (stop->stop_requested())
                return;
            QMetaObject::invokeMethod(
                app,
                [self, stop, result, done]() {
                    if (!self || stop->stop_requested())
                        return;
                    self->m_stop.reset();
                    emit self->runningChanged(false);
                    done(std::move(*result));
                },
                Qt::QueuedConnection);
        });
    }

    // Stops the running computation, if any; its result is dropped.
    void cancel()
    {
        if (!m_stop)
            return;
        m_stop->request_stop();
        m_stop.reset();
        emit runningChanged(false);
    }
    bool isRunning() const { return m_stop != nullptr; }

signals:
    void progress(double fraction);
    void runningChanged(bool running);

private:
    std::shared_ptr<std::stop_source> m_stop;
};

} // namespace tailwise::ui

// RecomputeScheduler: turns workbook input changes into results.
//
// Input signals are coalesced by a zero-delay single-shot timer (a burst of edits in one event
// loop turn costs one computation). The inputs are copied into a plain core request and run:
// inline when the model is cheap (closed-form models take well under a frame), on a worker thread
// otherwise, with the workbook's input generation attached so that a result computed from
// outdated inputs is dropped. A background job gets core's RunControl (runcontrol.h): its stop
// token is triggered when inputs change again or cancel() is called, and its progress reaches the
// GUI thread as progress() signals (at most one per percent, so the event queue never floods).
#pragma once

#include "tailwise/estimatecache.h"

#include <QObject>
#include <QTimer>

#include <cstdint>
#include <memory>
#include <stop_token>

namespace tailwise::ui {

class Workbook;

class RecomputeScheduler : public QObject {
    Q_OBJECT
public:
    explicit RecomputeScheduler(Workbook &workbook, QObject *parent = nullptr);
    ~RecomputeScheduler() override;

    // Computes now, inline, whatever the model (for tests and the screenshot mode).
    void computeNow();
    // Asks a running background computation to stop; its result is discarded.
    void cancel();
    // True while a background job runs (its result not yet published or dropped).
    bool isRunningInBackground() const { return m_stop != nullptr; }

signals:
    void progress(double fraction); // 0…1, background jobs only

private:
    void schedule();
    void run();

    Workbook &m_workbook;
    QTimer m_timer;
    // Inline computations reuse the window and covariance while only quantities, confidence,
    // horizon or the model change (core's estimatecache.h); the revision counts price histories.
    tailwise::EstimateCache m_estimates;
    std::uint64_t m_pricesRevision = 1;
    std::shared_ptr<std::stop_source> m_stop; // of the running background job, if any
};

} // namespace tailwise::ui

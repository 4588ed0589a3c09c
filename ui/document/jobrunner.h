// JobRunner: the window's one way to run a computation.
//
// A job is a plain function of inputs copied into it (core types only: it never touches the
// workbook or a widget) that takes core's RunControl (runcontrol.h) and returns a Result. Jobs are
// keyed (one key per result part, results.h): starting a job under a key stops the one running
// under it. The runner decides nothing about what to compute; it owns the mechanics:
//   - where: Inline runs the job on the calling thread and delivers at once (cheap parts);
//     Background runs it on the runner's own thread pool;
//   - stop: each job has its own std::stop_source; stop(key), a newer job under the same key and
//     the runner's destruction request it, and a stopped job's result is never delivered;
//   - progress: whole percents only (at most 101 queued calls a job), delivered on the GUI thread;
//   - the hop back: `done` runs on the runner's thread (the GUI thread), and only when the job is
//     still the current one of its key (a superseded job's result is dropped there, not later).
// The runner's destructor stops every job and waits for them (core checks its stop token often).
#pragma once

#include "tailwise/result.h"
#include "tailwise/runcontrol.h"

#include <QObject>
#include <QThreadPool>

#include <functional>
#include <map>
#include <memory>
#include <stop_token>

namespace tailwise::ui {

class JobRunner : public QObject {
    Q_OBJECT
public:
    enum class Where { Inline, Background };

    explicit JobRunner(QObject *parent = nullptr);
    ~JobRunner() override;

    // Runs `work` under `key` (stopping the key's previous job). `done` gets the result on this
    // object's thread unless the job was stopped or superseded; `progress` gets 0…1 (whole
    // percents) while it runs, in the background only.
    template <class T>
    void start(int key, Where where, std::function<tailwise::Result<T>(const tailwise::RunControl &)> work,
               std::function<void(tailwise::Result<T>)> done, std::function<void(double)> progress = {})
    {
        launch(
            key, where,
            [work = std::move(work), done = std::move(done)](const tailwise::RunControl &control) -> std::function<void()> {
                auto result = std::make_shared<tailwise::Result<T>>(work(control));
                return [done, result]() { done(std::move(*result)); };
            },
            std::move(progress));
    }

    // Stops the job under `key`, if any; its result is dropped.
    void stop(int key);
    void stopAll();
    bool isRunning(int key) const { return m_jobs.count(key) != 0; }
    // Waits until no background job runs (tests; the destructor).
    void waitForDone();

private:
    // `work` runs on a pool thread (or inline) and returns what to do on this thread.
    using Work = std::function<std::function<void()>(const tailwise::RunControl &)>;
    void launch(int key, Where where, Work work, std::function<void(double)> progress);

    QThreadPool m_pool;
    std::map<int, std::shared_ptr<std::stop_source>> m_jobs; // the current job of each key
};

} // namespace tailwise::ui

#pragma once

#include <atomic>
#include <chrono>
#include <condition_variable>
#include <exception>
#include <mutex>
#include <optional>
#include <thread>
#include <type_traits>
#include <utility>

#include <pybind11/pybind11.h>

#include "progress.hpp"

namespace ds::python {

/// The core's Progress for a call from Python: nobody watches it, and it is cancelled when
/// Python receives a signal (Ctrl-C) during the call.
class CallProgress final : public Progress {
public:
    void report(double) override {}
    bool cancelled() const override { return cancelled_.load(std::memory_order_relaxed); }
    void cancel() { cancelled_ = true; }

private:
    std::atomic<bool> cancelled_{false};
};

/// How often a long call looks at Python's signals: Ctrl-C stops it within about this, plus
/// the case in flight (parallel_for stops between cases).
inline constexpr std::chrono::milliseconds signal_poll_period{100};

/// Runs work(progress) on a thread of its own with the GIL released, so other Python threads
/// run meanwhile. The calling thread waits, and looks at Python's signals every
/// signal_poll_period: on one whose handler raises (Ctrl-C's KeyboardInterrupt) it sets the
/// progress's cancel flag, waits for the work to stop and raises that exception. The work's
/// own exception is raised in the caller.
template <class Work>
auto run_interruptible(Work&& work) -> std::invoke_result_t<Work&, Progress&> {
    using Result = std::invoke_result_t<Work&, Progress&>;
    CallProgress progress;
    std::optional<Result> result;
    std::exception_ptr failure;
    std::mutex mutex;
    std::condition_variable finished;
    bool done = false;
    bool interrupted = false;
    {
        pybind11::gil_scoped_release release;
        std::thread worker([&] {
            try {
                result.emplace(work(progress));
            } catch (...) {
                failure = std::current_exception();
            }
            const std::lock_guard lock(mutex);
            done = true;
            finished.notify_one();
        });
        for (;;) {
            std::unique_lock lock(mutex);
            if (finished.wait_for(lock, signal_poll_period, [&] { return done; }))
                break;
            lock.unlock();
            if (interrupted)
                continue;  // the work was told to stop: wait for it
            const pybind11::gil_scoped_acquire acquire;
            if (PyErr_CheckSignals() != 0) {
                interrupted = true;
                progress.cancel();
            }
        }
        worker.join();
    }
    if (interrupted)
        throw pybind11::error_already_set();
    if (failure)
        std::rethrow_exception(failure);
    return std::move(*result);
}

}  // namespace ds::python

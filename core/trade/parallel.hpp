#pragma once

#include <algorithm>
#include <atomic>
#include <cstddef>
#include <exception>
#include <mutex>
#include <thread>
#include <vector>

#include "progress.hpp"

namespace ds {

/// Runs work(i) for every i in [0, count) on `threads` threads (0: one per core), each case
/// independent of which thread runs it, so results are the same for any thread count. Stops
/// handing out cases once progress says cancelled; returns whether every case ran. An exception
/// that a case throws stops the handing out and is thrown again in the caller once the pool has
/// finished (the first one thrown), never on a worker thread, where it would end the program.
template <class Work>
bool parallel_for(std::size_t count, unsigned threads, Progress* progress, Work&& work) {
    if (threads == 0)
        threads = std::max(1u, std::thread::hardware_concurrency());
    threads =
        static_cast<unsigned>(std::min<std::size_t>(threads, std::max<std::size_t>(count, 1)));
    std::atomic<std::size_t> next{0};
    std::atomic<std::size_t> done{0};
    std::atomic<bool> stopped{false};
    std::atomic<bool> failed{false};
    std::exception_ptr first_failure;
    std::mutex failure_mutex;
    const auto run = [&] {
        for (;;) {
            if (progress && progress->cancelled()) {
                stopped = true;
                return;
            }
            if (failed)
                return;
            const std::size_t i = next.fetch_add(1);
            if (i >= count)
                return;
            try {
                work(i);
            } catch (...) {
                const std::lock_guard<std::mutex> lock(failure_mutex);
                if (!first_failure)
                    first_failure = std::current_exception();
                failed = true;
                return;
            }
            const std::size_t finished = done.fetch_add(1) + 1;
            if (progress)
                progress->report(static_cast<double>(finished) / static_cast<double>(count));
        }
    };
    // Every case runs on a thread of the pool, the caller only waits: the caller's allocator
    // arena (the main one, for a program's main thread) was measured 25 % slower on the
    // flights' allocations than a thread's own, which made one thread look slower than it is.
    std::vector<std::thread> pool;
    for (unsigned t = 0; t < threads; ++t)
        pool.emplace_back(run);
    for (std::thread& thread : pool)
        thread.join();
    if (first_failure)
        std::rethrow_exception(first_failure);
    return !stopped && done == count;
}

}  // namespace ds

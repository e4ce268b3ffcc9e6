#pragma once

// Files that are not regular files, for the tests of the readers that must refuse them: a FIFO
// (a named pipe, which blocks whoever opens it to read until a writer comes) and /dev/zero (a
// device read without end). POSIX.

#include <chrono>
#include <filesystem>
#include <functional>
#include <future>

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

namespace ds::test {

/// A FIFO at `path` (replacing what is there), removed on destruction.
class Fifo {
public:
    explicit Fifo(std::filesystem::path path) : path_(std::move(path)) {
        std::filesystem::remove(path_);
        ok_ = mkfifo(path_.c_str(), 0600) == 0;
    }
    ~Fifo() {
        release();
        std::filesystem::remove(path_);
    }
    Fifo(const Fifo&) = delete;
    Fifo& operator=(const Fifo&) = delete;

    bool ok() const { return ok_; }
    const std::filesystem::path& path() const { return path_; }

    /// Lets a reader that blocked in opening it go: a writer comes and leaves, so the reader
    /// sees the end of the file.
    void release() const {
        const int fd = ::open(path_.c_str(), O_WRONLY | O_NONBLOCK);
        if (fd >= 0)
            ::close(fd);
    }

private:
    std::filesystem::path path_;
    bool ok_ = false;
};

/// Runs `read` on another thread; whether it returned within `seconds`. A read still blocked
/// on `fifo` then is let go, so the test fails rather than hangs.
inline bool returns_within(const std::function<void()>& read, const Fifo& fifo,
                           double seconds = 10.0) {
    std::future<void> done = std::async(std::launch::async, read);
    const bool in_time =
        done.wait_for(std::chrono::duration<double>(seconds)) == std::future_status::ready;
    while (done.wait_for(std::chrono::milliseconds(50)) != std::future_status::ready)
        fifo.release();
    return in_time;
}

}  // namespace ds::test

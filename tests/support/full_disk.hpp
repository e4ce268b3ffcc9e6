#pragma once

// A disk that is full past a given size, for the tests of writes that must fail whole: while a
// FullDiskAfter lives, no file of this process may grow past `bytes` (the file-size limit,
// RLIMIT_FSIZE), so a write past it fails (EFBIG) as it would on a full disk, at the same
// calls (the write, or the flush of a buffer). The signal such a write raises (SIGXFSZ) is
// ignored, as a full disk raises none. POSIX; the limit is restored on destruction.

#include <csignal>

#include <sys/resource.h>

namespace ds::test {

class FullDiskAfter {
public:
    explicit FullDiskAfter(rlim_t bytes) {
        previous_handler_ = std::signal(SIGXFSZ, SIG_IGN);
        getrlimit(RLIMIT_FSIZE, &previous_);
        rlimit limited = previous_;
        limited.rlim_cur = bytes;
        setrlimit(RLIMIT_FSIZE, &limited);
    }
    ~FullDiskAfter() {
        setrlimit(RLIMIT_FSIZE, &previous_);
        std::signal(SIGXFSZ, previous_handler_);
    }
    FullDiskAfter(const FullDiskAfter&) = delete;
    FullDiskAfter& operator=(const FullDiskAfter&) = delete;

private:
    rlimit previous_{};
    void (*previous_handler_)(int) = nullptr;
};

}  // namespace ds::test

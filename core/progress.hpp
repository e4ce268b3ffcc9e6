#pragma once

namespace ds {

/// How long work reports and is stopped: the core calls it, a window adapts it to a progress
/// bar and a cancel button. May be called from several threads at once.
class Progress {
public:
    virtual ~Progress() = default;
    /// Fraction done, 0 to 1.
    virtual void report(double fraction) = 0;
    /// True once the user asked to stop: the work returns as soon as it can.
    virtual bool cancelled() const = 0;
};

/// Work nobody watches or stops (the command line's).
class Unwatched final : public Progress {
public:
    void report(double) override {}
    bool cancelled() const override { return false; }
};

}  // namespace ds

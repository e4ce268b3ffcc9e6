#include "model/trade_runner.hpp"

#include <atomic>

#include <QtConcurrent/QtConcurrentRun>

namespace ds {
namespace {

/// Often enough for a smooth bar, rarely enough to cost nothing.
constexpr int progressPollMs = 50;

}  // namespace

/// The progress the workers report and the cancel they read, shared so that a cancelled
/// study can finish its last cases after the runner has moved on.
class TradeRunner::SharedProgress : public Progress {
public:
    void report(double fraction) override { m_fraction.store(fraction, std::memory_order_relaxed); }
    bool cancelled() const override { return m_cancelled.load(std::memory_order_relaxed); }
    void cancel() { m_cancelled = true; }
    double fraction() const { return m_fraction.load(std::memory_order_relaxed); }

private:
    std::atomic<double> m_fraction{0.0};
    std::atomic<bool> m_cancelled{false};
};

TradeRunner::TradeRunner(QObject* parent) : QObject(parent) {
    m_poll.setInterval(progressPollMs);
    connect(&m_poll, &QTimer::timeout, this, &TradeRunner::poll);
    connect(&m_watcher, &QFutureWatcher<StudyOutcome>::finished, this, &TradeRunner::done);
}

TradeRunner::~TradeRunner() {
    if (m_progress)
        m_progress->cancel();
    m_watcher.waitForFinished();
}

void TradeRunner::start(const StudyRequest& request, const nlohmann::ordered_json& document,
                        const Design& design, const std::filesystem::path& baseDirectory) {
    cancel();
    m_progress = std::make_shared<SharedProgress>();
    m_running = true;
    // The worker owns copies of everything it reads, so the window may edit, cancel and start
    // again while it finishes.
    m_watcher.setFuture(
        QtConcurrent::run([request, document, design, baseDirectory, progress = m_progress] {
            return run_study(request, document, design, baseDirectory, 0, *progress);
        }));
    m_poll.start();
    emit progressed(0.0);
}

void TradeRunner::cancel() {
    if (!m_running)
        return;
    m_progress->cancel();
    m_running = false;
    m_poll.stop();
    emit cancelled();
}

void TradeRunner::poll() {
    if (m_running)
        emit progressed(m_progress->fraction());
}

void TradeRunner::done() {
    if (!m_running)
        return;  // a cancelled study: its results are dropped
    m_running = false;
    m_poll.stop();
    m_outcome = m_watcher.result();
    emit progressed(1.0);
    emit finished();
}

}  // namespace ds

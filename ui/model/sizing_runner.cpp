#include "model/sizing_runner.hpp"

#include <QtConcurrent/QtConcurrentRun>

#include "sizing/size.hpp"

namespace ds {
namespace {

/// Long enough to fold a burst of edits (an undo of several, a pasted table) into one sizing,
/// short enough to feel live; fields commit on Enter, not on each keystroke (our choice).
constexpr int default_debounce_ms = 10;

}  // namespace

SizingRunner::SizingRunner(QObject* parent) : QObject(parent) {
    m_debounce.setSingleShot(true);
    m_debounce.setInterval(default_debounce_ms);
    m_clock.start();
    connect(&m_debounce, &QTimer::timeout, this, &SizingRunner::startPending);
    connect(&m_watcher, &QFutureWatcher<Results>::finished, this, &SizingRunner::finished);
}

void SizingRunner::request(const Design& design) {
    const bool wasBusy = isBusy();
    m_pending = design;
    m_pendingSince = m_clock.elapsed();
    m_debounce.start();
    if (!wasBusy)
        emit busyChanged(true);
}

void SizingRunner::startPending() {
    if (!m_pending || m_watcher.isRunning())
        return;  // finished() starts it next
    m_running = std::move(m_pending);
    m_pending.reset();
    m_runningSince = m_pendingSince;
    m_watcher.setFuture(QtConcurrent::run([design = *m_running] { return size_design(design); }));
}

void SizingRunner::finished() {
    if (!m_pending) {  // the newest request: show it
        m_results = m_watcher.result();
        m_resultsDesign = std::move(m_running);
        m_lastLatencyMs = m_clock.elapsed() - m_runningSince;
        emit resultsReady();
    }
    m_running.reset();
    if (m_pending && !m_debounce.isActive())
        startPending();
    if (!isBusy())
        emit busyChanged(false);
}

}  // namespace ds

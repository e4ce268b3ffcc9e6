#include "model/sizing_runner.hpp"

#include <QtConcurrent/QtConcurrentRun>

#include "sizing/size.hpp"

namespace ds {

SizingRunner::SizingRunner(QObject* parent) : QObject(parent) {
    m_clock.start();
    connect(&m_watcher, &QFutureWatcher<Results>::finished, this, &SizingRunner::finished);
}

void SizingRunner::request(const Design& design) {
    const bool wasBusy = isBusy();
    m_pending = design;
    m_pendingSince = m_clock.elapsed();
    if (!wasBusy)
        emit busyChanged(true);
    // At once when the worker is idle; an edit that arrives while it works waits for it, and
    // only the newest of those is sized next.
    if (!m_watcher.isRunning())
        startPending();
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
    startPending();
    if (!isBusy())
        emit busyChanged(false);
}

}  // namespace ds

#pragma once

#include <optional>

#include <QElapsedTimer>
#include <QFutureWatcher>
#include <QObject>

#include "design/design.hpp"
#include "results/results.hpp"

namespace ds {

/// Sizes designs on a worker thread as the user edits: a request is sized at once when the
/// worker is idle; requests that arrive while it works fold into one, the newest, sized next
/// (results of a design that has since been edited are dropped, not shown). Typing never waits
/// for a sizing.
class SizingRunner : public QObject {
    Q_OBJECT
public:
    explicit SizingRunner(QObject* parent = nullptr);

    /// Asks for a design to be sized: now, or after the sizing under way.
    void request(const Design& design);

    bool hasResults() const { return m_results.has_value(); }
    const Results& results() const { return *m_results; }
    const Design& design() const { return *m_resultsDesign; }
    bool isBusy() const { return m_watcher.isRunning() || m_pending.has_value(); }
    /// Milliseconds from the request that produced the current results to their arrival.
    qint64 lastLatencyMs() const { return m_lastLatencyMs; }

signals:
    void resultsReady();
    void busyChanged(bool busy);

private:
    void startPending();
    void finished();

    QFutureWatcher<Results> m_watcher;
    std::optional<Design> m_pending;
    std::optional<Design> m_running;
    std::optional<Design> m_resultsDesign;
    std::optional<Results> m_results;
    QElapsedTimer m_clock;
    qint64 m_pendingSince = 0;
    qint64 m_runningSince = 0;
    qint64 m_lastLatencyMs = 0;
};

}  // namespace ds

#pragma once

#include <filesystem>
#include <memory>
#include <optional>

#include <QFutureWatcher>
#include <QObject>
#include <QString>
#include <QTimer>
#include <nlohmann/json.hpp>

#include "design/design.hpp"
#include "trade/study.hpp"

namespace ds {

/// Runs the core's trade studies (run_study) on worker threads for the window: progress is
/// polled into a signal, a cancel returns the window to the user at once (the workers stop
/// handing out cases and their results are dropped), and a new study cancels the one running.
class TradeRunner : public QObject {
    Q_OBJECT
public:
    explicit TradeRunner(QObject* parent = nullptr);
    ~TradeRunner() override;

    /// Starts a study of a design: `document` is its JSON (sweeps and sensitivities vary its
    /// keys through the strict reader), `design` the same read, and `baseDirectory` where its
    /// relative paths start.
    void start(const StudyRequest& request, const nlohmann::ordered_json& document,
               const Design& design, const std::filesystem::path& baseDirectory);
    void cancel();
    bool isRunning() const { return m_running; }

    /// The last study that finished, if any.
    const std::optional<StudyOutcome>& outcome() const { return m_outcome; }

signals:
    void progressed(double fraction);
    void finished();
    void cancelled();

private:
    class SharedProgress;
    void poll();
    void done();

    std::shared_ptr<SharedProgress> m_progress;
    QFutureWatcher<StudyOutcome> m_watcher;
    QTimer m_poll;
    bool m_running = false;
    std::optional<StudyOutcome> m_outcome;
};

}  // namespace ds

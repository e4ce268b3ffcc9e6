#pragma once

#include <cstdint>
#include <filesystem>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <QFutureWatcher>
#include <QObject>
#include <QString>
#include <QTimer>
#include <nlohmann/json.hpp>

#include "design/design.hpp"
#include "trade/dispersion.hpp"
#include "trade/sensitivity.hpp"
#include "trade/sweep.hpp"

namespace ds {

enum class TradeKind { sweep, dispersions, sensitivities };

/// A trade study the window runs: a sweep of one or two keys, the design's dispersions, or
/// the sensitivities of the key figures to every numeric input.
struct TradeRequest {
    TradeKind kind = TradeKind::sweep;
    std::vector<SweepAxis> axes;  ///< sweep: one (a line) or two (a grid)
    std::size_t runs = 1000;      ///< dispersions
    std::uint64_t seed = 1;       ///< dispersions
};

/// A finished study: what was asked, of which design, and what it gave.
struct TradeOutcome {
    TradeRequest request;
    Design design;  ///< the nominal design the study started from
    std::vector<SweepCase> sweep;
    /// Sweep: the design's own value of each varied key, to mark where the design sits.
    std::vector<std::optional<double>> nominal;
    std::optional<DispersionCampaign> campaign;
    DispersionSummary summary;
    std::optional<SensitivityTable> sensitivities;
    std::string error;  ///< why the study could not run; empty when it ran
    double seconds = 0.0;

    /// "sweep of aeroshell.diameter_m, 3 to 5 (21 cases)", for titles and the sheet.
    QString description() const;
    /// The study as CSV (trade/trade_csv.hpp): sweep rows, dispersed cases or the
    /// sensitivity matrix.
    std::string csv() const;
};

/// Runs the core's trade studies on worker threads for the window: progress is polled into a
/// signal, a cancel returns the window to the user at once (the workers stop handing out
/// cases and their results are dropped), and a new study cancels the one running.
class TradeRunner : public QObject {
    Q_OBJECT
public:
    explicit TradeRunner(QObject* parent = nullptr);
    ~TradeRunner() override;

    /// Starts a study of a design: `document` is its JSON (sweeps and sensitivities vary its
    /// keys through the strict reader), `design` the same read, and `baseDirectory` where its
    /// relative paths start.
    void start(const TradeRequest& request, const nlohmann::ordered_json& document,
               const Design& design, const std::filesystem::path& baseDirectory);
    void cancel();
    bool isRunning() const { return m_running; }

    /// The last study that finished, if any.
    const std::optional<TradeOutcome>& outcome() const { return m_outcome; }

signals:
    void progressed(double fraction);
    void finished();
    void cancelled();

private:
    class SharedProgress;
    void poll();
    void done();

    std::shared_ptr<SharedProgress> m_progress;
    QFutureWatcher<TradeOutcome> m_watcher;
    QTimer m_poll;
    bool m_running = false;
    std::optional<TradeOutcome> m_outcome;
};

}  // namespace ds

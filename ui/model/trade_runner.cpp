#include "model/trade_runner.hpp"

#include <atomic>
#include <chrono>

#include <QtConcurrent/QtConcurrentRun>

#include "trade/design_variants.hpp"
#include "trade/trade_csv.hpp"

namespace ds {
namespace {

/// Often enough for a smooth bar, rarely enough to cost nothing.
constexpr int progressPollMs = 50;

TradeOutcome runStudy(const TradeRequest& request, const nlohmann::ordered_json& document,
                      const Design& design, const std::filesystem::path& baseDirectory,
                      Progress* progress) {
    const auto start = std::chrono::steady_clock::now();
    TradeOutcome outcome;
    outcome.request = request;
    outcome.design = design;
    switch (request.kind) {
        case TradeKind::sweep: {
            const DesignVariants variants(document, baseDirectory);
            for (const SweepAxis& axis : request.axes) outcome.nominal.push_back(variants.value(axis.key));
            outcome.sweep = run_sweep(variants, request.axes, 0, progress);
            break;
        }
        case TradeKind::dispersions: {
            if (design.dispersions.empty()) {
                outcome.error = "the design declares no dispersions: add some under \"dispersions\"";
                break;
            }
            DispersionSettings settings;
            settings.runs = request.runs;
            settings.seed = request.seed;
            settings.progress = progress;
            auto [campaign, error] = run_dispersions(design, baseDirectory, settings);
            outcome.error = error;
            if (campaign) {
                outcome.summary = summarize(*campaign);
                outcome.campaign = std::move(campaign);
            }
            break;
        }
        case TradeKind::sensitivities:
            outcome.sensitivities =
                sensitivities(DesignVariants(document, baseDirectory), {}, 0, progress);
            break;
    }
    outcome.seconds =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
    return outcome;
}

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

QString TradeOutcome::description() const {
    switch (request.kind) {
        case TradeKind::sweep: {
            QStringList axes;
            for (const SweepAxis& a : request.axes) {
                axes << QStringLiteral("%1 from %2 to %3 (%4 values)")
                            .arg(QString::fromStdString(a.key))
                            .arg(a.from)
                            .arg(a.to)
                            .arg(a.count);
            }
            return QStringLiteral("Sweep of %1").arg(axes.join(QStringLiteral(" and ")));
        }
        case TradeKind::dispersions:
            return QStringLiteral("Dispersions: %1 cases from seed %2")
                .arg(request.runs)
                .arg(request.seed);
        case TradeKind::sensitivities:
            return QStringLiteral("Normalised sensitivities of the key figures");
    }
    return {};
}

std::string TradeOutcome::csv() const {
    switch (request.kind) {
        case TradeKind::sweep: return sweep_csv(request.axes, sweep);
        case TradeKind::dispersions: return campaign ? campaign_csv(*campaign) : std::string();
        case TradeKind::sensitivities:
            return sensitivities ? sensitivity_csv(*sensitivities) : std::string();
    }
    return {};
}

TradeRunner::TradeRunner(QObject* parent) : QObject(parent) {
    m_poll.setInterval(progressPollMs);
    connect(&m_poll, &QTimer::timeout, this, &TradeRunner::poll);
    connect(&m_watcher, &QFutureWatcher<TradeOutcome>::finished, this, &TradeRunner::done);
}

TradeRunner::~TradeRunner() {
    if (m_progress) m_progress->cancel();
    m_watcher.waitForFinished();
}

void TradeRunner::start(const TradeRequest& request, const nlohmann::ordered_json& document,
                        const Design& design, const std::filesystem::path& baseDirectory) {
    cancel();
    m_progress = std::make_shared<SharedProgress>();
    m_running = true;
    // The worker owns copies of everything it reads, so the window may edit, cancel and start
    // again while it finishes.
    m_watcher.setFuture(QtConcurrent::run(
        [request, document, design, baseDirectory, progress = m_progress] {
            return runStudy(request, document, design, baseDirectory, progress.get());
        }));
    m_poll.start();
    emit progressed(0.0);
}

void TradeRunner::cancel() {
    if (!m_running) return;
    m_progress->cancel();
    m_running = false;
    m_poll.stop();
    emit cancelled();
}

void TradeRunner::poll() {
    if (m_running) emit progressed(m_progress->fraction());
}

void TradeRunner::done() {
    if (!m_running) return;  // a cancelled study: its results are dropped
    m_running = false;
    m_poll.stop();
    m_outcome = m_watcher.result();
    emit progressed(1.0);
    emit finished();
}

}  // namespace ds

#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include <QStringList>
#include <QWidget>

#include "trade/optimise.hpp"
#include "trade/sweep.hpp"

QT_BEGIN_NAMESPACE
class QChart;
class QComboBox;
class QHBoxLayout;
class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;
class QSpinBox;
class QStackedWidget;
QT_END_NAMESPACE

namespace ds {

class ChartView;

class DesignDocument;
class DispersionTable;
class FeasibilityMap;
class TradeRunner;
struct StudyOutcome;

/// The trade study page: choose a sweep of one or two keys, the design's dispersions, the
/// sensitivities or the entry corridor, run it on worker threads with a progress bar and a cancel
/// that answers at once, and read it as a line plot, a feasibility map, histograms with the deploy
/// scatter, or ranked sensitivities. Studies run on the design as it is when Run is pressed; an
/// edit afterwards marks the study as out of date.
class TradeView : public QWidget {
    Q_OBJECT
public:
    explicit TradeView(DesignDocument* document, QWidget* parent = nullptr);

    TradeRunner* runner() const { return m_runner; }
    /// The study shown, when one ran and the design has not changed since (for the sheet).
    const StudyOutcome* currentOutcome() const;

    /// Set the controls as a user would, then run() (for tests and scripted use).
    void setSweep(const std::vector<SweepAxis>& axes);
    void setDispersions(std::size_t runs, std::uint64_t seed);
    void setSensitivities();
    /// The entry corridor over a list of speeds ("5000:6500:7"; empty for the design's own),
    /// with `runs` dispersed cases at its bounds and centre.
    void setCorridor(const QString& speeds, int runs);
    void setFigure(const std::string& id);
    /// An optimisation of up to four keys within their bounds, of a figure's minimum or maximum.
    void setOptimisation(const std::vector<OptimisedKey>& keys, const std::string& figure,
                         bool maximise);
    /// The key figure the plots show ("peak_deceleration").
    std::string figure() const;
    /// Starts the study the controls describe; false, with the reason shown, when it cannot.
    bool run();
    void cancel();

    /// Writes the study shown as CSV (trade/trade_csv.hpp).
    bool exportCsv(const QString& path, QString* error) const;

signals:
    /// A study finished and is shown.
    void studyShown();

private:
    struct AxisControls {
        QComboBox* key;
        QLineEdit* from;
        QLineEdit* to;
        QSpinBox* count;
        QWidget* row;
    };
    QHBoxLayout* buildControls();
    AxisControls addAxisRow(const QString& label, AxisControls* slot);
    void buildOptimisationRow();
    void applyOptimum();
    void buildDispersionRow();
    void buildCorridorRow();
    void buildPages();
    void connectControls();
    void connectRunner();
    void refreshKeys();
    void suggestRange(AxisControls& axis);
    void kindChanged();
    void documentChanged();
    void studyFinished();
    void showOutcome();
    void replaceChart(ChartView* view, QChart* chart);

    DesignDocument* m_document;
    TradeRunner* m_runner;
    QComboBox* m_kind;
    QComboBox* m_figure;
    AxisControls m_axes[2];
    QWidget* m_dispersionRow;
    QSpinBox* m_runs;
    QSpinBox* m_seed;
    DispersionTable* m_dispersions;
    QWidget* m_corridorRow;
    QLineEdit* m_speeds;
    QSpinBox* m_corridorRuns;
    QPushButton* m_run;
    QPushButton* m_cancel;
    QPushButton* m_export;
    QProgressBar* m_progress;
    QLabel* m_status;
    QStackedWidget* m_pages;
    ChartView* m_line;
    FeasibilityMap* m_map;
    QLabel* m_summary;
    ChartView* m_histogram;
    ChartView* m_scatter;
    ChartView* m_landing;  ///< the landing points and their ellipse
    ChartView* m_sensitivity;
    QLabel* m_corridorSummary;
    ChartView* m_corridor;
    /// The optimiser's keys (a row without a key is not varied), its sense and budget; its
    /// results: a summary, the convergence chart and the button that applies the optimum.
    static constexpr int optimisedRows = 4;
    QWidget* m_optimisationRow;
    AxisControls m_optimised[optimisedRows];
    QComboBox* m_sense;
    QSpinBox* m_budget;
    QSpinBox* m_starts;
    QLabel* m_optimisationSummary;
    ChartView* m_convergence;
    QPushButton* m_applyOptimum;
    QStringList m_keyNames;
    bool m_stale = false;
};

}  // namespace ds

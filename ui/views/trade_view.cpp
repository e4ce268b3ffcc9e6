#include "views/trade_view.hpp"

#include <cmath>
#include <iterator>
#include <limits>
#include <memory>

#include <QChart>
#include <QComboBox>
#include <QCoreApplication>
#include <QDoubleValidator>
#include <QFileDialog>
#include <QGridLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QLocale>
#include <QMessageBox>
#include <QProgressBar>
#include <QPushButton>
#include <QSpinBox>
#include <QStackedWidget>
#include <QVBoxLayout>

#include "design/key_path.hpp"
#include "model/atomic_file.hpp"
#include "model/design_document.hpp"
#include "model/trade_runner.hpp"
#include "results/key_figures.hpp"
#include "trade/design_variants.hpp"
#include "trade/success_probability.hpp"
#include "trade/value_list.hpp"
#include "views/chart_view.hpp"
#include "views/dispersion_table.hpp"
#include "views/export_dialog.hpp"
#include "views/trade_charts.hpp"

namespace ds {
namespace {

enum Page {
    introPage,
    linePage,
    mapPage,
    dispersionPage,
    sensitivityPage,
    corridorPage,
    optimisationPage
};
enum KindIndex {
    oneKeyIndex,
    twoKeyIndex,
    dispersionIndex,
    sensitivityIndex,
    corridorIndex,
    optimisationIndex
};

// Defaults: a line fine enough to show a trend, a grid coarse enough to run in about a second
// (225 sizings), a campaign big enough for percentiles (our choices).
constexpr int defaultLineCount = 21;
constexpr int defaultGridCount = 15;
constexpr int mostSweepValues = 201;
constexpr int defaultRuns = 1000;
/// Dispersed cases at each of the corridor's bounds and its centre (our choice: three
/// campaigns of this size take a few seconds).
constexpr int defaultCorridorRuns = 500;
constexpr int mostRuns = 1000000;
/// A key's suggested sweep: its value less and more this fraction.
constexpr double suggestedSpread = 0.2;
constexpr int progressSteps = 1000;
/// Room for about four dispersions; more scroll.
constexpr int dispersionTableHeight = 150;
/// The failing checks the summary names.
constexpr std::size_t summaryChecks = 5;

const char* const defaultFigure = "peak_deceleration";
const char* const defaultKeys[] = {"aeroshell.diameter_m", "entry.flight_path_angle_deg"};

QString text(const std::string& s) {
    return QString::fromStdString(s);
}

QString text(std::string_view s) {
    return QString::fromUtf8(s.data(), static_cast<qsizetype>(s.size()));
}

ChartView* chartView(QWidget* parent) {
    auto* view = new ChartView(new QChart, parent);
    // Three side by side (a dispersion's) still fit a window 1280 wide beside the form.
    view->setMinimumSize(240, 220);
    return view;
}

QString percentText(const std::optional<DispersedAngle>& d) {
    return d ? QStringLiteral("%1 %").arg(100.0 * d->success_probability, 0, 'f', 1)
             : QStringLiteral("–");
}

/// Each speed's bounds in words, what binds them, and the dispersed success.
QString corridorSummary(const EntryCorridor& c) {
    QStringList lines;
    for (const CorridorSpeed& row : c.speeds) {
        const QString speed = QLocale::c().toString(row.speed, 'g', 6);
        if (!row.shallow || !row.steep) {
            lines << QCoreApplication::translate("ds::TradeView", "At %1: no corridor (%2).")
                         .arg(speed, text(row.error).toHtmlEscaped());
            continue;
        }
        const auto bound = [](const CorridorBound& b) {
            return b.closed ? QStringLiteral("%1 deg (past it: %2)")
                                  .arg(b.angle_deg, 0, 'f', 2)
                                  .arg(text(b.binding_check).toHtmlEscaped())
                            : QStringLiteral("%1 deg (open: passes to the range's end)")
                                  .arg(b.angle_deg, 0, 'f', 2);
        };
        QString line =
            QCoreApplication::translate("ds::TradeView", "At %1: from %2 to %3, %4 deg wide.")
                .arg(speed, bound(*row.steep), bound(*row.shallow))
                .arg(row.width_deg(), 0, 'f', 2);
        if (row.dispersed_centre) {
            line += QCoreApplication::translate(
                        "ds::TradeView",
                        " With the dispersions (%1 cases each), success %2 at the steep bound, "
                        "%3 at the centre, %4 at the shallow bound.")
                        .arg(row.dispersed_centre->runs)
                        .arg(percentText(row.dispersed_steep), percentText(row.dispersed_centre),
                             percentText(row.dispersed_shallow));
        }
        lines << line;
    }
    if (!c.dispersion_error.empty()) {
        lines << QCoreApplication::translate("ds::TradeView",
                                             "The dispersions could not be flown: %1.")
                     .arg(text(c.dispersion_error).toHtmlEscaped());
    }
    return QCoreApplication::translate("ds::TradeView", "Angles in %1 (%2).")
               .arg(text(c.angle_key), text(c.frame)) +
           QStringLiteral("<br>") + lines.join(QStringLiteral("<br>"));
}

/// A results page of a summary in words above a chart.
struct SummaryPage {
    QWidget* page;
    QLabel* summary;
    ChartView* chart;
    QVBoxLayout* layout;
};

SummaryPage summaryPage(QWidget* parent) {
    SummaryPage p;
    p.page = new QWidget(parent);
    p.summary = new QLabel(p.page);
    p.summary->setWordWrap(true);
    p.summary->setTextInteractionFlags(Qt::TextSelectableByMouse);
    p.chart = chartView(p.page);
    p.layout = new QVBoxLayout(p.page);
    p.layout->setContentsMargins(0, 0, 0, 0);
    p.layout->addWidget(p.summary);
    p.layout->addWidget(p.chart, 1);
    return p;
}

/// What an optimisation found, in words: the figure at the design and at the optimum, each
/// key's optimum, what binds there; or that no passing design was found, and what still failed.
QString optimisationSummary(const Optimisation& o) {
    const auto value = [](const std::optional<double>& v) {
        return v ? QLocale::c().toString(*v, 'g', 6) : QStringLiteral("—");
    };
    const QString figure = text(o.settings.objective.figure);
    QStringList lines;
    if (!o.feasible) {
        lines << QCoreApplication::translate("ds::TradeView",
                                             "No design passing every check was found in %1 "
                                             "sizings; still failing at the least failing one: %2.")
                     .arg(o.sizings)
                     .arg(text(violated_words(o)));
        return lines.join(QStringLiteral("<br>"));
    }
    lines << QCoreApplication::translate("ds::TradeView",
                                         "%1: %2 at the design (%3), %4 at the optimum, which "
                                         "passes every check.")
                 .arg(figure, value(o.start_objective),
                      o.start_feasible
                          ? QCoreApplication::translate("ds::TradeView", "passes")
                          : QCoreApplication::translate("ds::TradeView", "fails a check"),
                      value(o.best_objective));
    QStringList keys;
    for (std::size_t i = 0; i < o.settings.keys.size(); ++i) {
        keys << QStringLiteral("%1 = %2 (was %3)")
                    .arg(text(o.settings.keys[i].key), value(o.best_inputs[i]),
                         value(o.start_inputs[i]));
    }
    lines << keys.join(QStringLiteral("; "));
    lines
        << QCoreApplication::translate("ds::TradeView", "Binding: %1.").arg(text(binding_words(o)));
    return lines.join(QStringLiteral("<br>"));
}

}  // namespace

TradeView::TradeView(DesignDocument* document, QWidget* parent)
    : QWidget(parent), m_document(document), m_runner(new TradeRunner(this)) {
    QHBoxLayout* controls = buildControls();
    m_axes[0] = addAxisRow(tr("Vary"), &m_axes[0]);
    m_axes[1] = addAxisRow(tr("and"), &m_axes[1]);
    buildDispersionRow();
    buildCorridorRow();
    buildOptimisationRow();
    m_status = new QLabel(this);
    m_status->setWordWrap(true);
    buildPages();

    auto* layout = new QVBoxLayout(this);
    layout->addLayout(controls);
    layout->addWidget(m_axes[0].row);
    layout->addWidget(m_axes[1].row);
    layout->addWidget(m_dispersionRow);
    layout->addWidget(m_corridorRow);
    layout->addWidget(m_optimisationRow);
    layout->addWidget(m_status);
    layout->addWidget(m_pages, 1);

    connectControls();
    connectRunner();
    connect(m_document, &DesignDocument::changed, this, &TradeView::documentChanged);
    documentChanged();
    kindChanged();
}

QHBoxLayout* TradeView::buildControls() {
    m_kind = new QComboBox(this);
    m_kind->addItems({tr("Sweep one input"), tr("Sweep two inputs (feasibility map)"),
                      tr("Dispersions (Monte Carlo)"), tr("Sensitivities"), tr("Entry corridor"),
                      tr("Optimise (every check passing)")});
    m_figure = new QComboBox(this);
    for (const KeyFigureDefinition& f : key_figure_table)
        m_figure->addItem(text(f.label), text(f.id));
    m_figure->setCurrentIndex(m_figure->findData(QString::fromLatin1(defaultFigure)));
    // Narrower than their longest texts (which their lists show whole), so that the study's
    // row fits a window 1280 wide beside the form.
    for (QComboBox* combo : {m_kind, m_figure}) {
        combo->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
        combo->setMinimumContentsLength(14);
    }
    m_run = new QPushButton(tr("&Run"), this);
    m_cancel = new QPushButton(tr("Cancel"), this);
    m_cancel->setEnabled(false);
    m_export = new QPushButton(tr("Export CSV..."), this);
    m_export->setEnabled(false);
    m_progress = new QProgressBar(this);
    m_progress->setRange(0, progressSteps);
    m_progress->setValue(0);

    auto* top = new QHBoxLayout;
    top->addWidget(new QLabel(tr("Study:"), this));
    top->addWidget(m_kind);
    top->addSpacing(12);
    top->addWidget(new QLabel(tr("Figure:"), this));
    top->addWidget(m_figure);
    top->addSpacing(12);
    top->addWidget(m_run);
    top->addWidget(m_cancel);
    top->addWidget(m_progress, 1);
    top->addWidget(m_export);
    return top;
}

void TradeView::buildDispersionRow() {
    m_dispersionRow = new QWidget(this);
    auto* dispersion = new QGridLayout(m_dispersionRow);
    dispersion->setContentsMargins(0, 0, 0, 0);
    m_runs = new QSpinBox(m_dispersionRow);
    m_runs->setRange(10, mostRuns);
    m_runs->setSingleStep(1000);
    m_runs->setValue(defaultRuns);
    m_seed = new QSpinBox(m_dispersionRow);
    m_seed->setRange(0, std::numeric_limits<int>::max());
    m_seed->setValue(1);
    m_seed->setToolTip(tr("The same seed gives the same numbers, whatever the threads"));
    m_dispersions = new DispersionTable(m_document, m_dispersionRow);
    m_dispersions->setMaximumHeight(dispersionTableHeight);
    dispersion->addWidget(new QLabel(tr("Cases"), m_dispersionRow), 0, 0);
    dispersion->addWidget(m_runs, 0, 1);
    dispersion->addWidget(new QLabel(tr("Seed"), m_dispersionRow), 1, 0);
    dispersion->addWidget(m_seed, 1, 1);
    dispersion->addWidget(m_dispersions, 0, 2, 3, 1);
    dispersion->setColumnStretch(2, 1);
    dispersion->setRowStretch(2, 1);
}

void TradeView::buildCorridorRow() {
    m_corridorRow = new QWidget(this);
    auto* row = new QHBoxLayout(m_corridorRow);
    row->setContentsMargins(0, 0, 0, 0);
    m_speeds = new QLineEdit(m_corridorRow);
    m_speeds->setObjectName(QStringLiteral("corridorSpeeds"));
    m_speeds->setPlaceholderText(tr("the design's own"));
    m_speeds->setToolTip(
        tr("Entry speeds, or arrival excess speeds for an approach: values separated by commas, "
           "or FROM:TO:N for N values"));
    m_corridorRuns = new QSpinBox(m_corridorRow);
    m_corridorRuns->setRange(0, mostRuns);
    m_corridorRuns->setSingleStep(100);
    m_corridorRuns->setValue(defaultCorridorRuns);
    m_corridorRuns->setToolTip(
        tr("With the design's dispersions: cases flown at each bound and at the centre, from "
           "the dispersion study's seed (0: none)"));
    row->addWidget(new QLabel(tr("Speeds"), m_corridorRow));
    row->addWidget(m_speeds, 1);
    row->addWidget(new QLabel(tr("Dispersed cases per angle"), m_corridorRow));
    row->addWidget(m_corridorRuns);
}

void TradeView::buildOptimisationRow() {
    m_optimisationRow = new QWidget(this);
    auto* layout = new QVBoxLayout(m_optimisationRow);
    layout->setContentsMargins(0, 0, 0, 0);
    for (int i = 0; i < optimisedRows; ++i) {
        AxisControls& row = m_optimised[i];
        row = addAxisRow(i == 0 ? tr("Vary") : tr("and"), &row);
        row.count->hide();  // the optimiser chooses its own points
        // The row's "in ... values" labels go with the count.
        auto* rowLayout = static_cast<QHBoxLayout*>(row.row->layout());
        rowLayout->itemAt(rowLayout->count() - 1)->widget()->hide();
        rowLayout->itemAt(rowLayout->count() - 3)->widget()->hide();
        row.key->setObjectName(QStringLiteral("optimisedKey%1").arg(i));
        row.key->setToolTip(
            tr("A numeric key of the design to vary within its bounds (leave "
               "empty for none)"));
        layout->addWidget(row.row);
    }
    auto* settings = new QHBoxLayout;
    m_sense = new QComboBox(m_optimisationRow);
    m_sense->addItems({tr("minimise the figure"), tr("maximise the figure")});
    m_budget = new QSpinBox(m_optimisationRow);
    m_budget->setRange(10, 100000);
    m_budget->setSingleStep(100);
    m_budget->setValue(800);
    m_budget->setToolTip(tr("The most sizings over every start"));
    m_starts = new QSpinBox(m_optimisationRow);
    m_starts->setRange(1, 64);
    m_starts->setValue(4);
    m_starts->setToolTip(tr("The design's own values, then points drawn from the seed"));
    settings->addWidget(m_sense);
    settings->addWidget(new QLabel(tr("Sizings at most"), m_optimisationRow));
    settings->addWidget(m_budget);
    settings->addWidget(new QLabel(tr("Starts"), m_optimisationRow));
    settings->addWidget(m_starts);
    settings->addStretch(1);
    layout->addLayout(settings);
}

void TradeView::buildPages() {
    m_pages = new QStackedWidget(this);
    auto* intro = new QLabel(
        tr("Choose a study and press Run. A sweep sizes the design over one or two inputs; "
           "dispersions fly the design's declared dispersions; sensitivities rank what drives "
           "each key figure; the entry corridor finds the shallowest and steepest entry angles "
           "that pass every check. Studies run on the design as it is when Run is pressed."),
        this);
    intro->setWordWrap(true);
    intro->setAlignment(Qt::AlignCenter);
    m_line = chartView(this);
    m_line->setObjectName(QStringLiteral("sweepLine"));
    m_map = new FeasibilityMap(this);
    auto* dispersionResults = new QWidget(this);
    m_summary = new QLabel(dispersionResults);
    m_summary->setWordWrap(true);
    m_summary->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_histogram = chartView(dispersionResults);
    m_scatter = chartView(dispersionResults);
    m_landing = chartView(dispersionResults);
    m_landing->setObjectName(QStringLiteral("landingEllipse"));
    auto* dispersionGrid = new QGridLayout(dispersionResults);
    dispersionGrid->setContentsMargins(0, 0, 0, 0);
    dispersionGrid->addWidget(m_summary, 0, 0, 1, 3);
    dispersionGrid->addWidget(m_histogram, 1, 0);
    dispersionGrid->addWidget(m_scatter, 1, 1);
    dispersionGrid->addWidget(m_landing, 1, 2);
    dispersionGrid->setRowStretch(1, 1);
    m_sensitivity = chartView(this);
    const SummaryPage corridorResults = summaryPage(this);
    m_corridorSummary = corridorResults.summary;
    m_corridor = corridorResults.chart;
    m_corridor->setObjectName(QStringLiteral("corridorBand"));
    m_pages->insertWidget(introPage, intro);
    m_pages->insertWidget(linePage, m_line);
    m_pages->insertWidget(mapPage, m_map);
    m_pages->insertWidget(dispersionPage, dispersionResults);
    m_pages->insertWidget(sensitivityPage, m_sensitivity);
    m_pages->insertWidget(corridorPage, corridorResults.page);

    const SummaryPage optimisationResults = summaryPage(this);
    m_optimisationSummary = optimisationResults.summary;
    m_convergence = optimisationResults.chart;
    m_convergence->setObjectName(QStringLiteral("convergence"));
    m_applyOptimum =
        new QPushButton(tr("Apply the optimum to the design"), optimisationResults.page);
    m_applyOptimum->setObjectName(QStringLiteral("applyOptimum"));
    m_applyOptimum->setToolTip(
        tr("Sets the varied keys to the optimum's values, as one edit "
           "that Undo takes back"));
    connect(m_applyOptimum, &QPushButton::clicked, this, &TradeView::applyOptimum);
    // The button beside the summary, at its top.
    optimisationResults.layout->removeWidget(m_optimisationSummary);
    auto* top = new QHBoxLayout;
    top->addWidget(m_optimisationSummary, 1);
    top->addWidget(m_applyOptimum, 0, Qt::AlignTop);
    optimisationResults.layout->insertLayout(0, top);
    m_pages->insertWidget(optimisationPage, optimisationResults.page);
}

void TradeView::connectControls() {
    connect(m_kind, &QComboBox::currentIndexChanged, this, &TradeView::kindChanged);
    connect(m_figure, &QComboBox::currentIndexChanged, this, [this] {
        if (m_runner->outcome())
            showOutcome();
    });
    connect(m_run, &QPushButton::clicked, this, &TradeView::run);
    connect(m_cancel, &QPushButton::clicked, this, &TradeView::cancel);
    connect(m_export, &QPushButton::clicked, this, [this] {
        exportThroughDialog(
            this, tr("Export trade study"), tr("Export trade study"), QString(), tr("CSV (*.csv)"),
            [this](const QString& path, QString* error) { return exportCsv(path, error); });
    });
}

void TradeView::connectRunner() {
    connect(m_runner, &TradeRunner::progressed, this, [this](double fraction) {
        m_progress->setValue(static_cast<int>(std::lround(fraction * progressSteps)));
    });
    connect(m_runner, &TradeRunner::finished, this, &TradeView::studyFinished);
    connect(m_runner, &TradeRunner::cancelled, this, [this] {
        m_run->setEnabled(true);
        m_cancel->setEnabled(false);
        m_progress->setValue(0);
        m_status->setText(
            tr("Cancelled: the cases under way finish in the background and are "
               "dropped."));
    });
}

TradeView::AxisControls TradeView::addAxisRow(const QString& label, AxisControls* slot) {
    AxisControls axis;
    axis.row = new QWidget(this);
    auto* layout = new QHBoxLayout(axis.row);
    layout->setContentsMargins(0, 0, 0, 0);
    axis.key = new QComboBox(axis.row);
    axis.key->setEditable(true);
    axis.key->setInsertPolicy(QComboBox::NoInsert);
    axis.key->setMinimumContentsLength(28);
    axis.key->setToolTip(tr("A numeric key of the design, as the design file names it"));
    const auto number = [&axis] {
        auto* edit = new QLineEdit(axis.row);
        auto* validator = new QDoubleValidator(edit);
        validator->setLocale(QLocale::c());
        edit->setValidator(validator);
        edit->setMaximumWidth(110);
        return edit;
    };
    axis.from = number();
    axis.to = number();
    axis.count = new QSpinBox(axis.row);
    axis.count->setRange(2, mostSweepValues);
    layout->addWidget(new QLabel(label, axis.row));
    layout->addWidget(axis.key, 1);
    layout->addWidget(new QLabel(tr("from"), axis.row));
    layout->addWidget(axis.from);
    layout->addWidget(new QLabel(tr("to"), axis.row));
    layout->addWidget(axis.to);
    layout->addWidget(new QLabel(tr("in"), axis.row));
    layout->addWidget(axis.count);
    layout->addWidget(new QLabel(tr("values"), axis.row));
    // Choosing a key suggests a range around its value; typed ranges are kept.
    connect(axis.key, &QComboBox::activated, this, [this, slot] { suggestRange(*slot); });
    return axis;
}

void TradeView::refreshKeys() {
    const std::vector<std::string> keys =
        DesignVariants(m_document->json(), m_document->baseDirectory()).numeric_keys();
    QStringList names;
    for (const std::string& key : keys)
        names << text(key);
    if (names == m_keyNames)
        return;  // most edits change values, not keys
    m_keyNames = names;
    for (AxisControls& row : m_optimised) {
        const QString current = row.key->currentText();
        const QSignalBlocker block(row.key);
        row.key->clear();
        row.key->addItem(QString());  // no key: the row is not varied
        row.key->addItems(names);
        row.key->setCurrentText(current);
    }
    for (std::size_t i = 0; i < std::size(m_axes); ++i) {
        AxisControls& axis = m_axes[i];
        QString current = axis.key->currentText();
        // A new page starts on the usual first trade: size against entry steepness.
        if (current.isEmpty() && names.contains(QString::fromLatin1(defaultKeys[i]))) {
            current = QString::fromLatin1(defaultKeys[i]);
        }
        const QSignalBlocker block(axis.key);
        axis.key->clear();
        axis.key->addItems(names);
        axis.key->setCurrentText(current);
    }
}

void TradeView::suggestRange(AxisControls& axis) {
    const auto value = DesignVariants(m_document->json(), m_document->baseDirectory())
                           .value(axis.key->currentText().toStdString());
    if (!value)
        return;
    const double spread = std::abs(*value) * suggestedSpread;
    const double low = *value - (spread > 0.0 ? spread : 1.0);
    const double high = *value + (spread > 0.0 ? spread : 1.0);
    axis.from->setText(QLocale::c().toString(low, 'g', 6));
    axis.to->setText(QLocale::c().toString(high, 'g', 6));
}

void TradeView::kindChanged() {
    const int kind = m_kind->currentIndex();
    const bool sweep = kind == oneKeyIndex || kind == twoKeyIndex;
    m_axes[0].row->setVisible(sweep);
    m_axes[1].row->setVisible(kind == twoKeyIndex);
    for (AxisControls& axis : m_axes) {
        axis.count->setValue(kind == twoKeyIndex ? defaultGridCount : defaultLineCount);
    }
    m_dispersionRow->setVisible(kind == dispersionIndex);
    m_corridorRow->setVisible(kind == corridorIndex);
    m_optimisationRow->setVisible(kind == optimisationIndex);
    m_figure->setEnabled(kind != twoKeyIndex && kind != corridorIndex);
    // The optimiser's usual figure is the entry mass.
    if (kind == optimisationIndex && figure() == defaultFigure)
        setFigure("entry_mass");
}

void TradeView::documentChanged() {
    refreshKeys();
    for (AxisControls& axis : m_axes) {
        if (axis.from->text().isEmpty())
            suggestRange(axis);
    }
    if (m_runner->outcome() && !m_stale) {
        m_stale = true;
        m_status->setText(
            tr("The design has changed since this study ran: run it again to "
               "update it. Until then it stays out of the sizing sheet."));
    }
}

void TradeView::setSweep(const std::vector<SweepAxis>& axes) {
    m_kind->setCurrentIndex(axes.size() == 2 ? twoKeyIndex : oneKeyIndex);
    for (std::size_t i = 0; i < axes.size() && i < 2; ++i) {
        m_axes[i].key->setCurrentText(text(axes[i].key));
        m_axes[i].from->setText(QLocale::c().toString(axes[i].from, 'g', 10));
        m_axes[i].to->setText(QLocale::c().toString(axes[i].to, 'g', 10));
        m_axes[i].count->setValue(axes[i].count);
    }
}

void TradeView::setDispersions(std::size_t runs, std::uint64_t seed) {
    m_kind->setCurrentIndex(dispersionIndex);
    m_runs->setValue(static_cast<int>(runs));
    m_seed->setValue(static_cast<int>(seed));
}

void TradeView::setSensitivities() {
    m_kind->setCurrentIndex(sensitivityIndex);
}

void TradeView::setCorridor(const QString& speeds, int runs) {
    m_kind->setCurrentIndex(corridorIndex);
    m_speeds->setText(speeds);
    m_corridorRuns->setValue(runs);
}

void TradeView::setOptimisation(const std::vector<OptimisedKey>& keys, const std::string& figure,
                                bool maximise) {
    m_kind->setCurrentIndex(optimisationIndex);
    for (int i = 0; i < optimisedRows; ++i) {
        AxisControls& row = m_optimised[i];
        const bool given = static_cast<std::size_t>(i) < keys.size();
        row.key->setCurrentText(given ? text(keys[i].key) : QString());
        row.from->setText(given ? QLocale::c().toString(keys[i].low, 'g', 10) : QString());
        row.to->setText(given ? QLocale::c().toString(keys[i].high, 'g', 10) : QString());
    }
    setFigure(figure);
    m_sense->setCurrentIndex(maximise ? 1 : 0);
}

void TradeView::setFigure(const std::string& id) {
    m_figure->setCurrentIndex(m_figure->findData(text(id)));
}

std::string TradeView::figure() const {
    return m_figure->currentData().toString().toStdString();
}

bool TradeView::run() {
    const auto& design = m_document->design();
    if (!design) {
        m_status->setText(tr("The design has errors: correct them before a trade study."));
        return false;
    }
    StudyRequest request;
    const int kind = m_kind->currentIndex();
    if (kind == oneKeyIndex || kind == twoKeyIndex) {
        request.kind = StudyKind::sweep;
        const DesignVariants variants(m_document->json(), m_document->baseDirectory());
        for (int i = 0; i < (kind == twoKeyIndex ? 2 : 1); ++i) {
            const AxisControls& axis = m_axes[i];
            SweepAxis a;
            a.key = axis.key->currentText().trimmed().toStdString();
            bool fromOk = false;
            bool toOk = false;
            a.from = QLocale::c().toDouble(axis.from->text(), &fromOk);
            a.to = QLocale::c().toDouble(axis.to->text(), &toOk);
            a.count = axis.count->value();
            if (!variants.value(a.key)) {
                m_status->setText(tr("'%1' is not a number of the design: choose one of the listed "
                                     "keys.")
                                      .arg(text(a.key)));
                return false;
            }
            if (!fromOk || !toOk) {
                m_status->setText(tr("Give the range of %1 as two numbers.").arg(text(a.key)));
                return false;
            }
            request.axes.push_back(a);
        }
        if (request.axes.size() == 2 && request.axes[0].key == request.axes[1].key) {
            m_status->setText(tr("A feasibility map varies two different keys."));
            return false;
        }
    } else if (kind == dispersionIndex) {
        if (design->dispersions.empty()) {
            m_status->setText(
                tr("The design declares no dispersions: add the dispersed keys to "
                   "the table first."));
            return false;
        }
        request.kind = StudyKind::dispersions;
        request.runs = static_cast<std::size_t>(m_runs->value());
        request.seed = static_cast<std::uint64_t>(m_seed->value());
    } else if (kind == corridorIndex) {
        std::string error;
        const auto speeds = parse_value_list(m_speeds->text().toStdString(), &error);
        if (!speeds) {
            m_status->setText(tr("Speeds: %1.").arg(text(error)));
            return false;
        }
        request.kind = StudyKind::corridor;
        request.speeds = *speeds;
        request.runs = static_cast<std::size_t>(m_corridorRuns->value());
        request.seed = static_cast<std::uint64_t>(m_seed->value());
    } else if (kind == optimisationIndex) {
        request.kind = StudyKind::optimisation;
        const DesignVariants variants(m_document->json(), m_document->baseDirectory());
        for (const AxisControls& row : m_optimised) {
            const std::string key = row.key->currentText().trimmed().toStdString();
            if (key.empty())
                continue;
            bool lowOk = false;
            bool highOk = false;
            const OptimisedKey k{key, QLocale::c().toDouble(row.from->text(), &lowOk),
                                 QLocale::c().toDouble(row.to->text(), &highOk)};
            if (!variants.value(key)) {
                m_status->setText(tr("'%1' is not a number of the design: choose one of the listed "
                                     "keys.")
                                      .arg(text(key)));
                return false;
            }
            if (!lowOk || !highOk || !(k.low < k.high)) {
                m_status->setText(
                    tr("Give the bounds of %1 as two rising numbers.").arg(text(key)));
                return false;
            }
            request.bounds.push_back(k);
        }
        if (request.bounds.empty()) {
            m_status->setText(tr("Choose at least one key to vary, with its bounds."));
            return false;
        }
        request.objective.figure = figure();
        request.objective.maximise = m_sense->currentIndex() == 1;
        request.budget = static_cast<std::size_t>(m_budget->value());
        request.starts = static_cast<std::size_t>(m_starts->value());
        request.seed = static_cast<std::uint64_t>(m_seed->value());
    } else {
        request.kind = StudyKind::sensitivities;
    }
    m_runner->start(request, m_document->json(), *design, m_document->baseDirectory());
    m_run->setEnabled(false);
    m_cancel->setEnabled(true);
    m_status->setText(tr("Running..."));
    return true;
}

void TradeView::cancel() {
    m_runner->cancel();
}

const StudyOutcome* TradeView::currentOutcome() const {
    const auto& outcome = m_runner->outcome();
    return outcome && outcome->error.empty() && !m_stale ? &*outcome : nullptr;
}

void TradeView::studyFinished() {
    m_run->setEnabled(true);
    m_cancel->setEnabled(false);
    m_stale = false;
    const StudyOutcome& outcome = *m_runner->outcome();
    if (!outcome.error.empty()) {
        m_status->setText(tr("The study cannot run: %1").arg(text(outcome.error)));
        m_export->setEnabled(false);
        m_pages->setCurrentIndex(introPage);
        return;
    }
    QString size = tr("%1 sizings").arg(outcome.sweep.size());
    if (outcome.campaign)
        size = tr("%1 sizings").arg(outcome.campaign->cases.size());
    if (outcome.sensitivities)
        size = tr("%1 inputs").arg(outcome.sensitivities->inputs.size());
    if (outcome.optimisation)
        size = tr("%1 sizings").arg(outcome.optimisation->sizings);
    if (outcome.corridor) {
        std::size_t sizings = 0;
        for (const CorridorSpeed& row : outcome.corridor->speeds)
            sizings += row.sizings;
        size = tr("%1 sizings").arg(sizings);
    }
    m_status->setText(tr("%1: %2 in %3 s.")
                          .arg(QString::fromStdString(outcome.description()), size)
                          .arg(outcome.seconds, 0, 'f', 2));
    m_export->setEnabled(true);
    showOutcome();
    emit studyShown();
}

void TradeView::replaceChart(ChartView* view, QChart* chart) {
    view->replaceChart(chart, ChartView::Zoom::whole);  // another study: drawn whole
}

void TradeView::showOutcome() {
    const StudyOutcome& outcome = *m_runner->outcome();
    if (!outcome.error.empty())
        return;
    switch (outcome.request.kind) {
        case StudyKind::sweep:
            if (outcome.request.axes.size() == 2) {
                m_map->setOutcome(&outcome);
                m_pages->setCurrentIndex(mapPage);
            } else {
                replaceChart(m_line, sweepLineChart(outcome, figure()));
                m_pages->setCurrentIndex(linePage);
            }
            break;
        case StudyKind::dispersions: {
            const DispersionSummary& s = outcome.summary;
            QString summary =
                QString::fromStdString(success_probability_sentence(s)).toHtmlEscaped();
            if (!s.failing_checks.empty()) {
                QStringList failing;
                for (std::size_t i = 0; i < s.failing_checks.size() && i < summaryChecks; ++i) {
                    failing << tr("%1 (%2 cases)")
                                   .arg(text(s.failing_checks[i].first))
                                   .arg(s.failing_checks[i].second);
                }
                summary += tr(" Failing most often: %1.").arg(failing.join(QStringLiteral(", ")));
            }
            if (const auto& ellipse = s.landing_ellipse) {
                summary += tr(" Landing ellipse (%1 %, %2 points): %3 × %4 km, major axis at "
                              "%5° from north, centred at %6°, %7°.")
                               .arg(ellipse->probability * 100.0, 0, 'g', 3)
                               .arg(ellipse->count)
                               .arg(2.0 * ellipse->axes.semi_major_km, 0, 'f', 2)
                               .arg(2.0 * ellipse->axes.semi_minor_km, 0, 'f', 2)
                               .arg(ellipse->axes.major_axis_azimuth_deg, 0, 'f', 0)
                               .arg(ellipse->centre_latitude_deg, 0, 'f', 3)
                               .arg(ellipse->centre_longitude_deg, 0, 'f', 3);
            }
            m_summary->setText(summary);
            replaceChart(m_histogram, dispersionHistogramChart(outcome, figure()));
            replaceChart(m_scatter, deployScatterChart(outcome));
            replaceChart(m_landing, landingEllipseChart(outcome));
            m_pages->setCurrentIndex(dispersionPage);
            break;
        }
        case StudyKind::sensitivities:
            replaceChart(m_sensitivity, sensitivityChart(outcome, figure()));
            m_pages->setCurrentIndex(sensitivityPage);
            break;
        case StudyKind::corridor:
            m_corridorSummary->setText(corridorSummary(*outcome.corridor));
            replaceChart(m_corridor, corridorChart(outcome));
            m_pages->setCurrentIndex(corridorPage);
            break;
        case StudyKind::optimisation:
            m_optimisationSummary->setText(optimisationSummary(*outcome.optimisation));
            m_applyOptimum->setEnabled(outcome.optimisation->feasible);
            replaceChart(m_convergence, convergenceChart(outcome));
            m_pages->setCurrentIndex(optimisationPage);
            break;
    }
}

void TradeView::applyOptimum() {
    const auto& outcome = m_runner->outcome();
    if (!outcome || !outcome->optimisation || !outcome->optimisation->feasible)
        return;
    const Optimisation& o = *outcome->optimisation;
    std::vector<std::pair<std::string, DesignDocument::Json>> values;
    for (std::size_t i = 0; i < o.settings.keys.size(); ++i)
        values.emplace_back(key_to_pointer(o.settings.keys[i].key), o.best_inputs[i]);
    m_document->setValues(values, tr("Apply the optimum"));
}

bool TradeView::exportCsv(const QString& path, QString* error) const {
    const auto& outcome = m_runner->outcome();
    if (!outcome || !outcome->error.empty()) {
        *error = tr("There is no trade study to export yet.");
        return false;
    }
    return writeFileAtomically(path, QByteArray::fromStdString(outcome->csv()), error);
}

}  // namespace ds

#include "main_window.hpp"

#include <algorithm>

#include <QAction>
#include <QCloseEvent>
#include <QDateTime>
#include <QDir>
#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QLabel>
#include <QLocale>
#include <QMenuBar>
#include <QMessageBox>
#include <QPushButton>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
#include <QUndoStack>

#include "model/autosave.hpp"
#include "model/design_document.hpp"
#include "model/sizing_runner.hpp"
#include "results/caution.hpp"
#include "sheet/sizing_sheet.hpp"
#include "views/charts.hpp"
#include "views/checks_view.hpp"
#include "views/design_form.hpp"
#include "views/export_dialog.hpp"
#include "views/figures_view.hpp"
#include "views/trade_view.hpp"

namespace ds {
namespace {

constexpr const char* demoResource = ":/samples/small-ballistic-station.json";
constexpr const char* designFilter = "Descent Sizer designs (*.json)";
// What the form takes at first: its own minimum (its widest row) and a little more.
constexpr int formWidth = 420;
// Room for about ten rows of figures and checks above the charts.
constexpr int tablesHeight = 300;
// How long a note about the file (an autosave that failed, a file written again) stays shown.
constexpr int fileNoteMs = 15000;

}  // namespace

MainWindow::MainWindow(QWidget* parent)
    : QMainWindow(parent),
      m_document(new DesignDocument(this)),
      m_runner(new SizingRunner(this)),
      m_autosave(new Autosave(m_document, Autosave::defaultFolder(), this)) {
    m_autosave->setInterval(m_settings.autosaveIntervalMs());
    m_form = new DesignForm(m_document, this);
    m_figures = new FiguresView(this);
    m_checks = new ChecksView(this);
    m_charts = new ChartsView(this);
    m_trades = new TradeView(m_document, this);

    // Figures and checks side by side above the charts: a trade reads across all three.
    auto* tables = new QSplitter(Qt::Horizontal, this);
    tables->addWidget(m_figures);
    tables->addWidget(m_checks);
    tables->setStretchFactor(0, 2);
    tables->setStretchFactor(1, 3);
    // The flight of the design and its trade studies share the space below the tables.
    m_views = new QTabWidget(this);
    m_views->addTab(m_charts, tr("&Flight"));
    m_views->addTab(m_trades, tr("&Trade study"));
    auto* results = new QSplitter(Qt::Vertical, this);
    results->addWidget(tables);
    results->addWidget(m_views);
    results->setStretchFactor(0, 0);
    results->setStretchFactor(1, 1);
    results->setSizes({tablesHeight, 700});
    auto* main = new QSplitter(Qt::Horizontal, this);
    main->addWidget(m_form);
    main->addWidget(results);
    main->setStretchFactor(0, 0);
    main->setStretchFactor(1, 1);
    main->setSizes({std::max(formWidth, m_form->minimumWidth()), 1100});
    setCentralWidget(main);

    m_status = new QLabel(this);
    statusBar()->addWidget(m_status, 1);
    statusBar()->addPermanentWidget(
        new QLabel(QString::fromUtf8(conceptual_caution.data(),
                                     static_cast<qsizetype>(conceptual_caution.size())),
                   this));

    buildMenus();
    connect(m_document, &DesignDocument::changed, this, &MainWindow::documentChanged);
    connect(m_document, &DesignDocument::fileStateChanged, this, &MainWindow::updateTitle);
    connect(m_runner, &SizingRunner::resultsReady, this, &MainWindow::showResults);
    connect(m_autosave, &Autosave::failed, this, [this](const QString& error) {
        statusBar()->showMessage(
            tr("Autosave failed: %1. Save the design to keep the edits.").arg(error), fileNoteMs);
    });
    connect(m_form, &DesignForm::refusalsChanged, this, &MainWindow::updateStatus);
    connect(m_runner, &SizingRunner::busyChanged, this, &MainWindow::updateStatus);
    connect(m_checks, &ChecksView::fieldRequested, this,
            [this](const QString& pointer) { m_form->focusField(pointer.toStdString()); });

    resize(1500, 950);
    if (!m_settings.windowGeometry().isEmpty())
        restoreGeometry(m_settings.windowGeometry());
    if (!m_settings.windowState().isEmpty())
        restoreState(m_settings.windowState());
    updateTitle();
}

void MainWindow::buildMenus() {
    QMenu* file = menuBar()->addMenu(tr("&File"));
    file->addAction(tr("&New from demo"), QKeySequence::New, this, [this] {
        if (confirmDiscard())
            newFromDemo();
    });
    file->addAction(tr("&Open..."), QKeySequence::Open, this, [this] {
        if (!confirmDiscard())
            return;
        const QString path = QFileDialog::getOpenFileName(
            this, tr("Open design"), m_settings.lastDirectory(), tr(designFilter));
        if (!path.isEmpty())
            openFile(path);
    });
    m_recentMenu = file->addMenu(tr("Open &recent"));
    file->addSeparator();
    file->addAction(tr("&Save"), QKeySequence::Save, this, [this] { save(); });
    file->addAction(tr("Save &as..."), QKeySequence::SaveAs, this, [this] {
        const QString path = chooseSaveFile();
        if (!path.isEmpty())
            saveAs(path);
    });
    file->addAction(tr("&Export sheet..."), QKeySequence(tr("Ctrl+E")), this, [this] {
        exportThroughDialog(
            this, tr("Export sizing sheet"), tr("Export sheet"), m_settings.lastDirectory(),
            tr("PDF (*.pdf);;HTML (*.html);;Trajectory CSV (*.csv)"),
            [this](const QString& path, QString* error) { return exportSheet(path, error); });
    });
    file->addSeparator();
    file->addAction(tr("&Quit"), QKeySequence::Quit, this, &QWidget::close);

    QMenu* edit = menuBar()->addMenu(tr("&Edit"));
    QAction* undo = m_document->undoStack()->createUndoAction(this, tr("&Undo"));
    undo->setShortcut(QKeySequence::Undo);
    QAction* redo = m_document->undoStack()->createRedoAction(this, tr("&Redo"));
    redo->setShortcut(QKeySequence::Redo);
    edit->addAction(undo);
    edit->addAction(redo);
    edit->addSeparator();
    m_dropUnused = edit->addAction(tr("&Drop unused keys"), this, [this] {
        if (const QStringList dropped = m_document->dropUnusedKeys(); !dropped.isEmpty())
            statusBar()->showMessage(
                tr("Dropped %1 (Undo restores them).").arg(dropped.join(QStringLiteral(", "))),
                fileNoteMs);
    });
    m_dropUnused->setEnabled(false);

    QMenu* trade = menuBar()->addMenu(tr("&Baseline"));
    trade->addAction(tr("&Pin current results as baseline"), QKeySequence(tr("Ctrl+B")), this,
                     &MainWindow::pinBaseline);
    trade->addAction(tr("&Clear baseline"), this, &MainWindow::clearBaseline);

    QMenu* study = menuBar()->addMenu(tr("&Study"));
    study->addAction(tr("Show the &trade study"), QKeySequence(tr("Ctrl+T")), this,
                     &MainWindow::showTradeStudy);
    study->addAction(tr("&Run the trade study"), QKeySequence(tr("Ctrl+R")), this, [this] {
        showTradeStudy();
        m_trades->run();
    });
    study->addAction(tr("&Cancel the trade study"), m_trades, &TradeView::cancel);
    updateRecentMenu();
}

void MainWindow::newFromDemo() {
    QFile demo(demoResource);
    demo.open(QIODevice::ReadOnly);
    const QByteArray bytes = demo.readAll();
    DesignDocument::Json json =
        DesignDocument::Json::parse(bytes.constData(), bytes.constData() + bytes.size());
    m_document->reset(std::move(json), QString());
}

bool MainWindow::offerRecovery() {
    if (m_document->isModified())
        return false;  // never replace work in progress
    for (const RecoveredWork& work : Autosave::leftoverWork(m_autosave->folder())) {
        const RecoveryChoice choice =
            m_recoveryPrompt ? m_recoveryPrompt(work) : askAboutRecovery(work);
        if (choice == RecoveryChoice::discard)
            Autosave::remove(work);
        if (choice != RecoveryChoice::recover)
            continue;
        DesignDocument::Json json;
        QString error;
        if (!Autosave::read(work, &json, &error)) {
            statusBar()->showMessage(tr("Cannot recover: %1").arg(error), fileNoteMs);
            continue;
        }
        m_document->restore(std::move(json), work.originalPath);
        m_autosave->adopt(work);
        if (!work.originalPath.isEmpty())
            m_settings.addRecentFile(m_document->filePath());
        updateRecentMenu();
        return true;
    }
    return false;
}

RecoveryChoice MainWindow::askAboutRecovery(const RecoveredWork& work) {
    const QString at = QLocale().toString(work.savedAt.toLocalTime(), QLocale::LongFormat);
    QString text;
    if (work.originalPath.isEmpty()) {
        text = tr("An untitled design was left with unsaved changes, autosaved %1.").arg(at);
    } else {
        const QString path = QDir::toNativeSeparators(work.originalPath);
        text = tr("%1 was left with unsaved changes, autosaved %2.\n\nRecovered, it opens as "
                  "modified and Save writes it to %3.")
                   .arg(QFileInfo(work.originalPath).fileName(), at, path);
        if (QFileInfo(work.originalPath).lastModified() > work.savedAt) {
            text +=
                tr("\n\nThat file was saved after this autosave: saving the recovered design "
                   "would replace the later version.");
        }
    }
    QMessageBox box(QMessageBox::Question, tr("Recover unsaved work"), text, QMessageBox::NoButton,
                    this);
    QPushButton* recover = box.addButton(tr("&Recover"), QMessageBox::AcceptRole);
    QPushButton* discard = box.addButton(tr("&Discard"), QMessageBox::DestructiveRole);
    box.addButton(tr("Ask &later"), QMessageBox::RejectRole);
    box.setDefaultButton(recover);
    box.exec();
    if (box.clickedButton() == recover)
        return RecoveryChoice::recover;
    if (box.clickedButton() == discard)
        return RecoveryChoice::discard;
    return RecoveryChoice::later;
}

bool MainWindow::openFile(const QString& path, bool quiet) {
    QString error;
    if (!m_document->open(path, &error)) {
        if (!quiet)
            QMessageBox::warning(this, tr("Open design"), error);
        return false;
    }
    m_settings.addRecentFile(m_document->filePath());
    m_settings.setLastDirectory(QFileInfo(path).absolutePath());
    updateRecentMenu();
    if (const QStringList unused = m_document->unusedKeys(); !unused.isEmpty()) {
        statusBar()->showMessage(
            tr("%1 has keys the design does not use: %2. Edit > Drop unused keys removes them.")
                .arg(QFileInfo(path).fileName(), unused.join(QStringLiteral(", "))),
            fileNoteMs);
    }
    return true;
}

bool MainWindow::save() {
    if (m_document->filePath().isEmpty()) {
        const QString path = chooseSaveFile();
        return !path.isEmpty() && saveAs(path);
    }
    return saveAs(m_document->filePath());
}

bool MainWindow::saveAs(const QString& path) {
    const bool wasRemoved =
        QFileInfo(path).absoluteFilePath() == m_document->filePath() && !QFileInfo::exists(path);
    QString error;
    if (!m_document->saveAs(path, &error)) {
        QMessageBox::warning(this, tr("Save design"), error);
        return false;
    }
    if (wasRemoved) {
        statusBar()->showMessage(
            tr("%1 had been removed or moved while open; it was written again.")
                .arg(QDir::toNativeSeparators(m_document->filePath())),
            fileNoteMs);
    }
    m_settings.addRecentFile(m_document->filePath());
    m_settings.setLastDirectory(QFileInfo(path).absolutePath());
    updateRecentMenu();
    return true;
}

QString MainWindow::chooseSaveFile() {
    QString path = QFileDialog::getSaveFileName(this, tr("Save design"), m_settings.lastDirectory(),
                                                tr(designFilter));
    if (!path.isEmpty() && QFileInfo(path).suffix().isEmpty())
        path += ".json";
    return path;
}

bool MainWindow::exportSheet(const QString& path, QString* error) {
    if (!m_runner->hasResults()) {
        *error = tr("There are no results to export yet.");
        return false;
    }
    const SheetContext context{QStringLiteral(DESCENT_SIZER_VERSION), QDateTime::currentDateTime(),
                               m_document->filePath(), m_trades->currentOutcome(),
                               m_trades->figure()};
    return writeSheet(path, m_runner->design(), m_runner->results(), context, error);
}

void MainWindow::showTradeStudy() {
    m_views->setCurrentWidget(m_trades);
}

void MainWindow::pinBaseline() {
    if (!m_runner->hasResults())
        return;
    m_baseline = m_runner->results();
    showResults();
}

void MainWindow::clearBaseline() {
    m_baseline.reset();
    if (m_runner->hasResults())
        showResults();
}

void MainWindow::documentChanged() {
    if (const auto& design = m_document->design()) {
        m_runner->request(*design);
    }
    m_dropUnused->setEnabled(!m_document->unusedKeys().isEmpty());
    updateStatus();
    updateTitle();
}

void MainWindow::showResults() {
    const Results& r = m_runner->results();
    const Results* baseline = m_baseline ? &*m_baseline : nullptr;
    m_figures->setResults(r, baseline);
    m_checks->setResults(r);
    m_charts->setResults(m_runner->design(), r, baseline);
    m_lastEditToRedrawMs = m_runner->lastLatencyMs();
    updateStatus();
    emit resultsShown();
}

bool MainWindow::resultsAreStale() const {
    return m_runner->hasResults() && (!m_document->design() || !m_form->refusedFields().isEmpty());
}

void MainWindow::updateStatus() {
    const bool stale = resultsAreStale();
    m_figures->setStale(stale);
    m_checks->setStale(stale);
    m_status->setStyleSheet(stale ? QStringLiteral("color: #a40000;") : QString());
    const QStringList refused = m_form->refusedFields();
    if (!refused.isEmpty()) {
        m_status->setText(tr("Results stale: %1 (refused; the design keeps the value before "
                             "it). The results shown are of that design.")
                              .arg(refused.join(QStringLiteral("; "))));
        return;
    }
    if (!m_document->design()) {
        m_status->setText(
            tr("Results stale: the design has errors (listed above the form). The "
               "results shown are of the last design that read."));
        return;
    }
    if (m_runner->isBusy() || !m_runner->hasResults()) {  // an edit newer than the results
        m_status->setText(tr("Sizing..."));
        return;
    }
    const Results& r = m_runner->results();
    int failing = 0;
    int marginal = 0;
    for (const Check& c : r.checks) {
        failing += c.status == CheckStatus::fail;
        marginal += c.status == CheckStatus::marginal;
    }
    m_status->setText(
        tr("%1: %2 failing, %3 marginal of %4 checks%5")
            .arg(r.converged ? tr("Sized") : tr("NOT sized"))
            .arg(failing)
            .arg(marginal)
            .arg(r.checks.size())
            .arg(m_baseline ? tr("; differences from the pinned baseline") : QString()));
}

QString MainWindow::statusText() const {
    return m_status->text();
}

void MainWindow::updateTitle() {
    const QString name = m_document->filePath().isEmpty()
                             ? tr("Untitled design")
                             : QFileInfo(m_document->filePath()).fileName();
    setWindowTitle(tr("%1[*] - Descent Sizer").arg(name));
    setWindowModified(m_document->isModified());
}

void MainWindow::updateRecentMenu() {
    if (!m_recentMenu)
        return;
    m_recentMenu->clear();
    for (const QString& path : m_settings.recentFiles()) {
        m_recentMenu
            ->addAction(QFileInfo(path).fileName(), this,
                        [this, path] {
                            if (confirmDiscard())
                                openFile(path);
                        })
            ->setToolTip(path);
    }
    m_recentMenu->setEnabled(!m_settings.recentFiles().isEmpty());
}

bool MainWindow::confirmDiscard() {
    if (!m_document->isModified())
        return true;
    const auto answer = QMessageBox::question(
        this, tr("Unsaved changes"), tr("The design has unsaved changes. Save them first?"),
        QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
    if (answer == QMessageBox::Cancel)
        return false;
    if (answer == QMessageBox::Save)
        return save();
    return true;
}

void MainWindow::closeEvent(QCloseEvent* event) {
    if (!confirmDiscard()) {
        event->ignore();
        return;
    }
    // Saved, clean or discarded: the recovery files have nothing left to keep.
    m_autosave->discard();
    m_settings.setWindow(saveGeometry(), saveState());
    event->accept();
}

}  // namespace ds

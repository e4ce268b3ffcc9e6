#pragma once

#include <functional>
#include <optional>

#include <QMainWindow>

#include "results/results.hpp"
#include "settings.hpp"

QT_BEGIN_NAMESPACE
class QAction;
class QLabel;
class QMenu;
class QTabWidget;
QT_END_NAMESPACE

namespace ds {

class Autosave;
class ChartsView;
class ChecksView;
class DesignDocument;
class DesignForm;
class FiguresView;
class SizingRunner;
class TradeView;
struct RecoveredWork;

/// What to do with work a session left unsaved: open it, delete it, or ask at the next start.
enum class RecoveryChoice { recover, discard, later };

/// The window: wires the design document, the forms, the sizing runner and the result views
/// together, and holds the file and baseline commands. It computes nothing itself.
class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget* parent = nullptr);

    /// Opens a design file; on failure says why in a message box (unless quiet) and keeps the
    /// current design.
    bool openFile(const QString& path, bool quiet = false);
    /// Starts a new, unsaved design from the bundled demo.
    void newFromDemo();

    /// Offers the work of sessions that ended without saving (newest first), one question
    /// each, until one is recovered: it opens as modified, with its original path. Called once
    /// the window is up; does nothing while the current design has unsaved edits.
    bool offerRecovery();
    /// Replaces the recovery question (a message box) with a function, for tests.
    using RecoveryPrompt = std::function<RecoveryChoice(const RecoveredWork&)>;
    void setRecoveryPrompt(RecoveryPrompt prompt) { m_recoveryPrompt = std::move(prompt); }

    DesignDocument* document() const { return m_document; }
    DesignForm* form() const { return m_form; }
    SizingRunner* runner() const { return m_runner; }
    Autosave* autosave() const { return m_autosave; }
    FiguresView* figures() const { return m_figures; }
    ChecksView* checks() const { return m_checks; }
    TradeView* trades() const { return m_trades; }
    bool hasBaseline() const { return m_baseline.has_value(); }
    /// Whether the results on show are of a design before the one being edited: a field
    /// holds a value it refused, or the design does not read.
    bool resultsAreStale() const;
    /// What the status bar says of the results.
    QString statusText() const;
    /// Milliseconds from the edit to the redrawn views, for the last results shown.
    qint64 lastEditToRedrawMs() const { return m_lastEditToRedrawMs; }

    /// Brings the trade study page to the front.
    void showTradeStudy();
    void pinBaseline();
    void clearBaseline();
    bool save();
    bool saveAs(const QString& path);
    bool exportSheet(const QString& path, QString* error);

signals:
    /// The views show new results.
    void resultsShown();

protected:
    void closeEvent(QCloseEvent* event) override;

private:
    void buildMenus();
    void showResults();
    void documentChanged();
    /// The status bar and the stale marks, from the document, the form and the results.
    void updateStatus();
    void updateTitle();
    void updateRecentMenu();
    bool confirmDiscard();
    RecoveryChoice askAboutRecovery(const RecoveredWork& work);
    QString chooseSaveFile();

    DesignDocument* m_document;
    SizingRunner* m_runner;
    Autosave* m_autosave;
    DesignForm* m_form;
    FiguresView* m_figures;
    ChecksView* m_checks;
    ChartsView* m_charts;
    TradeView* m_trades;
    QTabWidget* m_views;
    QLabel* m_status;
    QMenu* m_recentMenu = nullptr;
    QAction* m_dropUnused = nullptr;
    std::optional<Results> m_baseline;
    Settings m_settings;
    RecoveryPrompt m_recoveryPrompt;
    qint64 m_lastEditToRedrawMs = 0;
};

}  // namespace ds

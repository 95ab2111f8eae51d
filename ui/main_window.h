// MainWindow: the workbench. A rail of pages on the left (the editing pages, then the
// results pages, extensible with addPage), the Scenario shelf and the Checks panel as
// docks, the Data confidence panel beside the tables, and a status bar that carries
// the balance status as icon + word. Every edit goes through the document's undo
// stack and triggers a re-solve (inline when fast, in the background when slow).
#pragma once

#include <QMainWindow>
#include <QStringList>
#include <memory>
#include <set>
#include <vector>

#include "core/balance/balance_sheet.h"
#include "core/model/problem.h"
#include "ui/solve/balance_runner.h"
#include "ui/tables/scenario_table_model.h"

class QLabel;
class QListWidget;
class QStackedWidget;
class QAction;
class QMenu;

namespace tl::ui {

class ProjectDocument;
class RecoveryKeeper;
class ChecksPanel;
class ConfidencePanel;
class ScenarioShelf;
class EditingPage;
class CompartmentsPage;
class ComparePage;
class EnsemblePage;
class DietPage;
class HarvestPage;
class RoutingPage;
class ResultsPage;

struct MainWindowOptions {
    QString recoveryDirectory;  // empty: RecoveryKeeper::defaultDirectory()
    bool useSettings = true;    // read/write window state and recent files (off in tests)
    bool askBeforeClosing = true;
};

class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(const MainWindowOptions& options = {}, QWidget* parent = nullptr);
    ~MainWindow() override;

    ProjectDocument* document() const { return doc_; }
    BalanceRunner* runner() const { return runner_; }
    RecoveryKeeper* recovery() const { return recovery_.get(); }
    ChecksPanel* checks() const { return checks_; }
    ConfidencePanel* confidencePanel() const { return confidence_; }
    ScenarioShelf* shelf() const { return shelf_; }
    CompartmentsPage* compartmentsPage() const { return compartments_; }
    DietPage* dietPage() const { return diet_; }
    HarvestPage* harvestPage() const { return harvest_; }
    RoutingPage* routingPage() const { return routing_; }
    const SolveOutcome& lastOutcome() const { return outcome_; }
    EnsemblePage* ensemblePage() const { return ensemble_; }

    // Pages in the rail, in order; `key` is stable (snapshots, settings).
    void addPage(QWidget* page, const QString& title, const QString& key, const QIcon& icon = {});
    int pageCount() const;
    QString pageKey(int i) const;
    QString pageTitle(int i) const;
    void showPage(int i);
    void showPage(const QString& key);
    QWidget* currentPage() const;
    QWidget* page(int i) const;

    // File > Export figure / Report, Project > Project settings, Help > User guide.
    QAction* exportFigureAction() const { return exportFigureAct_; }
    QAction* reportAction() const { return reportAct_; }
    QAction* settingsAction() const { return settingsAct_; }
    QAction* userGuideAction() const { return guideAct_; }
    QAction* reconcileAction() const { return reconcileAct_; }  // Scenario > Reconcile…
    bool writeReport(const QString& path, QString* error);

    // Files. Each returns false (after telling the user, unless quiet) on failure.
    bool openPath(const QString& path, bool asTemplate = false, QString* error = nullptr);
    bool saveTo(const QString& path, QString* error = nullptr);

    // Offers crash recovery if files were left behind; returns true if one was taken.
    bool offerRecovery();

    // Renders every page to DIR/NN-key.png; returns the files written.
    QStringList renderSnapshots(const QString& dir, QString* error);

    // Selects the cell a problem refers to (Checks panel).
    bool goToProblem(const tl::Problem& p);

    static QStringList recentFiles();

protected:
    void closeEvent(QCloseEvent* event) override;
    void dragEnterEvent(QDragEnterEvent* event) override;
    void dropEvent(QDropEvent* event) override;
    void resizeEvent(QResizeEvent* event) override;
    bool event(QEvent* event) override;

private:
    void buildActions();
    void setCompactRail(bool compact);
    void fitToWidth();  // compact rail and narrower side docks below 1200 px
    void buildDocks();
    void buildPages();
    void onModelChanged();
    void onSolved(const SolveOutcome& outcome);
    void updateTitle();
    void updateCurrentCell();
    void showBlockReport(const BlockEditReport& report, const QString& action);
    bool maybeSave();
    bool save();
    bool saveAsDialog();
    void openDialog();
    void importCsvDialog();
    void exportCsvDialog();
    void exportFigureDialog();
    void reportDialog();
    void refreshCompare();  // the Compare page follows the project while it is on screen
    void updateEnsembleBands();  // results pages: intervals of the scenario's newest stored ensemble run
    void openComparedCell(const QString& scenario, const QString& compartment, const QString& item);
    void showUserGuide(const QString& section);
    void addRecent(const QString& path);
    void rebuildRecentMenu();
    void message(const QString& text, int ms = 6000);

    MainWindowOptions options_;
    ProjectDocument* doc_;
    BalanceRunner* runner_;
    std::unique_ptr<RecoveryKeeper> recovery_;
    SolveOutcome outcome_;

    QListWidget* rail_;
    QStackedWidget* stack_;
    QStringList pageKeys_;
    CompartmentsPage* compartments_ = nullptr;
    DietPage* diet_ = nullptr;
    HarvestPage* harvest_ = nullptr;
    RoutingPage* routing_ = nullptr;
    std::vector<EditingPage*> editingPages_;
    std::vector<ResultsPage*> resultsPages_;
    std::set<ResultsPage*> staleResults_;  // pages off screen that have not seen the latest solve
    ComparePage* compare_ = nullptr;
    bool compareStale_ = true;  // the project changed while the Compare page was off screen
    EnsemblePage* ensemble_ = nullptr;

    ChecksPanel* checks_;
    ConfidencePanel* confidence_;
    ScenarioShelf* shelf_;

    class QDockWidget* confidenceDock_ = nullptr;
    QLabel* statusIcon_;
    QLabel* statusText_;
    QLabel* templateNote_;
    QLabel* solveNote_;
    QMenu* recentMenu_ = nullptr;
    QMenu* viewMenu_ = nullptr;
    QAction* exportFigureAct_ = nullptr;
    QAction* reportAct_ = nullptr;
    QAction* settingsAct_ = nullptr;
    QAction* guideAct_ = nullptr;
    QAction* reconcileAct_ = nullptr;
};

}  // namespace tl::ui

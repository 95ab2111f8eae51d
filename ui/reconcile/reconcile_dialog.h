// Reconcile dialog (Scenario > Reconcile…): the smallest confidence-weighted change to
// the current scenario's inputs that balances it (core/reconcile, DESIGN 3.6), in two
// pages.
//
//   Settings  which kinds of input may move and the CV that stands in for diet shares
//             and catch (the project keeps no confidence for them); per living
//             compartment its EE maximum and
//             minimum, its P/Q range (consumers) and pins (click a cell to hold B, P/B,
//             Q/B, the diet or the catch where it is). Run starts the solve on a worker
//             thread (ReconcileRunner): the window stays live, a busy bar and counts
//             show it working, and Cancel stops it, leaving the project untouched.
//   Report    the status in words and icon, the ranked changes, the EE of each
//             compartment before and after (EeChangeChart), the binding constraints and,
//             for a model that cannot balance, the constraints in conflict with what to
//             relax. "Create scenario" adds the result as a NEW scenario after the one
//             reconciled and selects it: one undoable edit (the document's QUndoStack);
//             the scenario reconciled is never changed.
#pragma once

#include <QDialog>
#include <memory>
#include <optional>

#include "core/reconcile/reconcile.h"

class QCheckBox;
class QLabel;
class QLineEdit;
class QListWidget;
class QProgressBar;
class QPushButton;
class QStackedWidget;
class QTableWidget;
class QGroupBox;

namespace tl::ui {

class ProjectDocument;
class ReconcileRunner;
class EeChangeChart;

// Adds `result` of scenario `from` to the document as a new scenario named `name`,
// inserted after `from` and made current, as one undoable edit. False with `why` when
// the name is empty or taken, the result changes nothing, or scenario `from` no longer
// holds `reconciled` (edited meanwhile).
// The reconcile's settings and changes go with it as a stored run (kind "reconcile", on
// the new scenario; core/reconcile/reconciled_scenario.h), saved with the project, which
// the report reads.
bool addReconciledScenario(ProjectDocument* doc, int from, const tl::Model& reconciled,
                           const tl::ReconcileResult& result, const tl::ReconcileOptions& options, const QString& name,
                           QString* why);

class ReconcileDialog : public QDialog {
    Q_OBJECT
public:
    // Settings columns of the compartment table.
    enum Column { NameColumn, EENowColumn, EEMaxColumn, EEMinColumn, PQMinColumn, PQMaxColumn,
                  PinBColumn, PinPBColumn, PinQBColumn, PinDietColumn, PinCatchColumn, ColumnCount };

    explicit ReconcileDialog(ProjectDocument* doc, QWidget* parent = nullptr);
    ~ReconcileDialog() override;

    // The options the settings page describes; nullopt with `why` naming the cell
    // (compartment and column) and what it expects.
    std::optional<tl::ReconcileOptions> options(QString* why) const;

    // Starts the solve (false, with the reason on the page, when a setting is refused).
    bool run();
    void cancelRun();
    bool running() const;
    // Creates the scenario from the report page (false with the reason shown).
    bool createScenario();

    const tl::ReconcileResult* result() const { return result_.get(); }
    ReconcileRunner* runner() const { return runner_; }
    QTableWidget* settingsTable() const { return table_; }
    QCheckBox* moveCheck(tl::AdjustParam p) const { return move_[std::size_t(p)]; }
    QLineEdit* nameEdit() const { return name_; }
    QLineEdit* dietCvEdit() const { return dietCv_; }
    QPushButton* createButton() const { return create_; }
    QTableWidget* changesTable() const { return changes_; }
    EeChangeChart* chart() const { return chart_; }
    QListWidget* bindingList() const { return binding_; }
    QListWidget* conflictList() const { return conflicts_; }
    QLabel* summaryLabel() const { return summary_; }
    QLabel* messageLabel() const { return message_; }
    QLabel* progressLabel() const { return progress_; }
    bool showingReport() const;
    void showSettings();

    void reject() override;  // cancels a run first

signals:
    void scenarioCreated(const QString& name);

private:
    QWidget* buildSettingsPage();
    QWidget* buildReportPage();
    void fillSettingsTable();
    void setRunning(bool running);
    void showProgress(const tl::ReconcileProgress& p, double seconds);
    void showResult(std::shared_ptr<const tl::ReconcileResult> result);
    void fillReport();

    ProjectDocument* doc_;
    int from_;
    tl::Model model_;  // the scenario as it was when the dialog opened
    ReconcileRunner* runner_;
    std::shared_ptr<const tl::ReconcileResult> result_;
    tl::ReconcileOptions ranWith_;  // the options of the run result_ came from
    std::vector<std::size_t> rowCompartment_;

    QStackedWidget* pages_;
    QCheckBox* move_[tl::kAdjustParamCount] = {};
    QLineEdit* dietCv_;
    QLineEdit* catchCv_;
    QTableWidget* table_;
    QLabel* message_;
    QPushButton* run_;
    QPushButton* cancel_;
    QProgressBar* busy_;
    QLabel* progress_;

    QLabel* summaryIcon_;
    QLabel* summary_;
    QTableWidget* changes_;
    EeChangeChart* chart_;
    QListWidget* binding_;
    QGroupBox* conflictBox_;
    QListWidget* conflicts_;
    QLineEdit* name_;
    QPushButton* create_;
    QLabel* createNote_;
};

}  // namespace tl::ui

// Ensemble page (issue 15 point 6): how sure the current scenario's results are.
// Settings (draws, seed, threads, input shape, diet CV, which analyses), Run with a
// progress bar and Cancel (the draws run on worker threads: the window never waits),
// then the results: the share of draws that balance, the percentiles of every output
// (sortable, filterable), the distribution of a chosen output, the compartments that
// break the balance, and the strongest drivers of the chosen output (local elasticities,
// core/sensitivity). A finished run is stored beside its scenario as the CLI stores it
// (the project's stored runs, kind "ensemble"; an undoable edit, written by Save), and
// the scenario's stored runs can be shown again (percentiles, share, breakers: a stored
// run keeps no histogram).
// A view: every figure comes from core/ensemble and core/sensitivity.
#pragma once

#include <QWidget>
#include <memory>
#include <optional>

#include "core/ensemble/ensemble_summary.h"
#include "ui/ensemble/ensemble_runner.h"

class QCheckBox;
class QComboBox;
class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;
class QSortFilterProxyModel;
class QSpinBox;
class QTabWidget;
class QTableView;
class QTableWidget;

namespace tl::ui {

class ProjectDocument;
class PercentileTableModel;
class BreakersModel;
class OutputHistogram;
class DriversTornado;

class EnsemblePage : public QWidget {
    Q_OBJECT
public:
    explicit EnsemblePage(ProjectDocument* doc, QWidget* parent = nullptr);
    ~EnsemblePage() override;

    QString title() const { return tr("Ensemble"); }
    QString key() const { return QStringLiteral("ensemble"); }

    // Reads the settings and starts a run of the current scenario. False, with the reason
    // in statusText() naming the setting, when a setting is not valid or a run is going.
    bool run();
    void cancel();
    bool busy() const;
    void waitForIdle();  // tests and snapshots: until the run is done
    // Whether a finished run is stored with its scenario (default on; --snapshot turns it
    // off so that rendering the page changes nothing in the document).
    void setStoreRuns(bool on) { storeRuns_ = on; }

    // The run this session made that the page shows, or null.
    const EnsembleOutcome* liveOutcome() const { return live_.get(); }
    // What the tables show (a live or a stored run), or nothing.
    const std::optional<tl::ensemble::EnsembleSummary>& shownSummary() const { return shown_; }
    QString statusText() const;
    QString summaryText() const;
    QString noticeText() const;

    // The chosen output of the distribution and drivers ("Perch.ee").
    void chooseOutput(const QString& name);
    QString chosenOutput() const;

    // Shows stored run `row` of the current scenario (0 = newest); false if none.
    bool showStoredRun(int row);
    int storedRunCount() const;

    QLineEdit* drawsEdit() const { return draws_; }
    QLineEdit* seedEdit() const { return seed_; }
    QLineEdit* dietCvEdit() const { return dietCv_; }
    QSpinBox* threadsBox() const { return threads_; }
    QComboBox* shapeBox() const { return shape_; }
    QCheckBox* trophicLevelsBox() const { return tl_; }
    QCheckBox* levelsBox() const { return levels_; }
    QCheckBox* indicatorsBox() const { return indicators_; }
    QPushButton* runButton() const { return runButton_; }
    QPushButton* cancelButton() const { return cancelButton_; }
    QProgressBar* progressBar() const { return progress_; }
    QTableView* percentileView() const { return percentileView_; }
    QSortFilterProxyModel* percentileProxy() const { return percentileProxy_; }
    QTableView* breakersView() const { return breakersView_; }
    QTableWidget* storedRunsView() const { return storedRuns_; }
    OutputHistogram* histogram() const { return histogram_; }
    DriversTornado* tornado() const { return tornado_; }
    QTabWidget* tabs() const { return tabs_; }

signals:
    void runStored();  // a finished run was added to the project's stored runs

private:
    void onProgress(quint64 done, quint64 total, double seconds);
    void onFinished(std::shared_ptr<const EnsembleOutcome> outcome);
    void storeRun(const EnsembleOutcome& outcome, const std::string& summaryJson);
    void showSummary(const tl::ensemble::EnsembleSummary& summary, const QString& origin, const QString& scenario);
    void fillOutputChoice();
    void drawChosen();
    void refreshStoredRuns();
    void onScenarioChanged();
    void setRunning(bool running);
    void setStatus(const QString& text, bool problem = false);

    ProjectDocument* doc_;
    EnsembleRunner* runner_;
    std::shared_ptr<const EnsembleOutcome> live_;
    std::optional<tl::ensemble::EnsembleSummary> shown_;
    bool shownIsLive_ = false;
    bool storeRuns_ = true;
    QString shownScenario_;
    std::vector<int> storedIndex_;  // row of the stored-runs table -> index in project().runs

    QLabel* heading_;
    QLineEdit* draws_;
    QLineEdit* seed_;
    QSpinBox* threads_;
    QComboBox* shape_;
    QLineEdit* dietCv_;
    QCheckBox* tl_;
    QCheckBox* levels_;
    QCheckBox* indicators_;
    QPushButton* runButton_;
    QPushButton* cancelButton_;
    QProgressBar* progress_;
    QLabel* status_;
    QLabel* summary_;
    QLabel* notice_;
    QTabWidget* tabs_;
    QLineEdit* filter_;
    PercentileTableModel* percentiles_;
    QSortFilterProxyModel* percentileProxy_;
    QTableView* percentileView_;
    QComboBox* output_;
    OutputHistogram* histogram_;
    DriversTornado* tornado_;
    BreakersModel* breakers_;
    QTableView* breakersView_;
    QTableWidget* storedRuns_;
};

}  // namespace tl::ui

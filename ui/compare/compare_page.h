// Compare page (issue 16): pick a reference scenario and the scenarios to set beside it;
// see the inputs that differ, every output side by side with its change (icon and text),
// the level bars of the scenarios on one axis and the largest relative changes.
// A click on a row opens that cell in its scenario (the "click a row"); a click
// with Ctrl or Shift only selects (to copy rows), the arrow keys move without opening,
// and Enter opens the current row. The numbers come
// from core/compare; the charts are the report's SVG (core/io/report_svg.h).
#pragma once

#include <memory>

#include <QWidget>

#include "core/compare/scenario_comparison.h"
#include "core/store/project.h"

class QCheckBox;
class QComboBox;
class QLabel;
class QListWidget;
class QTableView;
class QTabWidget;
class QVBoxLayout;

namespace tl::ui {

class ComparedOutputsModel;
class InputDifferencesModel;
class SvgChartView;

class ComparePage : public QWidget {
    Q_OBJECT
public:
    explicit ComparePage(QWidget* parent = nullptr);
    ~ComparePage() override;

    QString title() const { return tr("Compare"); }
    QString key() const { return QStringLiteral("compare"); }

    // Shows the project's scenarios to pick from; picks whose names remain are kept
    // (a first showing picks the first scenario as reference and all others beside it).
    void setProject(const tl::Project& project);
    // Reference first. Names the project lacks are ignored.
    void pick(const QStringList& scenarios);
    QStringList picked() const;
    const tl::ScenarioComparison* comparison() const { return comparison_.get(); }
    // Comparisons of more than this many compartments in all run off the GUI thread
    // (two network analyses of 1000 compartments take seconds; tests use 0).
    void setInlineLimit(std::size_t compartments) { inlineLimit_ = compartments; }
    bool busy() const { return running_ > 0; }
    void waitForIdle();  // tests: until no comparison is running

    QTableView* inputsView() const { return inputsView_; }
    QTableView* outputsView() const { return outputsView_; }
    QTabWidget* tabs() const { return tabs_; }

signals:
    // `item` is an input key of the comparison ("biomass", "diet:Perch", ...) or an
    // output quantity ("ee", "production", ...).
    void openCell(const QString& scenario, const QString& compartment, const QString& item);

protected:
    bool eventFilter(QObject* watched, QEvent* event) override;

private:
    void recompute();
    void install(std::unique_ptr<tl::ScenarioComparison> comparison);
    void activateInput(const QModelIndex& index);
    void activateOutput(const QModelIndex& index);
    QString scenarioFor(int scenarioIndex) const;

    tl::Project project_;
    std::unique_ptr<tl::ScenarioComparison> comparison_;
    QComboBox* reference_;
    QListWidget* others_;
    QLabel* summary_;
    QTabWidget* tabs_;
    QTableView* inputsView_;
    QTableView* outputsView_;
    QCheckBox* onlyDiffering_;
    InputDifferencesModel* inputs_;
    ComparedOutputsModel* outputs_;
    SvgChartView* levelBars_;
    QVBoxLayout* changesLayout_;
    bool updating_ = false;
    std::size_t inlineLimit_ = 160;
    quint64 generation_ = 0;  // only the newest comparison is shown
    int running_ = 0;
    Qt::KeyboardModifiers clickModifiers_;  // of the last mouse release on a table
};

}  // namespace tl::ui

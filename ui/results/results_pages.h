// Results pages: the read-only views of one solved scenario that the workbench's main
// window hosts (balance sheet, level bars, flow map). Views hold no science: every
// number they show comes from core (BalanceSheet, level decomposition, flow network).
//
// Use from the main window:
//   auto pages = tl::ui::createResultsPages(tabs);      // parent owns them (Qt)
//   for (auto* p : pages) tabs->addTab(p, p->title());
//   ... after every edit + re-solve:
//   for (auto* p : pages) p->setScenario(model, sheet);
// setScenario copies what it needs and returns quickly; a page that is not visible
// defers its redraw until it is shown, so refreshing after an edit never blocks.
#pragma once

#include <QString>
#include <QWidget>
#include <memory>
#include <vector>

namespace tl {
class Model;
struct BalanceSheet;
}  // namespace tl
namespace tl::ensemble {
struct EnsembleSummary;
}  // namespace tl::ensemble

namespace tl::ui {

class ResultsPage : public QWidget {
    Q_OBJECT
public:
    using QWidget::QWidget;
    ~ResultsPage() override = default;

    // Shows the scenario. The page keeps its own copy; the arguments may die after.
    virtual void setScenario(const tl::Model& model, const tl::BalanceSheet& sheet) = 0;
    // The scenario's newest stored ensemble run (null: none): pages that can show its
    // 95 % intervals beside their figures do so (issue 15: uncertainty bands); `origin`
    // says which run ("ensemble of 2026-12-02T10:00:00Z, 20000 draws").
    virtual void setEnsembleBands(std::shared_ptr<const tl::ensemble::EnsembleSummary> summary, const QString& origin)
    {
        (void)summary;
        (void)origin;
    }
    // Tab title, translated ("Balance sheet", "Level bars", "Flow map").
    virtual QString title() const = 0;
    // Stable key for QSettings and the CLI: "balance-sheet", "level-bars", "flow-map".
    virtual QString key() const = 0;

signals:
    // A user action on the page names a compartment (double-click a row or a box);
    // the workbench may select it in its editors.
    void compartmentActivated(const QString& name);
};

// The pages in display order: balance sheet, level bars, flow map.
std::vector<ResultsPage*> createResultsPages(QWidget* parent);

}  // namespace tl::ui

// Edit-to-redraw latency of the workbench (issue 9), offscreen: one cell edit through
// the real path (CompartmentTableModel::setData -> undo command -> re-solve by the
// BalanceRunner -> every results page told) until the page on screen, the balance
// sheet or the level bars, has repainted. Synthetic model (synthetic_model.h, mix
// "ee") of 100 compartments; 10 for the smoke test. Wall-clock time (the runner may
// solve on another thread). Prints figures; asserts nothing.
//   QT_QPA_PLATFORM=offscreen gui_bench
#include <benchmark/benchmark.h>

#include <QApplication>
#include <QTemporaryDir>

#include "tests/bench/bench_support.h"
#include "ui/document/project_document.h"
#include "ui/main_window.h"
#include "ui/results/results_pages.h"
#include "ui/tables/compartment_table_model.h"
#include "ui/widgets/editing_pages.h"

namespace {

using namespace tl::bench;

tl::ui::ResultsPage* findPage(tl::ui::MainWindow& w, const QString& key)
{
    for (auto* p : w.findChildren<tl::ui::ResultsPage*>())
        if (p->key() == key) return p;
    return nullptr;
}

void editToRedraw(benchmark::State& state, std::size_t n, const char* pageKey)
{
    QTemporaryDir dir;
    tl::ui::MainWindowOptions options;
    options.recoveryDirectory = dir.path() + QStringLiteral("/recovery");
    options.useSettings = false;
    options.askBeforeClosing = false;
    tl::ui::MainWindow w(options);
    w.resize(1600, 1000);

    tl::Project project;
    project.info.title = "gui bench (invented synthetic model)";
    tl::Scenario scenario;
    scenario.name = "synthetic";
    scenario.model = cachedModel(n, UnknownMix::EE).model;
    project.scenarios.push_back(scenario);
    w.document()->setProject(project, 0, tl::ui::ProjectDocument::Origin::Untitled, {}, false);
    w.show();
    w.showPage(QString::fromLatin1(pageKey));
    tl::ui::ResultsPage* page = findPage(w, QString::fromLatin1(pageKey));
    if (!page) {
        state.SkipWithError("this build has no such results page");
        return;
    }
    w.runner()->waitForIdle();
    QApplication::processEvents();

    // Edit the biomass of a mid-web consumer (given in mix "ee"), back and forth by 1 %.
    auto* table = w.compartmentsPage()->compartments();
    const int row = static_cast<int>(n / 3);
    const QModelIndex cell = table->index(row, tl::ui::CompartmentTableModel::columnOf(tl::Param::Biomass));
    const double b = *scenario.model.compartment(static_cast<std::size_t>(row)).value(tl::Param::Biomass);
    long edits = 0;
    for (auto _ : state) {
        const double value = (edits++ % 2 == 0) ? b * 1.01 : b;
        if (!table->setData(cell, QString::number(value, 'g', 17))) {
            state.SkipWithError("the edit was refused");
            return;
        }
        w.runner()->waitForIdle();
        QApplication::processEvents();  // queued redraws (level bars rebuild on a 0 ms timer)
        page->repaint();                // paint now, as the next frame would
    }
    state.counters["balanced"] = w.lastOutcome().sheet.status == tl::BalanceStatus::Balanced;
    state.counters["solve_ms"] = w.lastOutcome().milliseconds;
}

}  // namespace

int main(int argc, char** argv)
{
    if (qEnvironmentVariableIsEmpty("QT_QPA_PLATFORM")) qputenv("QT_QPA_PLATFORM", "offscreen");
    QApplication app(argc, argv);
    for (std::size_t n : {std::size_t{10}, std::size_t{100}})
        for (const char* key : {"balance-sheet", "level-bars"})
            benchmark::RegisterBenchmark(("edit_to_redraw/" + std::string(key) + "/" + std::to_string(n)).c_str(),
                                         editToRedraw, n, key)
                ->Unit(benchmark::kMillisecond)
                ->UseRealTime();
    benchmark::Initialize(&argc, argv);
    if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
    benchmark::RunSpecifiedBenchmarks();
    benchmark::Shutdown();
    return 0;
}

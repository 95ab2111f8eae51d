#include "ui/results/results_pages.h"

#include "ui/results/balance_sheet_page.h"
#include "ui/results/flow_map_page.h"
#include "ui/results/level_bars_page.h"

namespace tl::ui {

std::vector<ResultsPage*> createResultsPages(QWidget* parent)
{
    return {new BalanceSheetPage(parent), new LevelBarsPage(parent), new FlowMapPage(parent)};
}

}  // namespace tl::ui

// Analysis pages: impact matrix and indicators, in display order. They are ResultsPage
// subclasses (ui/results/results_pages.h), hosted by the main window like the results
// pages: create once, then call setScenario after every re-solve.
#pragma once

#include <vector>

#include "ui/results/results_pages.h"

namespace tl::ui {

std::vector<ResultsPage*> createAnalysisPages(QWidget* parent);

}  // namespace tl::ui

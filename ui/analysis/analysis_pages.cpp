#include "ui/analysis/analysis_pages.h"

#include "ui/analysis/impact_matrix_page.h"
#include "ui/analysis/indicators_page.h"

namespace tl::ui {

std::vector<ResultsPage*> createAnalysisPages(QWidget* parent)
{
    return {new ImpactMatrixPage(parent), new IndicatorsPage(parent)};
}

}  // namespace tl::ui

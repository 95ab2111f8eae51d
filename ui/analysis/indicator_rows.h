// The rows of the indicators table: each system indicator of core/network/indicators.h
// (and the mean transfer efficiency of core/network/level_decomposition.h) with its unit
// from the scenario's Units and a one-line definition naming its source. Citation
// details (journal, volume, page) are those of DESIGN.md section 6; Odum 1969 is
// recalled from memory.
#pragma once

#include <QString>
#include <vector>

#include "ui/analysis/scenario_analysis.h"

namespace tl::ui {

struct IndicatorRow {
    QString key;         // the JSON key of `tledger network --json` (DESIGN 5.3) or a new one
    QString name;        // "Total system throughput (TST)"
    double value = 0.0;  // exactly the core's figure (NaN when not defined)
    QString unit;        // "t wet weight/km²/year", "bits", "dimensionless"...
    QString definition;  // one line, with its source
    bool catchFigure = false;  // depends on the harvest (shown with the decision-support line)
};

std::vector<IndicatorRow> indicatorRows(const ScenarioAnalysis& analysis);

// Value as shown in the table: 4 significant figures without exponents for ordinary
// magnitudes, integers for counts, "–" when not defined.
QString displayIndicatorValue(const IndicatorRow& row);

}  // namespace tl::ui

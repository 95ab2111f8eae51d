#include "core/store/schema.h"

#include <string>

namespace tl::store {
namespace {

// Version 1 tables. Names are unique per scenario; fractions live in [0, 1].
// Values are stored as REAL or NULL (empty = unknown / not applicable).
constexpr std::string_view kVersion1 = R"sql(
CREATE TABLE project_info (
  id INTEGER PRIMARY KEY CHECK (id = 1),
  title TEXT NOT NULL,
  notes TEXT NOT NULL,
  created TEXT NOT NULL,
  modified TEXT NOT NULL,
  program_version TEXT NOT NULL,
  currency TEXT NOT NULL,
  area TEXT NOT NULL,
  time_unit TEXT NOT NULL,
  ee_max REAL NOT NULL,
  pq_min REAL NOT NULL,
  pq_max REAL NOT NULL,
  diet_sum_tolerance REAL NOT NULL,
  cv_grade_a REAL NOT NULL,
  cv_grade_b REAL NOT NULL,
  cv_grade_c REAL NOT NULL,
  cv_grade_d REAL NOT NULL
);
CREATE TABLE scenario (
  id INTEGER PRIMARY KEY,
  name TEXT NOT NULL UNIQUE CHECK (length(trim(name)) > 0),
  position INTEGER NOT NULL,
  description TEXT NOT NULL DEFAULT '',
  parent TEXT NOT NULL DEFAULT '',
  created TEXT NOT NULL
);
CREATE TABLE compartment (
  id INTEGER PRIMARY KEY,
  scenario_id INTEGER NOT NULL REFERENCES scenario(id) ON DELETE CASCADE,
  position INTEGER NOT NULL,
  name TEXT NOT NULL CHECK (length(name) > 0),
  kind TEXT NOT NULL CHECK (kind IN ('producer', 'consumer', 'detritus')),
  diet_import REAL NOT NULL DEFAULT 0 CHECK (diet_import BETWEEN 0 AND 1),
  UNIQUE (scenario_id, name),
  UNIQUE (scenario_id, position)
);
CREATE TABLE parameter_value (
  compartment_id INTEGER NOT NULL REFERENCES compartment(id) ON DELETE CASCADE,
  parameter TEXT NOT NULL CHECK (parameter IN ('biomass', 'pb', 'qb', 'ee', 'pq', 'unassim',
                                               'biomass_accum', 'net_emigration', 'detritus_import')),
  value REAL,
  grade TEXT NOT NULL DEFAULT '' CHECK (grade IN ('', 'A', 'B', 'C', 'D')),
  cv REAL CHECK (cv IS NULL OR cv >= 0),
  source TEXT NOT NULL DEFAULT '',
  PRIMARY KEY (compartment_id, parameter)
) WITHOUT ROWID;
CREATE TABLE diet (
  predator_id INTEGER NOT NULL REFERENCES compartment(id) ON DELETE CASCADE,
  prey_id INTEGER NOT NULL REFERENCES compartment(id) ON DELETE CASCADE,
  fraction REAL NOT NULL CHECK (fraction BETWEEN 0 AND 1),
  PRIMARY KEY (predator_id, prey_id)
) WITHOUT ROWID;
CREATE INDEX diet_by_prey ON diet(prey_id);
CREATE TABLE routing (
  source_id INTEGER NOT NULL REFERENCES compartment(id) ON DELETE CASCADE,
  pool_id INTEGER NOT NULL REFERENCES compartment(id) ON DELETE CASCADE,
  fraction REAL NOT NULL CHECK (fraction BETWEEN 0 AND 1),
  PRIMARY KEY (source_id, pool_id)
) WITHOUT ROWID;
CREATE INDEX routing_by_pool ON routing(pool_id);
CREATE TABLE fleet (
  id INTEGER PRIMARY KEY,
  scenario_id INTEGER NOT NULL REFERENCES scenario(id) ON DELETE CASCADE,
  position INTEGER NOT NULL,
  name TEXT NOT NULL CHECK (length(name) > 0),
  discard_pool_id INTEGER REFERENCES compartment(id) ON DELETE SET NULL,
  UNIQUE (scenario_id, name),
  UNIQUE (scenario_id, position)
);
CREATE INDEX fleet_by_pool ON fleet(discard_pool_id);
CREATE TABLE harvest (
  fleet_id INTEGER NOT NULL REFERENCES fleet(id) ON DELETE CASCADE,
  compartment_id INTEGER NOT NULL REFERENCES compartment(id) ON DELETE CASCADE,
  landings REAL NOT NULL DEFAULT 0,
  discards REAL NOT NULL DEFAULT 0,
  discard_survival REAL NOT NULL DEFAULT 0 CHECK (discard_survival BETWEEN 0 AND 1),
  PRIMARY KEY (fleet_id, compartment_id)
) WITHOUT ROWID;
CREATE INDEX harvest_by_compartment ON harvest(compartment_id);
)sql";

// Version 2 additions.
constexpr std::string_view kVersion1To2 = R"sql(
CREATE TABLE layout_position (
  scenario_id INTEGER NOT NULL REFERENCES scenario(id) ON DELETE CASCADE,
  compartment_name TEXT NOT NULL,
  x REAL NOT NULL,
  y REAL NOT NULL,
  PRIMARY KEY (scenario_id, compartment_name)
) WITHOUT ROWID;
CREATE TABLE stored_run (
  id INTEGER PRIMARY KEY,
  scenario_id INTEGER REFERENCES scenario(id) ON DELETE CASCADE,
  kind TEXT NOT NULL CHECK (length(kind) > 0),
  settings_json TEXT NOT NULL,
  summary_json TEXT NOT NULL,
  created TEXT NOT NULL
);
CREATE INDEX stored_run_by_scenario ON stored_run(scenario_id);
)sql";

// Version 3: the plausible ranges of entered values (issue 13), editable per project;
// a file from before gets the defaults the program used then (BalanceRules). And the
// data confidence of each predator's diet row (issues 14, 15, 17): none before.
constexpr std::string_view kVersion2To3 = R"sql(
ALTER TABLE compartment ADD COLUMN diet_grade TEXT NOT NULL DEFAULT '' CHECK (diet_grade IN ('', 'A', 'B', 'C', 'D'));
ALTER TABLE compartment ADD COLUMN diet_cv REAL CHECK (diet_cv IS NULL OR diet_cv >= 0);
ALTER TABLE compartment ADD COLUMN diet_source TEXT NOT NULL DEFAULT '';
ALTER TABLE project_info ADD COLUMN plausible_biomass_max REAL NOT NULL DEFAULT 1e6 CHECK (plausible_biomass_max > 0);
ALTER TABLE project_info ADD COLUMN plausible_rate_max REAL NOT NULL DEFAULT 1e4 CHECK (plausible_rate_max > 0);
ALTER TABLE project_info ADD COLUMN plausible_flow_max REAL NOT NULL DEFAULT 1e7 CHECK (plausible_flow_max > 0);
)sql";

}  // namespace

std::string_view currentSchemaSql()
{
    static const std::string all = std::string(kVersion1) + std::string(kVersion1To2) + std::string(kVersion2To3);
    return all;
}

const std::vector<Migration>& migrations()
{
    static const std::vector<Migration> list = {{1, kVersion1To2}, {2, kVersion2To3}};
    return list;
}

}  // namespace tl::store

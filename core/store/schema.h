// Schema of a .tledger project file (a SQLite database) and its migrations.
//
// Identification: PRAGMA application_id = kApplicationId, the four ASCII bytes "TLdg"
// (0x544C6467), chosen by this project; PRAGMA user_version = schema version.
//
// Versions:
//   1  project_info, scenario, compartment, parameter_value (value + confidence),
//      diet, routing, fleet, harvest.
//   2  adds layout_position (flow-map box positions per scenario) and stored_run
//      (settings and summaries of long runs). Migration 1 -> 2 creates both tables.
//   3  adds the plausible ranges of entered values to project_info (three columns,
//      defaults as the program used before).
// A file whose user_version is above kSchemaVersion was made by a newer program and is
// opened read-only; one below is migrated step by step in one transaction.
#pragma once

#include <cstdint>
#include <string_view>
#include <vector>

namespace tl::store {

inline constexpr std::int32_t kApplicationId = 0x544C6467;  // "TLdg"
inline constexpr int kSchemaVersion = 3;

// DDL creating the current schema in an empty database.
std::string_view currentSchemaSql();

// SQL that takes a file from version `from` to `from + 1`.
struct Migration {
    int from;
    std::string_view sql;
};
const std::vector<Migration>& migrations();

}  // namespace tl::store

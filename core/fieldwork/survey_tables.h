// Survey files a research crew brings (DESIGN.md 3.8), read with the program's CSV rules
// (core/io/csv_sheet.h: RFC 4180, '.' decimal mark, every refused cell named by
// file:line:column). Each file has a header of the column keys below, in any order.
//
//   hauls.csv    station,haul,date,taxon,catch_kg + either swept_area_km2 or
//                tow_length_km and wing_spread_m; optional stratum, gear, count.
//                One row per (haul, taxon); a haul is (station, haul). A haul that
//                caught nothing is one row with an empty taxon and catch 0: it still
//                counts, as a zero, in every mean. Rows of one haul must agree on its
//                swept area, stratum and date.
//   strata.csv   stratum,area_km2: the area each stratum stands for.
//   lengths.csv  taxon,length_from_cm,length_to_cm,count: length-frequency classes
//                [from, to) of a taxon, not overlapping.
//   stomachs.csv sample,predator,prey,amount[,stomachs]: the weight (or volume) of each
//                prey taxon in a sample; a sample is one stomach, or `stomachs` stomachs
//                of one predator pooled. An empty stomach is one row with an empty prey
//                and amount 0.
//   taxa.csv     taxon,compartment: which compartment a taxon belongs to. An empty
//                compartment leaves the taxon out of the model (unidentified remains,
//                taxa not modelled); `import` marks prey taken outside the modelled area.
#pragma once

#include <filesystem>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "core/model/problem.h"

namespace tl::fieldwork {

// Where a value came from, so that estimators can name the cell.
struct CellRef {
    std::string file;
    int line = 0;
    int column = 0;
};

struct Haul {
    std::string station, haul, date, stratum, gear;
    double sweptAreaKm2 = 0.0;
    CellRef where;  // the haul's first row (its station cell)
};

struct HaulCatch {
    std::size_t haul = 0;  // index into HaulSurvey::hauls
    std::string taxon;     // empty: a haul with no catch
    double catchKg = 0.0;
    std::optional<double> count;
    CellRef taxonCell;
};

struct HaulSurvey {
    std::vector<Haul> hauls;
    std::vector<HaulCatch> catches;
    bool stratified = false;  // the file has a stratum column with at least one value
};

struct Stratum {
    std::string name;
    double areaKm2 = 0.0;
    CellRef where;
};

struct LengthClass {
    std::string taxon;
    double fromCm = 0.0, toCm = 0.0;
    double count = 0.0;
    CellRef where;  // the taxon cell of its row
    double midCm() const { return 0.5 * (fromCm + toCm); }
};

struct StomachRecord {
    std::string sample, predator, prey;  // prey empty: an empty stomach
    double amount = 0.0;
    int stomachs = 1;                    // stomachs pooled in the sample
    CellRef predatorCell, preyCell;
};

struct TaxonMapping {
    std::map<std::string, std::string, std::less<>> compartmentOf;  // taxon -> compartment ("" = left out)
    std::map<std::string, CellRef, std::less<>> cellOf;             // taxon -> its compartment cell
};

template <typename T>
struct SurveyRead {
    std::optional<T> value;  // empty when the file has an error
    Problems problems;
};

SurveyRead<HaulSurvey> readHauls(const std::filesystem::path& path);
SurveyRead<std::vector<Stratum>> readStrata(const std::filesystem::path& path);
SurveyRead<std::vector<LengthClass>> readLengths(const std::filesystem::path& path);
SurveyRead<std::vector<StomachRecord>> readStomachs(const std::filesystem::path& path);
SurveyRead<TaxonMapping> readTaxa(const std::filesystem::path& path);

// The same from text (tests, pasted tables); `file` names the source in problems.
SurveyRead<HaulSurvey> parseHauls(std::string_view text, const std::string& file);
SurveyRead<std::vector<Stratum>> parseStrata(std::string_view text, const std::string& file);
SurveyRead<std::vector<LengthClass>> parseLengths(std::string_view text, const std::string& file);
SurveyRead<std::vector<StomachRecord>> parseStomachs(std::string_view text, const std::string& file);
SurveyRead<TaxonMapping> parseTaxa(std::string_view text, const std::string& file);

// Every compartment the mapping names that `names` lacks ("import" aside), each an
// error at its cell in taxa.csv.
Problems checkMappingCompartments(const TaxonMapping& mapping, const std::vector<std::string>& names);

// A problem at a survey cell (file:line:column).
Problem surveyProblem(const char* code, const CellRef& where, std::string message, std::string hint = {});

}  // namespace tl::fieldwork

// SCOR: the plain-text exchange format of ecological flow networks (Ulanowicz & Kay
// 1991, Environ Software 6:131), read and written per the layout in
// shared/reference/SCOR_FORMAT.md:
//   line 1 title; line 2 counts n, nl in columns 1-3 and 4-6 (Fortran 2I3, fields may
//   run together); n name lines; n stock lines "iii value"; terminator (first field -1);
//   sparse import, export and respiration blocks "iii value" each ending in -1; sparse
//   flows "iiijjj value" (source, destination) ending in "-1 -1".
// Numbers may be Fortran reals without the E (".3480000+04" = 0.348e4). LF or CRLF.
// The first nl compartments are the living ones.
// The reader never throws: a malformed file gives Problems with the line (and column)
// and what was expected there.
#pragma once

#include <cstddef>
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/model/problem.h"

namespace tl {

struct ScorFlow {
    std::size_t from = 0, to = 0;  // 0-based compartment indices
    double value = 0.0;
};

struct ScorNetwork {
    std::string title;
    std::vector<std::string> names;
    std::size_t livingCount = 0;  // compartments 0..livingCount-1 are living
    std::vector<double> stocks, imports, exports, respiration;  // one per compartment
    std::vector<ScorFlow> flows;  // in file order; no duplicates
};

struct ScorReadResult {
    std::optional<ScorNetwork> network;  // set when there is no error
    Problems problems;
};

ScorReadResult readScor(std::string_view text, const std::string& fileName);
ScorReadResult readScorFile(const std::filesystem::path& path);

// Writes the layout of SCOR_FORMAT.md ("%3d%3d" counts and flow indices, shortest
// round-trip numbers, zero entries left out of sparse blocks, LF). Names and title
// containing " -1" or a line break are sanitised, since readers key on them.
// Fails (returns the message) for more than 999 compartments, negative values, or a
// name longer than limits::kMaxNameLength as written (the reader would refuse it).
std::optional<std::string> checkScorWritable(const ScorNetwork& network);
std::string writeScor(const ScorNetwork& network);
std::optional<std::string> writeScorFile(const ScorNetwork& network, const std::filesystem::path& path);  // atomic

}  // namespace tl

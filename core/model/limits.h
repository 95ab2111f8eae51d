// The largest inputs this version reads. Every reader refuses more with an error that
// names the file, the line and column (or the scenario) and the limit: memory and time
// stay bounded for a mistaken or hostile file, and nothing is cut silently.
// DEVELOPERS.md ("Limits") and `tledger --help` list them.
//
// None is near a real model: published steady-state food-web models of lakes and
// coastal waters have tens to a few hundred compartments (common practice, no source).
// The compartment limit is set by what stays usable, not by the readers: the solve
// and level decomposition of 20 000 compartments are sparse, but the network analyses
// hold n x n matrices (3.2 GB per matrix at 20 000), so `tledger network` on the
// largest models is bounded by memory, not by these limits.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace tl {
class Model;
}

namespace tl::limits {

inline constexpr std::size_t kMaxCompartments = 20'000;        // per model or scenario
inline constexpr std::size_t kMaxNameLength = 200;             // characters of a compartment or fleet name
inline constexpr std::size_t kMaxFleets = 200;                 // fleets of one model (each holds a catch per compartment)
inline constexpr std::size_t kMaxDietEntries = 2'000'000;      // non-zero diet shares of one model, imports included
inline constexpr std::uintmax_t kMaxCsvFileBytes = 256u << 20; // one CSV file of a model folder (256 MiB)
inline constexpr std::uintmax_t kMaxScorFileBytes = 64u << 20; // one SCOR file (64 MiB; at most 999 nodes)

// Characters of UTF-8 text (code points; invalid bytes count one each).
std::size_t characterCount(std::string_view utf8);

// "20 000": limits as messages show them.
std::string groupedNumber(std::uintmax_t n);

// "256 MiB", "64 MiB", or bytes when not a whole MiB.
std::string byteSize(std::uintmax_t bytes);

// What of `model` exceeds a limit, one sentence each (empty when nothing does). The
// writers refuse such a model, so that no file is written that this version cannot
// read back.
std::vector<std::string> exceededLimits(const Model& model);

}  // namespace tl::limits

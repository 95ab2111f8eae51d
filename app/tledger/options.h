// Option parsing shared by the tledger subcommands: positional arguments plus
// `--name value` options and `--flag` switches. Unknown options are usage errors.
#pragma once

#include <map>
#include <optional>
#include <ostream>
#include <set>
#include <string>
#include <vector>

namespace tl::cli {

struct ParsedOptions {
    std::vector<std::string> positional;
    std::map<std::string, std::string> values;  // "--scenario" -> "baseline"
    std::set<std::string> flags;                // "--json"

    bool has(const std::string& flag) const { return flags.count(flag) > 0; }
    std::optional<std::string> value(const std::string& name) const;
};

// valueOptions take one argument; flagOptions take none. On a usage error, writes a
// message naming the offending argument to `err` and returns nothing.
std::optional<ParsedOptions> parseOptions(const std::vector<std::string>& args, const std::set<std::string>& valueOptions,
                                          const std::set<std::string>& flagOptions, const char* command,
                                          std::ostream& err);

}  // namespace tl::cli

#include "app/tledger/options.h"

namespace tl::cli {

std::optional<std::string> ParsedOptions::value(const std::string& name) const
{
    const auto it = values.find(name);
    if (it == values.end()) return std::nullopt;
    return it->second;
}

std::optional<ParsedOptions> parseOptions(const std::vector<std::string>& args, const std::set<std::string>& valueOptions,
                                          const std::set<std::string>& flagOptions, const char* command,
                                          std::ostream& err)
{
    ParsedOptions out;
    for (std::size_t i = 0; i < args.size(); ++i) {
        const std::string& a = args[i];
        if (a.rfind("--", 0) != 0 || a == "--") {
            out.positional.push_back(a);
            continue;
        }
        std::string name = a, inlineValue;
        const bool hasInline = a.find('=') != std::string::npos;
        if (hasInline) {
            name = a.substr(0, a.find('='));
            inlineValue = a.substr(a.find('=') + 1);
        }
        if (flagOptions.count(name)) {
            out.flags.insert(name);
        } else if (valueOptions.count(name)) {
            if (hasInline) {
                out.values[name] = inlineValue;
            } else if (i + 1 < args.size()) {
                out.values[name] = args[++i];
            } else {
                err << "tledger " << command << ": option " << name << " needs a value\n";
                return std::nullopt;
            }
        } else {
            err << "tledger " << command << ": unknown option '" << a << "' (see tledger --help)\n";
            return std::nullopt;
        }
    }
    return out;
}

}  // namespace tl::cli

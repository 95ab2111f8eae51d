#include "core/model/limits.h"

#include "core/model/model.h"

namespace tl::limits {

std::size_t characterCount(std::string_view utf8)
{
    std::size_t n = 0;
    for (const char c : utf8)
        if ((static_cast<unsigned char>(c) & 0xC0) != 0x80) ++n;  // count every byte but continuation bytes
    return n;
}

std::string groupedNumber(std::uintmax_t n)
{
    const std::string digits = std::to_string(n);
    std::string out;
    for (std::size_t k = 0; k < digits.size(); ++k) {
        if (k > 0 && (digits.size() - k) % 3 == 0) out += ' ';  // a space before each group of three
        out += digits[k];
    }
    return out;
}

std::string byteSize(std::uintmax_t bytes)
{
    constexpr std::uintmax_t kMiB = 1u << 20;
    if (bytes >= kMiB && bytes % kMiB == 0) return groupedNumber(bytes / kMiB) + " MiB";
    return groupedNumber(bytes) + " bytes";
}

std::vector<std::string> exceededLimits(const Model& model)
{
    std::vector<std::string> out;
    const auto limitText = [](std::size_t limit) { return "; the limit of this version is " + groupedNumber(limit); };
    if (model.size() > kMaxCompartments)
        out.push_back(groupedNumber(model.size()) + " compartments" + limitText(kMaxCompartments));
    if (model.fleets().size() > kMaxFleets)
        out.push_back(groupedNumber(model.fleets().size()) + " fleets" + limitText(kMaxFleets));
    std::size_t dietEntries = 0;
    for (std::size_t j = 0; j < model.size(); ++j) {
        const std::string& name = model.compartment(j).name;
        if (characterCount(name) > kMaxNameLength)
            out.push_back("the name of compartment " + std::to_string(j + 1) + " has " +
                          std::to_string(characterCount(name)) + " characters" + limitText(kMaxNameLength));
        for (const GridEntry& e : model.dietRow(j)) dietEntries += e.value != 0.0 ? 1 : 0;
        dietEntries += model.dietImport(j) != 0.0 ? 1 : 0;
    }
    for (const Fleet& f : model.fleets())
        if (characterCount(f.name) > kMaxNameLength)
            out.push_back("the name of fleet '" + f.name.substr(0, 40) + "…' has " + std::to_string(characterCount(f.name)) +
                          " characters" + limitText(kMaxNameLength));
    if (dietEntries > kMaxDietEntries)
        out.push_back(groupedNumber(dietEntries) + " non-zero diet shares" + limitText(kMaxDietEntries));
    return out;
}

}  // namespace tl::limits

#include "core/model/compartment.h"

#include "core/model/text.h"

namespace tl {

std::string_view kindKey(CompartmentKind kind)
{
    switch (kind) {
    case CompartmentKind::Producer: return "producer";
    case CompartmentKind::Consumer: return "consumer";
    case CompartmentKind::Detritus: return "detritus";
    }
    return "consumer";
}

std::optional<CompartmentKind> parseKind(std::string_view text)
{
    const std::string_view t = trim(text);
    for (auto k : {CompartmentKind::Producer, CompartmentKind::Consumer, CompartmentKind::Detritus})
        if (t == kindKey(k)) return k;
    return std::nullopt;
}

std::string_view paramKey(Param p)
{
    static constexpr std::array<std::string_view, kParamCount> keys = {
        "biomass", "pb", "qb", "ee", "pq", "unassim", "biomass_accum", "net_emigration", "detritus_import"};
    return keys[static_cast<std::size_t>(p)];
}

std::string_view paramSymbol(Param p)
{
    static constexpr std::array<std::string_view, kParamCount> symbols = {
        "B", "P/B", "Q/B", "EE", "P/Q", "U", "BA", "E", "Import"};
    return symbols[static_cast<std::size_t>(p)];
}

std::optional<Param> parseParamKey(std::string_view key)
{
    for (Param p : kAllParams)
        if (paramKey(p) == key) return p;
    return std::nullopt;
}

std::string_view gradeKey(Confidence::Grade g)
{
    switch (g) {
    case Confidence::Grade::A: return "A";
    case Confidence::Grade::B: return "B";
    case Confidence::Grade::C: return "C";
    case Confidence::Grade::D: return "D";
    case Confidence::Grade::None: break;
    }
    return "";
}

std::optional<Confidence::Grade> parseGrade(std::string_view text)
{
    const std::string_view t = trim(text);
    if (t.empty()) return Confidence::Grade::None;
    for (auto g : {Confidence::Grade::A, Confidence::Grade::B, Confidence::Grade::C, Confidence::Grade::D})
        if (t == gradeKey(g)) return g;
    return std::nullopt;
}

double Compartment::unassimilatedOrDefault() const
{
    if (const auto& u = value(Param::Unassim)) return *u;
    return kind == CompartmentKind::Consumer ? 0.2 : 0.0;
}

}  // namespace tl

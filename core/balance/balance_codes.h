// Problems of the balance solver and the trophic-level step. Their codes (tl::code::k...)
// live in the one registry, core/model/problem_codes.h, with their severity and the
// sentence the Checks panel and Help show.
#pragma once

#include <string>
#include <string_view>

#include "core/model/problem.h"
#include "core/model/problem_codes.h"

namespace tl::code {

// A solver Problem (no file location, no prey, no fleet).
inline Problem makeProblem(std::string_view code, Severity severity, std::string compartment,
                           std::string_view parameter, std::string message, std::string hint = {})
{
    Problem p;
    p.code = std::string(code);
    p.severity = severity;
    p.compartment = std::move(compartment);
    p.parameter = std::string(parameter);
    p.message = std::move(message);
    p.hint = std::move(hint);
    return p;
}

}  // namespace tl::code

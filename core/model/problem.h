// Problem: errors are values (DESIGN.md 2). Validation, readers and the solver return
// lists of these; nothing throws through the UI.
#pragma once

#include <optional>
#include <string>
#include <vector>

namespace tl {

enum class Severity { Error, Warning, Info };
std::string_view severityKey(Severity s);  // "error", "warning", "info"

// Where in a text file a problem sits (1-based line and column; 0 = not known).
struct FileLocation {
    std::string file;
    int line = 0;
    int column = 0;
};

struct Problem {
    std::string code;         // stable identifier, e.g. "ee-above-one"
    Severity severity = Severity::Error;
    std::string compartment;  // name of the compartment concerned, or empty
    std::string parameter;    // parameter key ("ee", "diet", ...) or empty
    std::string message;      // one sentence a user understands
    std::string hint;         // what to do about it, or empty
    std::optional<FileLocation> location;  // set by readers of text files
    std::string prey;         // for diet problems: the prey column, or empty
    std::string fleet;        // for harvest problems: the fleet, or empty

    // "file:line:column: message" when a location is known, else the message.
    std::string describe() const;
};

using Problems = std::vector<Problem>;

bool hasErrors(const Problems& problems);

}  // namespace tl

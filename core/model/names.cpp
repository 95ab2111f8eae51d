#include "core/model/names.h"

namespace tl {

std::string nameKey(std::string_view name)
{
    std::string key;
    key.reserve(name.size());
    bool pendingSpace = false;
    for (char ch : name) {
        if (ch == ' ' || ch == '\t' || ch == '\n' || ch == '\r') {
            pendingSpace = !key.empty();  // leading space dropped, inner runs become one
            continue;
        }
        if (pendingSpace) key += ' ';
        pendingSpace = false;
        key += (ch >= 'A' && ch <= 'Z') ? static_cast<char>(ch - 'A' + 'a') : ch;
    }
    return key;
}

}  // namespace tl

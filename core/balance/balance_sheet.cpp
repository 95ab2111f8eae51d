#include "core/balance/balance_sheet.h"

namespace tl {

std::string_view statusKey(BalanceStatus s)
{
    switch (s) {
    case BalanceStatus::Balanced: return "balanced";
    case BalanceStatus::Unbalanced: return "unbalanced";
    case BalanceStatus::Invalid: return "invalid";
    }
    return "invalid";
}

}  // namespace tl

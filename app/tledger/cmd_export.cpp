// tledger export — being implemented (owner: see DEVELOPERS.md). Until then it says so.
#include <iostream>

#include "app/tledger/commands.h"

namespace tl::cli {

int cmdExport(const Args&)
{
    std::cerr << "tledger export: not available in this build yet\n";
    return 2;
}

}  // namespace tl::cli

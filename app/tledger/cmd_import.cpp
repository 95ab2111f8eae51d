// tledger import — being implemented (owner: see DEVELOPERS.md). Until then it says so.
#include <iostream>

#include "app/tledger/commands.h"

namespace tl::cli {

int cmdImport(const Args&)
{
    std::cerr << "tledger import: not available in this build yet\n";
    return 2;
}

}  // namespace tl::cli

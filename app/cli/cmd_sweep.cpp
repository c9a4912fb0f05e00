// barrow-cli sweep (see DESIGN.md for the contract). The engine behind it is not built yet.
#include "cli/cli_common.h"
#include "cli/commands.h"

namespace barrow::cli {

int runSweep(const std::vector<std::string>&) {
  throw InternalError{"'sweep' is not available yet: the sweep engine is not built in this version"};
}

}  // namespace barrow::cli

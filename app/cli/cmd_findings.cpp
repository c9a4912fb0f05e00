// barrow-cli findings (see DESIGN.md for the contract). The engine behind it is not built yet.
#include "cli/cli_common.h"
#include "cli/commands.h"

namespace barrow::cli {

int runFindings(const std::vector<std::string>&) {
  throw InternalError{"'findings' is not available yet: the continuity findings engine is not built in this version"};
}

}  // namespace barrow::cli

// barrow-cli plan (see DESIGN.md for the contract). The engine behind it is not built yet.
#include "cli/cli_common.h"
#include "cli/commands.h"

namespace barrow::cli {

int runPlan(const std::vector<std::string>&) {
  throw InternalError{"'plan' is not available yet: the exact transport solver is not built in this version"};
}

}  // namespace barrow::cli

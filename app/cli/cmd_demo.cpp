// barrow-cli demo (see DESIGN.md for the contract). The engine behind it is not built yet.
#include "cli/cli_common.h"
#include "cli/commands.h"

namespace barrow::cli {

int runDemo(const std::vector<std::string>&) {
  throw InternalError{"'demo' is not available yet: the sweep engine is not built in this version"};
}

}  // namespace barrow::cli

// The measure catalogue for `barrow-cli <command> --help`: every registered measure with its
// formula and parameters (key, default, unit, valid values, meaning).
#pragma once

#include <string>

namespace barrow::cli {

std::string measuresHelp();

}  // namespace barrow::cli

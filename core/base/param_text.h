// Short plain-text forms of a parameter's valid values, shared by the CLI help and the GUI.
#pragma once

#include <string>

#include "base/params.h"

namespace barrow {

/// "[0, 1]", "> 0", "≥ 1", "any", "true|false", "hist|kde|knn", "> 0 (or x,y) | auto".
std::string rangeShort(const ParamSpec& spec);

}  // namespace barrow

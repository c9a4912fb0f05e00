// Registers the entropic measures. Engine not built yet: nothing to register.
#include "measures/registry.h"

namespace barrow {

void registerEntropicMeasures(MeasureRegistry&) {}

}  // namespace barrow

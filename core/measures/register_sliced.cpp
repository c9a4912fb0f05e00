// Registers the sliced measures. Engine not built yet: nothing to register.
#include "measures/registry.h"

namespace barrow {

void registerSlicedMeasures(MeasureRegistry&) {}

}  // namespace barrow

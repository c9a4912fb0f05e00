// Registers the density measures. Engine not built yet: nothing to register.
#include "measures/registry.h"

namespace barrow {

void registerDensityMeasures(MeasureRegistry&) {}

}  // namespace barrow

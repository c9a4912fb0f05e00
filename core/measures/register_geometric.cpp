// Registers the geometric measures. Engine not built yet: nothing to register.
#include "measures/registry.h"

namespace barrow {

void registerGeometricMeasures(MeasureRegistry&) {}

}  // namespace barrow

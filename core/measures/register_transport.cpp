// Registers the transport measures. Engine not built yet: nothing to register.
#include "measures/registry.h"

namespace barrow {

void registerTransportMeasures(MeasureRegistry&) {}

}  // namespace barrow

// Registers the kernel measures. Engine not built yet: nothing to register.
#include "measures/registry.h"

namespace barrow {

void registerKernelMeasures(MeasureRegistry&) {}

}  // namespace barrow

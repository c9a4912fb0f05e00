// Registers the sliced Wasserstein measure.
#include "measures/registry.h"
#include "measures/sliced_measure.h"

namespace barrow {

void registerSlicedMeasures(MeasureRegistry& r) { r.add(std::make_unique<SlicedMeasure>()); }

}  // namespace barrow

// Registers the exact transport measures w1 and w2.
#include <memory>

#include "measures/registry.h"
#include "measures/wasserstein_measure.h"

namespace barrow {

void registerTransportMeasures(MeasureRegistry& r) {
  r.add(std::make_unique<WassersteinMeasure>(1));
  r.add(std::make_unique<WassersteinMeasure>(2));
}

}  // namespace barrow

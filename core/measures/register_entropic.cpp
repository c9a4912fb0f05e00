// Registers the entropic measures: entropic OT cost and the debiased Sinkhorn divergence.
#include "measures/entropic_measure.h"
#include "measures/registry.h"
#include "measures/sinkhorn_measure.h"

namespace barrow {

void registerEntropicMeasures(MeasureRegistry& r) {
  r.add(std::make_unique<EntropicMeasure>());
  r.add(std::make_unique<SinkhornMeasure>());
}

}  // namespace barrow

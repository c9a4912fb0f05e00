// Registers the geometric point-set measures: Chamfer and Hausdorff.
#include <memory>

#include "measures/chamfer_measure.h"
#include "measures/hausdorff_measure.h"
#include "measures/registry.h"

namespace barrow {

void registerGeometricMeasures(MeasureRegistry& r) {
  r.add(std::make_unique<ChamferMeasure>());
  r.add(std::make_unique<HausdorffMeasure>());
}

}  // namespace barrow

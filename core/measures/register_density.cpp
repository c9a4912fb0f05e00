// Registers the density measures: kl_ab, kl_ba, js, tv, hellinger.
#include <memory>

#include "measures/density_measures.h"
#include "measures/registry.h"

namespace barrow {

void registerDensityMeasures(MeasureRegistry& r) {
  for (DivergenceKind k : {DivergenceKind::KlAB, DivergenceKind::KlBA, DivergenceKind::Js, DivergenceKind::Tv,
                           DivergenceKind::Hellinger})
    r.add(std::make_unique<DensityMeasure>(k));
}

}  // namespace barrow

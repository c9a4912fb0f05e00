// Registers the kernel measures: MMD, energy distance, Fréchet (Gaussian W2).
#include <memory>

#include "measures/energy_measure.h"
#include "measures/frechet_measure.h"
#include "measures/mmd_measure.h"
#include "measures/registry.h"

namespace barrow {

void registerKernelMeasures(MeasureRegistry& r) {
  r.add(std::make_unique<MmdMeasure>());
  r.add(std::make_unique<EnergyMeasure>());
  r.add(std::make_unique<FrechetMeasure>());
}

}  // namespace barrow

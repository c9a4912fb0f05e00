// Registers the critic measures critic_clip, critic_gp, critic_sn (slow, not in the default set).
#include <memory>

#include "measures/critic_measure.h"
#include "measures/registry.h"

namespace barrow {

void registerCriticMeasures(MeasureRegistry& r) {
  r.add(std::make_unique<CriticMeasure>(critic::Method::Clip));
  r.add(std::make_unique<CriticMeasure>(critic::Method::Gp));
  r.add(std::make_unique<CriticMeasure>(critic::Method::Sn));
}

}  // namespace barrow

#include "scenario/demo_scenario.h"

#include "scenario/generators.h"

namespace barrow {

Session demoSession(int pointsPerBatch) {
  Session s;
  ShapeSpec batch;
  batch.shape = "segment";
  batch.count = pointsPerBatch;
  batch.center = {0.0, 0.0};
  batch.spread = 1.0;      // a scan line of length 2
  batch.angle = M_PI / 2;  // vertical
  batch.noise = 0.03;
  batch.seed = 20261202;
  s.a = generate(batch, "batch before slip");
  batch.center = {1.2, 0.15};
  batch.seed = 20261203;
  s.b = generate(batch, "batch after slip");
  s.sweep.family = Family::Shift;
  s.sweep.direction = {1.0, 0.0};
  s.sweep.from = -0.5;
  s.sweep.to = 2.5;
  s.sweep.steps = 121;
  s.sweep.reference = 0.0;
  return s;
}

}  // namespace barrow

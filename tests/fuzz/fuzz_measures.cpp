// End to end: two tiny clouds decoded from the input (fuzz_clouds.h), every cheap measure
// evaluated on them. Invariants: no crash, no hang (libFuzzer's -timeout), and status ok
// only with a finite, non-negative value (infinite only with +inf).
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz_check.h"
#include "fuzz_clouds.h"
#include "measures/evaluate.h"
#include "measures/registry.h"

using namespace barrow;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const fuzz::CloudPair in = fuzz::decodeCloudPair(data, size);
  for (const char* id : fuzz::kCheapMeasures) {
    const Measure* m = MeasureRegistry::instance().find(id);
    FUZZ_CHECK(m != nullptr, "measure %s not registered", id);
    const Result r = evaluateMeasure(*m, in.a, in.b, in.request);
    if (r.status == Status::Ok) {
      FUZZ_CHECK(std::isfinite(r.value), "%s: status ok with value %g", id, r.value);
      FUZZ_CHECK(r.value >= 0, "%s: negative value %g", id, r.value);
    }
    if (r.status == Status::Infinite)
      FUZZ_CHECK(r.value == INFINITY, "%s: status infinite with value %g", id, r.value);
  }
  return 0;
}

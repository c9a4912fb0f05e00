#include "uncertainty/replicate_loop.h"

#include "base/parallel_blocks.h"

namespace barrow {

bool runReplicates(int count, int threads, const RunControl* control,
                   const std::function<void(int, const RunControl*)>& item) {
  // Measures run their own parallel loops and report progress to the control they get; inside
  // a replicate that would interleave with ours, so they see the cancel flag only.
  RunControl inner;
  if (control) inner.cancel = control->cancel;
  WorkSlice slice;
  slice.control = control;
  return runBlocks(count, [&](int index) { item(index, &inner); }, slice, threads);
}

}  // namespace barrow

// Asks the kernel to back a freshly allocated buffer with memory in one call before it is
// written. Loading a million-point cloud touches ~100 MB of new pages; taken one fault at a
// time they cost more than the parse on a virtual machine (measured: ~8 µs per fault here,
// tests/bench/RESULTS-large-io.md). A hint only: where the kernel lacks
// MADV_POPULATE_WRITE (Linux < 5.14) or the platform lacks madvise, nothing happens.
#pragma once

#include <cstddef>

namespace barrow {

/// Populates the whole pages inside [p, p + bytes) for writing; small ranges are skipped.
void prefaultForWrite(void* p, std::size_t bytes);

}  // namespace barrow

// Asks the kernel to back a freshly allocated buffer with memory in one call, on huge pages
// where it can, before the buffer is written. Loading a million-point cloud touches ~100 MB
// of new pages; taken one 4 KiB fault at a time they cost more than the parse on the virtual
// machine the benchmarks ran on (tests/bench/RESULTS-large-io.md: the 10^6-row .npy load
// went from 213 to 26 CPU-ms with this alone). A hint only: where the kernel lacks
// MADV_POPULATE_WRITE (Linux < 5.14) or huge pages, or the platform lacks madvise, nothing
// happens.
#pragma once

#include <cstddef>

namespace barrow {

/// Populates the whole pages inside [p, p + bytes) for writing; small ranges are skipped.
void prefaultForWrite(void* p, std::size_t bytes);

}  // namespace barrow

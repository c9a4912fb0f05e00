// Training allocates and frees the same few 100-kB matrices every step. With glibc's default
// thresholds each of them is a fresh mmap (or a heap trim and regrow), and the page faults
// cost 15-20x the arithmetic (measured with perf on this project's machine). keepHeapWarm()
// raises the mmap and trim thresholds once per process so that freed blocks are reused.
// A process-wide setting: it only keeps up to 256 MB of freed memory in the heap.
#pragma once

namespace barrow::critic {

void keepHeapWarm();

}  // namespace barrow::critic

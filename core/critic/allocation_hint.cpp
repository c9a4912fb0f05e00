#include "critic/allocation_hint.h"

#include <mutex>

#if defined(__GLIBC__)
#include <malloc.h>
#endif

namespace barrow::critic {

void keepHeapWarm() {
#if defined(__GLIBC__)
  static std::once_flag once;
  std::call_once(once, [] {
    mallopt(M_MMAP_THRESHOLD, 64 << 20);
    mallopt(M_TRIM_THRESHOLD, 256 << 20);
  });
#endif
}

}  // namespace barrow::critic

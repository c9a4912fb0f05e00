#include "base/cpu_features.h"

#include <cstdlib>
#include <string_view>

namespace barrow {

bool cpuHasAvx2Fma() {
  static const bool yes = [] {
    const char* off = std::getenv("BARROW_NO_AVX2");
    if (off && *off && std::string_view(off) != "0") return false;
#ifdef BARROW_X86_SIMD
    __builtin_cpu_init();
    return __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma");
#else
    return false;
#endif
  }();
  return yes;
}

}  // namespace barrow

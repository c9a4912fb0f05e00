// The run-time choice of the vector kernels: AVX2+FMA when the CPU reports both, the generic
// form otherwise or when BARROW_NO_AVX2 is set (CTest core_generic_kernels runs the kernel
// tests that way, so both forms are checked on an AVX2 machine).
#include <gtest/gtest.h>

#include <cstdlib>
#include <string>

#include "base/cpu_features.h"

namespace barrow {
namespace {

TEST(CpuFeaturesTest, ChoiceFollowsTheCpuAndTheEnvironmentSwitch) {
  const char* off = std::getenv("BARROW_NO_AVX2");
  if (off && *off && std::string(off) != "0") {
    EXPECT_FALSE(cpuHasAvx2Fma());
    return;
  }
#ifdef BARROW_X86_SIMD
  EXPECT_EQ(cpuHasAvx2Fma(), __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma"));
#else
  EXPECT_FALSE(cpuHasAvx2Fma());
#endif
}

}  // namespace
}  // namespace barrow

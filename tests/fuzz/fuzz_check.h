// What a fuzz target does when an invariant fails: print it and abort, so libFuzzer keeps
// the input as a crash (an exception would be caught as "uncaught exception" all the same,
// but abort() names the broken rule in the log).
#pragma once

#include <cstdio>
#include <cstdlib>

#define FUZZ_CHECK(cond, ...)                                  \
  do {                                                         \
    if (!(cond)) {                                             \
      std::fprintf(stderr, "fuzz invariant failed: %s: ", #cond); \
      std::fprintf(stderr, __VA_ARGS__);                       \
      std::fprintf(stderr, "\n");                              \
      std::abort();                                            \
    }                                                          \
  } while (0)

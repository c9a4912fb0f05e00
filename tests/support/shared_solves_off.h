// Turns the shared store of entropic solves (transport/sinkhorn_cache.h) off for one test's
// scope: for tests of the warm start itself, whose second request on the same clouds the
// store would otherwise answer with the first solve. Emptied on the way in and out, so no
// solve crosses into another test.
#pragma once

#include "transport/sinkhorn_cache.h"

namespace barrow::test {

struct SharedSolvesOff {
  SharedSolvesOff() {
    SinkhornCache::shared().clear();
    SinkhornCache::shared().setEnabled(false);
  }
  ~SharedSolvesOff() {
    SinkhornCache::shared().setEnabled(true);
    SinkhornCache::shared().clear();
  }
  SharedSolvesOff(const SharedSolvesOff&) = delete;
  SharedSolvesOff& operator=(const SharedSolvesOff&) = delete;
};

}  // namespace barrow::test

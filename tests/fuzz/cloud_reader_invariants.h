// The invariants every cloud reader keeps on any input, written once for the fuzz targets
// (fuzz_csv, fuzz_npy) and for the replay of their saved inputs in the ordinary test build
// (tests/core/fuzz_regressions_test.cpp): a refusal is one short line; an accepted cloud is
// valid, no larger than the input can hold, and survives a write/read round trip.
#pragma once

#include <cstddef>
#include <string>

#include "cloud/cloud.h"
#include "io/load_error.h"

namespace barrow::fuzz {

/// The first broken invariant for `bytes` read by `parse` (and written back by `format`), or
/// "" when all hold. `bytesPerPoint`: the least input one accepted point needs.
template <class Parse, class Format>
std::string cloudReaderViolation(const std::string& bytes, Parse parse, Format format, std::size_t bytesPerPoint) {
  const Loaded<Cloud> loaded = parse(bytes, "fuzz-input");
  if (!loaded) {
    const std::string msg = loaded.error.text();
    if (msg.find('\n') != std::string::npos) return "the refusal message has a line break";
    if (msg.size() >= 400) return "a refusal message of " + std::to_string(msg.size()) + " bytes";
    return "";
  }
  const Cloud& c = *loaded.value;
  if (auto why = c.validate()) return "accepted an invalid cloud: " + *why;
  if (std::size_t(c.size()) * bytesPerPoint > bytes.size())
    return std::to_string(c.size()) + " points from " + std::to_string(bytes.size()) + " bytes";
  const Loaded<Cloud> again = parse(format(c), "round-trip");
  if (!again) return "the round trip was refused: " + again.error.text();
  if (!(again.value->points == c.points)) return "the round trip moved a point";
  return "";
}

}  // namespace barrow::fuzz

// .npy cloud reader: any bytes give a cloud or a one-line error, never a crash or an
// allocation bigger than the input; an accepted cloud is valid and round-trips.
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz_check.h"
#include "io/npy_io.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string bytes(reinterpret_cast<const char*>(data), size);
  const auto loaded = barrow::parseCloudNpy(bytes, "fuzz.npy");
  if (!loaded) {
    const std::string msg = loaded.error.text();
    FUZZ_CHECK(msg.find('\n') == std::string::npos, "message has a line break");
    FUZZ_CHECK(msg.size() < 400, "message of %zu bytes", msg.size());
    return 0;
  }
  const barrow::Cloud& c = *loaded.value;
  FUZZ_CHECK(!c.validate(), "accepted an invalid cloud: %s", c.validate()->c_str());
  // Each point needs at least 2 values of >= 1 byte in the data part.
  FUZZ_CHECK(std::size_t(c.size()) * 2 <= size, "%ld points from %zu bytes", long(c.size()), size);
  const auto again = barrow::parseCloudNpy(barrow::formatCloudNpy(c), "again.npy");
  FUZZ_CHECK(bool(again), "round trip refused: %s", again.error.text().c_str());
  FUZZ_CHECK(again.value->points == c.points, "round trip moved a point");
  return 0;
}

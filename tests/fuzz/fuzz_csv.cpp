// CSV cloud reader: any bytes give a cloud or a one-line error, never a crash; a cloud it
// accepts is valid and survives a write/read round trip unchanged.
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz_check.h"
#include "io/csv_io.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  const auto loaded = barrow::parseCloudCsv(text, "fuzz.csv");
  if (!loaded) {
    const std::string msg = loaded.error.text();
    FUZZ_CHECK(msg.find('\n') == std::string::npos, "message has a line break");
    FUZZ_CHECK(msg.size() < 400, "message of %zu bytes", msg.size());
    return 0;
  }
  const barrow::Cloud& c = *loaded.value;
  FUZZ_CHECK(!c.validate(), "accepted an invalid cloud: %s", c.validate()->c_str());
  const auto again = barrow::parseCloudCsv(barrow::formatCloudCsv(c), "again.csv");
  FUZZ_CHECK(bool(again), "round trip refused: %s", again.error.text().c_str());
  FUZZ_CHECK(again.value->points == c.points, "round trip moved a point");
  return 0;
}

// Session reader: any bytes give a session or a one-line error, never a crash (deep
// nesting, numbers out of range); an accepted session writes back to text that reads to
// the same text again (format ∘ parse is idempotent).
#include <cstddef>
#include <cstdint>
#include <string>

#include "fuzz_check.h"
#include "io/session_io.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  const auto loaded = barrow::parseSession(text, "fuzz.json");
  if (!loaded) {
    const std::string msg = loaded.error.text();
    FUZZ_CHECK(msg.find('\n') == std::string::npos, "message has a line break");
    return 0;
  }
  FUZZ_CHECK(!loaded.value->a.validate(), "cloud A invalid: %s", loaded.value->a.validate()->c_str());
  FUZZ_CHECK(!loaded.value->b.validate(), "cloud B invalid: %s", loaded.value->b.validate()->c_str());
  const std::string once = barrow::formatSession(*loaded.value);
  const auto again = barrow::parseSession(once, "again.json");
  FUZZ_CHECK(bool(again), "written session refused: %s", again.error.text().c_str());
  FUZZ_CHECK(barrow::formatSession(*again.value) == once, "second write differs");
  return 0;
}

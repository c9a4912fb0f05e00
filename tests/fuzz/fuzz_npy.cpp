// .npy cloud reader: any bytes give a cloud or a one-line error, never a crash or an
// allocation bigger than the input (the invariants are in cloud_reader_invariants.h).
#include <cstddef>
#include <cstdint>
#include <string>

#include "cloud_reader_invariants.h"
#include "fuzz_check.h"
#include "io/npy_io.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string bytes(reinterpret_cast<const char*>(data), size);
  const std::string broken = barrow::fuzz::cloudReaderViolation(
      bytes, [](const std::string& b, const std::string& f) { return barrow::parseCloudNpy(b, f); },
      [](const barrow::Cloud& c) { return barrow::formatCloudNpy(c); }, 2);
  FUZZ_CHECK(broken.empty(), "%s", broken.c_str());
  return 0;
}

// SHA-256 (FIPS 180-4), for the content hash of each cloud in a report: a teammate can check
// that the report was made from the files they hold.
#pragma once

#include <string>

namespace barrow {

/// Lower-case hex digest of `bytes`.
std::string sha256Hex(const std::string& bytes);

}  // namespace barrow

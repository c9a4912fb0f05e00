// Writes a file so that readers see either the old content or the whole new content.
#pragma once

#include <cstddef>
#include <optional>
#include <string>

namespace barrow {

/// Test hook: when set, the write fails after this many bytes (simulates a full disk or a
/// crash in the middle of a save).
struct WriteFault {
  std::size_t failAfterBytes = 0;
};

/// Writes `content` to a temporary file beside `path`, flushes it to disk, then renames it
/// over `path`. On failure the temporary file is removed, `path` is untouched, and the
/// reason (naming the file) is returned.
std::optional<std::string> atomicWriteFile(const std::string& path, const std::string& content,
                                           const WriteFault* fault = nullptr);

/// Reads a whole file; nullopt when it cannot be opened (reason in `error`).
std::optional<std::string> readWholeFile(const std::string& path, std::string* error);

}  // namespace barrow

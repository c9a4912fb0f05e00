// A whole file read into one uninitialised block with as few read() calls as the kernel
// allows: loading a 60 MB cloud should not first zero 60 MB (std::string(size, '\0')) and
// then copy into it. Used by the cloud readers (CSV, .npy).
#pragma once

#include <cstddef>
#include <memory>
#include <optional>
#include <string>
#include <string_view>

namespace barrow {

class FileBlock {
 public:
  std::string_view text() const { return {data_.get(), size_}; }

  /// The file's bytes, or nullopt with the reason in `error` ("it is a directory, not a
  /// file", the system's reason for a failed open, "read failed"). Pipes and other files of
  /// unknown size are read to their end.
  static std::optional<FileBlock> read(const std::string& path, std::string* error);

 private:
  std::unique_ptr<char[]> data_;
  std::size_t size_ = 0;
};

}  // namespace barrow

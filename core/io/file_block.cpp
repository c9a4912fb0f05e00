#include "io/file_block.h"

#include "io/page_prefault.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>

namespace barrow {

namespace {

struct Fd {
  int fd;
  ~Fd() {
    if (fd >= 0) ::close(fd);
  }
};

}  // namespace

std::optional<FileBlock> FileBlock::read(const std::string& path, std::string* error) {
  auto failed = [&](std::string why) {
    if (error) *error = std::move(why);
    return std::optional<FileBlock>();
  };
  const Fd f{::open(path.c_str(), O_RDONLY | O_CLOEXEC)};
  if (f.fd < 0) return failed(std::strerror(errno));
  struct stat st {};
  if (::fstat(f.fd, &st) != 0) return failed(std::strerror(errno));
  if (S_ISDIR(st.st_mode)) return failed("it is a directory, not a file");

  FileBlock block;
  // Regular files: one block of the stated size (grown below should the file grow while
  // read). Anything else (a pipe): start small and double.
  std::size_t capacity = S_ISREG(st.st_mode) ? std::size_t(st.st_size) + 1 : std::size_t(1) << 16;
  block.data_.reset(new char[capacity]);  // default-initialised: no zeroing pass
  prefaultForWrite(block.data_.get(), capacity);
  while (true) {
    if (block.size_ == capacity) {
      const std::size_t grown = capacity * 2;
      std::unique_ptr<char[]> bigger(new char[grown]);
      std::memcpy(bigger.get(), block.data_.get(), block.size_);
      block.data_ = std::move(bigger);
      capacity = grown;
    }
    const ssize_t k = ::read(f.fd, block.data_.get() + block.size_, capacity - block.size_);
    if (k < 0) {
      if (errno == EINTR) continue;
      return failed("read failed");
    }
    if (k == 0) break;
    block.size_ += std::size_t(k);
  }
  return block;
}

}  // namespace barrow

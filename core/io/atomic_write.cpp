#include "io/atomic_write.h"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>

namespace barrow {

std::optional<std::string> atomicWriteFile(const std::string& path, const std::string& content,
                                           const WriteFault* fault) {
  std::random_device rd;
  const std::string tmp = path + ".tmp-" + std::to_string(rd() % 1000000);
  const int fd = ::open(tmp.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
  if (fd < 0) return path + ": cannot create temporary file: " + std::strerror(errno);

  auto failWith = [&](const std::string& why) {
    ::close(fd);
    ::unlink(tmp.c_str());
    return std::optional<std::string>(path + ": " + why);
  };

  std::size_t limit = content.size();
  if (fault && fault->failAfterBytes < limit) limit = fault->failAfterBytes;
  std::size_t done = 0;
  while (done < limit) {
    const ssize_t k = ::write(fd, content.data() + done, limit - done);
    if (k < 0) {
      if (errno == EINTR) continue;
      return failWith(std::string("write failed: ") + std::strerror(errno));
    }
    done += std::size_t(k);
  }
  if (fault && fault->failAfterBytes < content.size())
    return failWith("write failed after " + std::to_string(done) + " bytes (simulated fault)");
  if (::fsync(fd) != 0) return failWith(std::string("flush failed: ") + std::strerror(errno));
  if (::close(fd) != 0) {
    ::unlink(tmp.c_str());
    return path + ": close failed: " + std::strerror(errno);
  }
  if (std::rename(tmp.c_str(), path.c_str()) != 0) {
    const std::string why = std::strerror(errno);
    ::unlink(tmp.c_str());
    return path + ": rename failed: " + why;
  }
  return std::nullopt;
}

std::optional<std::string> readWholeFile(const std::string& path, std::string* error) {
  // An ifstream opens a directory without complaint and then reads nothing: say what it is.
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) {
    if (error) *error = "it is a directory, not a file";
    return std::nullopt;
  }
  std::ifstream in(path, std::ios::binary);
  if (!in) {
    if (error) *error = std::strerror(errno);
    return std::nullopt;
  }
  // One buffer of the file's size (a stringstream would hold the content twice).
  in.seekg(0, std::ios::end);
  const std::streamoff size = in.tellg();
  in.seekg(0, std::ios::beg);
  if (size < 0) {  // not seekable (a pipe): read it as a stream
    std::ostringstream s;
    s << in.rdbuf();
    return s.str();
  }
  std::string out(std::size_t(size), '\0');
  if (!in.read(out.data(), size)) {
    if (error) *error = "read failed";
    return std::nullopt;
  }
  return out;
}

}  // namespace barrow

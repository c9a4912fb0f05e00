#include "io/cloud_file.h"

#include <algorithm>

#include "io/csv_io.h"
#include "io/npy_io.h"

namespace barrow {

namespace {
bool isNpy(std::string path) {
  std::transform(path.begin(), path.end(), path.begin(), ::tolower);
  return path.size() >= 4 && path.compare(path.size() - 4, 4, ".npy") == 0;
}
}  // namespace

Loaded<Cloud> readCloudFile(const std::string& path) {
  return isNpy(path) ? readCloudNpy(path) : readCloudCsv(path);
}

std::optional<std::string> writeCloudFile(const std::string& path, const Cloud& c) {
  return isNpy(path) ? writeCloudNpy(path, c) : writeCloudCsv(path, c);
}

}  // namespace barrow

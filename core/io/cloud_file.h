// Reads or writes a cloud, choosing the format by the file's extension (.npy, else CSV).
#pragma once

#include <optional>
#include <string>

#include "cloud/cloud.h"
#include "io/load_error.h"

namespace barrow {

Loaded<Cloud> readCloudFile(const std::string& path);
std::optional<std::string> writeCloudFile(const std::string& path, const Cloud& c);

}  // namespace barrow

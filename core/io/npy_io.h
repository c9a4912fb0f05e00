// NumPy .npy arrays of shape (n,2) [x,y] or (n,3) [x,y,w]: float32/64 and integer dtypes,
// either byte order, C or Fortran order, format versions 1.0, 2.0 and 3.0.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "cloud/cloud.h"
#include "io/load_error.h"

namespace barrow {

Loaded<Cloud> parseCloudNpy(std::string_view bytes, const std::string& file);
Loaded<Cloud> readCloudNpy(const std::string& path);

/// Version 1.0, little-endian float64, shape (n,3) = x, y, w, C order.
std::string formatCloudNpy(const Cloud& c);
std::optional<std::string> writeCloudNpy(const std::string& path, const Cloud& c);

}  // namespace barrow

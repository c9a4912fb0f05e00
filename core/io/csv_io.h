// Point clouds as delimited text: columns x,y[,w]; header optional; comma, semicolon, tab or
// whitespace separated; '#' starts a comment; blank lines and CRLF line ends are accepted.
#pragma once

#include <optional>
#include <string>
#include <string_view>

#include "cloud/cloud.h"
#include "io/load_error.h"

namespace barrow {

/// Parses CSV text; `file` is only used in messages. Without a w column weights are uniform.
Loaded<Cloud> parseCloudCsv(std::string_view text, const std::string& file);
/// Reads a file; the cloud is named after the file's stem.
Loaded<Cloud> readCloudCsv(const std::string& path);

/// "x,y,w" header and one row per point, with enough digits to read back exactly.
std::string formatCloudCsv(const Cloud& c);
/// Atomic write; returns the reason on failure.
std::optional<std::string> writeCloudCsv(const std::string& path, const Cloud& c);

/// File name without folders and extension ("data/a.csv" -> "a").
std::string fileStem(const std::string& path);

}  // namespace barrow

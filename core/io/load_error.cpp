#include "io/load_error.h"

namespace barrow {

namespace {

// Text taken from a file (a header value, a field, a key) may hold line breaks or other
// control characters; shown as '?' so that the message stays on one line.
std::string oneLine(const std::string& s) {
  std::string out = s;
  for (char& c : out)
    if (static_cast<unsigned char>(c) < 0x20 || c == 0x7f) c = '?';
  return out;
}

}  // namespace

std::string LoadError::text() const {
  // Built with append() rather than operator+ chains: GCC 12 warns falsely (-Wrestrict) there.
  std::string s;
  s.append(file.empty() ? "<input>" : file);
  if (line > 0) s.append(":").append(std::to_string(line));
  s.append(": ");
  if (!field.empty()) s.append("field '").append(oneLine(field)).append("': ");
  s.append(oneLine(reason));
  return s;
}

}  // namespace barrow

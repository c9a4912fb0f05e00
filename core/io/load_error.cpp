#include "io/load_error.h"

namespace barrow {

std::string LoadError::text() const {
  // Built with append() rather than operator+ chains: GCC 12 warns falsely (-Wrestrict) there.
  std::string s;
  s.append(file.empty() ? "<input>" : file);
  if (line > 0) s.append(":").append(std::to_string(line));
  s.append(": ");
  if (!field.empty()) s.append("field '").append(field).append("': ");
  s.append(reason);
  return s;
}

}  // namespace barrow

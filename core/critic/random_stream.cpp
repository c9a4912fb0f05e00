#include "critic/random_stream.h"

#include <cmath>

namespace barrow::critic {

double RandomStream::normal() {
  const double u1 = 1.0 - uniform();  // (0, 1]: log stays finite
  const double u2 = uniform();
  return std::sqrt(-2.0 * std::log(u1)) * std::cos(2.0 * M_PI * u2);
}

}  // namespace barrow::critic

#include "base/run_control.h"

#include <thread>

namespace barrow {

int defaultThreadCount() {
  const unsigned hc = std::thread::hardware_concurrency();
  return hc == 0 ? 1 : int(hc);
}

int threadBudget(const RunControl* control) {
  return control && control->threads > 0 ? control->threads : defaultThreadCount();
}

}  // namespace barrow

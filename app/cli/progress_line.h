// Progress of a long CLI run on stderr: what is running, the fraction done, time elapsed and an
// estimate of the time left. On a terminal one line is rewritten in place (at most 5 times a
// second) from the first second on; into a file or pipe a line is added every 10 s once the run
// has passed 10 s, so logs stay short and short scripted runs leave stderr empty.
#pragma once

#include <chrono>
#include <mutex>
#include <string>

#include "base/run_control.h"

namespace barrow::cli {

class ProgressLine {
 public:
  ProgressLine();
  /// Reports `fraction` (0..1) of the whole run, now doing `what`; `left` is the caller's
  /// estimate of the seconds left (< 0: extrapolate from the fraction and the time so far).
  void show(const std::string& what, double fraction, double left = -1.0);
  /// Ends the line (when one was shown) with `text`.
  void finish(const std::string& text);
  double elapsed() const;

 private:
  std::mutex mutex_;
  std::chrono::steady_clock::time_point start_, last_;
  bool terminal_ = false;
  bool shown_ = false;
};

/// "42% · 4.1 s elapsed · about 9 s left" (the remaining part omitted when unknown).
std::string progressText(double fraction, double elapsed, double left);

}  // namespace barrow::cli

#include "cli/progress_line.h"

#include <unistd.h>

#include <algorithm>
#include <cstdio>

#include "measures/time_estimate.h"

namespace barrow::cli {

ProgressLine::ProgressLine()
    : start_(std::chrono::steady_clock::now()), last_(start_), terminal_(isatty(STDERR_FILENO) != 0) {}

double ProgressLine::elapsed() const {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
}

std::string progressText(double fraction, double elapsed, double left) {
  const int percent = int(std::clamp(fraction, 0.0, 1.0) * 100.0);
  std::string t = std::to_string(percent) + "% · " + estimateText(elapsed) + " elapsed";
  if (left < 0.0 && fraction > 0.02) left = elapsed * (1.0 - fraction) / fraction;
  if (left >= 0.0) t += " · about " + estimateText(left) + " left";
  return t;
}

void ProgressLine::show(const std::string& what, double fraction, double left) {
  const auto now = std::chrono::steady_clock::now();
  std::lock_guard<std::mutex> lock(mutex_);
  const double sinceStart = std::chrono::duration<double>(now - start_).count();
  const double sinceLast = std::chrono::duration<double>(now - last_).count();
  // A terminal sees the line from the first second; a pipe or file only once the run has
  // passed 10 s, so the stderr of short scripted runs stays empty.
  if (sinceStart < (terminal_ ? 1.0 : 10.0) || (shown_ && sinceLast < (terminal_ ? 0.2 : 10.0))) return;
  last_ = now;
  const std::string text = what + ": " + progressText(fraction, sinceStart, left);
  if (terminal_) std::fprintf(stderr, "\r\033[K%s", text.c_str());
  else std::fprintf(stderr, "%s\n", text.c_str());
  std::fflush(stderr);
  shown_ = true;
}

void ProgressLine::finish(const std::string& text) {
  std::lock_guard<std::mutex> lock(mutex_);
  if (!shown_) return;
  if (terminal_) std::fprintf(stderr, "\r\033[K%s\n", text.c_str());
  else std::fprintf(stderr, "%s\n", text.c_str());
}

}  // namespace barrow::cli

#include "cli/interrupt.h"

#include <csignal>
#include <unistd.h>

namespace barrow::cli {
namespace {

std::atomic<bool> g_stop{false};

extern "C" void onInterrupt(int) {
  if (g_stop.exchange(true)) _exit(kExitInterrupted);  // the second Ctrl+C: leave now
  static const char kText[] = "\nbarrow-cli: stopping after the current step (Ctrl+C again to quit at once)\n";
  const ssize_t ignored = write(STDERR_FILENO, kText, sizeof kText - 1);  // async-signal-safe
  (void)ignored;
}

}  // namespace

const std::atomic<bool>* interruptFlag() {
  static const bool installed = [] {
    struct sigaction sa {};
    sa.sa_handler = onInterrupt;
    sigemptyset(&sa.sa_mask);
    sigaction(SIGINT, &sa, nullptr);
    return true;
  }();
  (void)installed;
  return &g_stop;
}

bool interrupted() { return g_stop.load(); }

}  // namespace barrow::cli

// Ctrl+C for long runs: the first asks the running computation to stop at its next check
// (whatever finished is still written), a second ends the program at once.
#pragma once

#include <atomic>

namespace barrow::cli {

/// Installs the SIGINT handler (once) and returns the flag it sets, for RunControl::cancel.
const std::atomic<bool>* interruptFlag();

/// True once Ctrl+C was pressed.
bool interrupted();

/// The exit code after an interrupt (128 + SIGINT, as shells report it).
constexpr int kExitInterrupted = 130;

}  // namespace barrow::cli

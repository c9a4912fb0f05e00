// Helpers shared by the test suites: paths, temporary files, and running Debian's Python
// (SciPy/NumPy/scikit-learn) as an outside reference.
#pragma once

#include <string>

#include "cloud/cloud.h"

namespace barrow::test {

std::string samplesDir();
std::string dataDir();
/// A fresh path under the build tree's tmp folder (the file is not created).
std::string tempPath(const std::string& name);
/// Writes text to a file (plain write; tests only).
void writeText(const std::string& path, const std::string& text);
std::string readText(const std::string& path);

/// Runs `script` with /usr/bin/python3 and returns its stdout; fails the test (and returns
/// "") when the interpreter exits non-zero.
std::string runPython(const std::string& script);
/// True when /usr/bin/python3 can import the given modules (e.g. "scipy, numpy").
bool pythonHas(const std::string& modules);

/// Runs a shell command; returns the exit code, stdout and stderr go to the strings.
int runCommand(const std::string& cmd, std::string* out, std::string* err);

/// A cloud as Python source "np.array([[x,y],...])" with full precision.
std::string pyPoints(const Cloud& c);
/// Normalised weights as "np.array([...])".
std::string pyWeights(const Cloud& c);

}  // namespace barrow::test

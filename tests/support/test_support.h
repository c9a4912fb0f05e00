// Helpers shared by the test suites: paths, temporary files, and running Debian's Python
// (SciPy/NumPy/scikit-learn) as an outside reference.
#pragma once

#include <optional>
#include <string>

#include "cloud/cloud.h"
#include "measures/evaluate.h"
#include "measures/measure.h"

namespace barrow::test {

std::string samplesDir();
std::string dataDir();
/// A fresh path under the build tree's tmp folder (the file is not created).
std::string tempPath(const std::string& name);
/// Writes text to a file (plain write; tests only).
void writeText(const std::string& path, const std::string& text);
/// Writes n points uniform on [shift, 1+shift] x [0, 1] (header x,y, 17 digits) to a temporary
/// CSV named `name`, from a seeded generator; returns its path.
std::string uniformSquareCsv(const std::string& name, int n, double shift, unsigned seed);
std::string readText(const std::string& path);

/// Runs `script` with /usr/bin/python3 and returns its stdout; fails the test (and returns
/// "") when the interpreter exits non-zero.
std::string runPython(const std::string& script);
/// True when /usr/bin/python3 can import the given modules (e.g. "scipy, numpy").
bool pythonHas(const std::string& modules);

/// Runs a shell command; returns the exit code, stdout and stderr go to the strings.
int runCommand(const std::string& cmd, std::string* out, std::string* err);

/// Settings for the entropic measures (`group` = "entropic" or "sinkhorn"): ε, p and the
/// marginal tolerance, written so that they read back exactly.
EvalRequest entropicRequest(const std::string& group, double epsilon, int p, double tolerance);

/// n points with both coordinates offset + N(0, spread²) and weights uniform in [0.1, 1)
/// (or all 1 when !randomWeights), from std::mt19937(seed): reproducible test data.
Cloud gaussianCloud(int n, unsigned seed, double offset = 0.0, double spread = 1.0, bool randomWeights = true);
/// The same with a mean and a spread per axis (x: N(mean.x, spread.x²), y likewise).
Cloud gaussianCloud(int n, unsigned seed, const Eigen::Vector2d& mean, const Eigen::Vector2d& spread,
                    bool randomWeights);

/// A cloud as Python source "np.array([[x,y],...])" with full precision.
std::string pyPoints(const Cloud& c);
/// Normalised weights as "np.array([...])".
std::string pyWeights(const Cloud& c);

/// dD/dx_i by central differences of m's value (through evaluateMeasure with `params`),
/// moving one coordinate of one point of A at a time by +-h (n x 2).
Eigen::MatrixX2d finiteDifferenceGradientA(const Measure& m, const Cloud& a, const Cloud& b, const ParamSet& params,
                                           double h);
/// m.gradientA on (a, b) with `params` resolved, after evaluating with the plan only when
/// m.gradientNeedsPlan() (as a sweep does).
std::optional<Eigen::MatrixX2d> analyticGradientA(const Measure& m, const Cloud& a, const Cloud& b,
                                                  const ParamSet& params);

}  // namespace barrow::test

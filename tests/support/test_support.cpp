#include "support/test_support.h"

#include <gtest/gtest.h>
#include <sys/wait.h>

#include <cstdio>
#include <fstream>
#include <random>
#include <sstream>

#include "measures/evaluate.h"

namespace barrow::test {

std::string samplesDir() { return BARROW_SAMPLES_DIR; }
std::string dataDir() { return BARROW_TEST_DATA_DIR; }

std::string tempPath(const std::string& name) {
  static std::mt19937_64 rng(std::random_device{}());
  return std::string(BARROW_TEST_TMP_DIR) + "/" + std::to_string(rng() % 100000000) + "-" + name;
}

void writeText(const std::string& path, const std::string& text) {
  std::ofstream out(path, std::ios::binary);
  out << text;
}

std::string readText(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

int runCommand(const std::string& cmd, std::string* out, std::string* err) {
  const std::string errFile = tempPath("stderr.txt");
  FILE* p = popen((cmd + " 2>" + errFile).c_str(), "r");
  if (!p) return -1;
  std::string text;
  char buf[4096];
  std::size_t k;
  while ((k = fread(buf, 1, sizeof buf, p)) > 0) text.append(buf, k);
  const int status = pclose(p);
  if (out) *out = text;
  if (err) *err = readText(errFile);
  std::remove(errFile.c_str());
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

std::string runPython(const std::string& script) {
  const std::string path = tempPath("ref.py");
  writeText(path, script);
  std::string out, err;
  const int rc = runCommand(std::string(BARROW_PYTHON3) + " " + path, &out, &err);
  std::remove(path.c_str());
  EXPECT_EQ(rc, 0) << "python reference failed:\n" << err;
  return rc == 0 ? out : std::string();
}

bool pythonHas(const std::string& modules) {
  return runCommand(std::string(BARROW_PYTHON3) + " -c 'import " + modules + "'", nullptr, nullptr) == 0;
}

std::string pyPoints(const Cloud& c) {
  std::ostringstream s;
  s.precision(17);
  s << "np.array([";
  for (Eigen::Index i = 0; i < c.size(); ++i) s << "[" << c.points(i, 0) << "," << c.points(i, 1) << "],";
  s << "]).reshape(-1, 2)";
  return s.str();
}

std::string pyWeights(const Cloud& c) {
  std::ostringstream s;
  s.precision(17);
  const Eigen::VectorXd w = c.normalizedWeights();
  s << "np.array([";
  for (Eigen::Index i = 0; i < w.size(); ++i) s << w(i) << ",";
  s << "])";
  return s.str();
}

Eigen::MatrixX2d finiteDifferenceGradientA(const Measure& m, const Cloud& a, const Cloud& b, const ParamSet& params,
                                           double h) {
  EvalRequest req;
  req.params = params;
  Eigen::MatrixX2d g(a.size(), 2);
  for (Eigen::Index i = 0; i < a.size(); ++i)
    for (int c = 0; c < 2; ++c) {
      Cloud ap = a, am = a;
      ap.points(i, c) += h;
      am.points(i, c) -= h;
      g(i, c) = (evaluateMeasure(m, ap, b, req).value - evaluateMeasure(m, am, b, req).value) / (2 * h);
    }
  return g;
}

std::optional<Eigen::MatrixX2d> analyticGradientA(const Measure& m, const Cloud& a, const Cloud& b,
                                                  const ParamSet& params) {
  EvalRequest req;
  req.params = params;
  req.wantPlan = m.gradientNeedsPlan();  // as the sweep asks: a gradient reading an absent plan fails
  const Result r = evaluateMeasure(m, a, b, req);
  EvalContext ctx;
  std::string error;
  ctx.params = resolveParams(m, params, &error);
  ctx.wantPlan = m.gradientNeedsPlan();
  EXPECT_TRUE(error.empty()) << error;
  return m.gradientA(a, b, ctx, r);
}

Cloud gaussianCloud(int n, unsigned seed, double offset, double spread, bool randomWeights) {
  return gaussianCloud(n, seed, Eigen::Vector2d(offset, offset), Eigen::Vector2d(spread, spread), randomWeights);
}

Cloud gaussianCloud(int n, unsigned seed, const Eigen::Vector2d& mean, const Eigen::Vector2d& spread,
                    bool randomWeights) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> w(0.1, 1.0);
  Eigen::MatrixX2d p(n, 2);
  Eigen::VectorXd wt = Eigen::VectorXd::Ones(n);
  for (int i = 0; i < n; ++i) {
    p.row(i) << mean.x() + spread.x() * g(rng), mean.y() + spread.y() * g(rng);
    if (randomWeights) wt(i) = w(rng);
  }
  return Cloud("c", p, wt);
}

EvalRequest entropicRequest(const std::string& group, double epsilon, int p, double tolerance) {
  EvalRequest req;
  req.params.setNumber(group + ".epsilon", epsilon);
  req.params.set(group + ".p", std::to_string(p));
  req.params.setNumber(group + ".tolerance", tolerance);
  return req;
}

std::string uniformSquareCsv(const std::string& name, int n, double shift, unsigned seed) {
  std::mt19937_64 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  std::ostringstream s;
  s.precision(17);
  s << "x,y\n";
  for (int i = 0; i < n; ++i) s << u(rng) + shift << "," << u(rng) << "\n";
  const std::string path = tempPath(name);
  writeText(path, s.str());
  return path;
}

}  // namespace barrow::test

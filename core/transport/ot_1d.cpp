#include "transport/ot_1d.h"

#include <algorithm>
#include <cmath>

namespace barrow {

namespace {

// Atoms sorted by value, and cumulative normalised weights along that order; the last entry
// is set to exactly 1 so that both walks end together.
template <class Atom>
void sortedCdf(const double* v, const double* w, int n, std::vector<Atom>& atoms, std::vector<double>& cdf) {
  atoms.resize(n);
  for (int k = 0; k < n; ++k) atoms[k] = {v[k], k};
  std::sort(atoms.begin(), atoms.end(), [](const Atom& s, const Atom& t) { return s.value < t.value; });
  cdf.resize(n);
  double total = 0.0;
  for (int k = 0; k < n; ++k) cdf[k] = (total += w[atoms[k].index]);
  for (int k = 0; k < n; ++k) cdf[k] /= total;
  cdf[n - 1] = 1.0;
}

inline double costOf(double d, double p) {
  d = std::abs(d);
  if (p == 1.0) return d;
  if (p == 2.0) return d * d;
  return std::pow(d, p);
}

}  // namespace

double Ot1dSolver::solve(const double* x, const double* a, int n, const double* y, const double* b, int m,
                         double p, std::vector<PlanEntry>* coupling) {
  sortedCdf(x, a, n, sx_, cx_);
  sortedCdf(y, b, m, sy_, cy_);
  if (coupling) coupling->clear();
  // Walk the merged breakpoints of the two CDFs; each interval (t, next] pairs one x-atom
  // with one y-atom.
  double cost = 0.0, t = 0.0;
  int i = 0, j = 0;
  while (i < n && j < m) {
    const double next = std::min(cx_[i], cy_[j]);
    const double mass = next - t;
    if (mass > 0) {
      cost += mass * costOf(sx_[i].value - sy_[j].value, p);
      if (coupling) coupling->push_back({sx_[i].index, sy_[j].index, mass});
      t = next;
    }
    if (cx_[i] <= next) ++i;
    if (cy_[j] <= next) ++j;
  }
  return cost;
}

double wasserstein1d(const Eigen::VectorXd& x, const Eigen::VectorXd& a, const Eigen::VectorXd& y,
                     const Eigen::VectorXd& b, double p) {
  Ot1dSolver s;
  return std::pow(s.solve(x.data(), a.data(), int(x.size()), y.data(), b.data(), int(y.size()), p), 1.0 / p);
}

}  // namespace barrow

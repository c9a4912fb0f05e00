#include "transport/ot_1d.h"

#include <algorithm>
#include <cmath>

namespace barrow {

namespace {

// Atoms sorted by value (orderByValue: ties by index, so the result does not depend on the
// sort's internals), and cumulative normalised weights along that order; the last entry is
// set to exactly 1 so that both walks end together.
template <class Atom>
void sortedCdf(const double* v, const double* w, int n, std::vector<int>& order, ValueOrderScratch& scratch,
               std::vector<Atom>& atoms, std::vector<double>& cdf) {
  orderByValue(v, n, order, scratch);
  atoms.resize(n);
  cdf.resize(n);
  double total = 0.0;
  for (int k = 0; k < n; ++k) {
    const int i = order[std::size_t(k)];
    atoms[k] = {v[i], i};
    cdf[k] = (total += w[i]);
  }
  for (int k = 0; k < n; ++k) cdf[k] /= total;
  cdf[n - 1] = 1.0;
}

inline double costOf(double d, double p) {
  d = std::abs(d);
  if (p == 1.0) return d;
  if (p == 2.0) return d * d;
  return std::pow(d, p);
}

// The merge walk when only the cost is wanted. Which side advances is a coin flip for
// interleaved sets, so the steps are written without a data-dependent branch. Adds exactly
// what the walk with the coupling adds: an interval of zero mass contributes +0.0 (not
// 0 · cost, which could be NaN), and t = next changes nothing when the mass is zero.
template <class Atom, class Cost>
double walkCost(const Atom* sx, const double* cx, int n, const Atom* sy, const double* cy, int m, Cost cost) {
  double total = 0.0, t = 0.0;
  int i = 0, j = 0;
  while (i < n && j < m) {
    const double ci = cx[i], cj = cy[j];
    const double next = std::min(ci, cj);
    const double mass = next - t;
    const double add = mass * cost(sx[i].value - sy[j].value);
    total += mass > 0 ? add : 0.0;
    t = next;
    i += ci <= next;
    j += cj <= next;
  }
  return total;
}

}  // namespace

double Ot1dSolver::solve(const double* x, const double* a, int n, const double* y, const double* b, int m,
                         double p, std::vector<PlanEntry>* coupling) {
  sortedCdf(x, a, n, order_, scratch_, sx_, cx_);
  sortedCdf(y, b, m, order_, scratch_, sy_, cy_);
  if (!coupling) {
    if (p == 2.0)
      return walkCost(sx_.data(), cx_.data(), n, sy_.data(), cy_.data(), m, [](double d) { return d * d; });
    if (p == 1.0)
      return walkCost(sx_.data(), cx_.data(), n, sy_.data(), cy_.data(), m, [](double d) { return std::abs(d); });
    return walkCost(sx_.data(), cx_.data(), n, sy_.data(), cy_.data(), m, [p](double d) { return costOf(d, p); });
  }
  coupling->clear();
  // Walk the merged breakpoints of the two CDFs; each interval (t, next] pairs one x-atom
  // with one y-atom.
  double cost = 0.0, t = 0.0;
  int i = 0, j = 0;
  while (i < n && j < m) {
    const double next = std::min(cx_[i], cy_[j]);
    const double mass = next - t;
    if (mass > 0) {
      cost += mass * costOf(sx_[i].value - sy_[j].value, p);
      coupling->push_back({sx_[i].index, sy_[j].index, mass});
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

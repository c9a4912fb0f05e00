#include "transport/network_simplex.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <utility>

namespace barrow {

NetworkSimplex::NetworkSimplex(std::vector<Mass> supply, std::vector<Mass> demand)
    : n_(int(supply.size())), m_(int(demand.size())), root_(n_ + m_) {
  mass_ = std::move(supply);
  mass_.insert(mass_.end(), demand.begin(), demand.end());
  const std::size_t nodes = std::size_t(root_) + 1;
  for (auto* a : {&parent_, &pred_, &thread_, &revThread_, &last_, &size_}) a->assign(nodes, kNone);
  up_.assign(nodes, 0);
  predFlow_.assign(nodes, 0);
  pot_.assign(nodes, 0.0);
}

int NetworkSimplex::addArc(int i, int j, double cost) {
  tail_.push_back(i);
  head_.push_back(n_ + j);
  cost_.push_back(cost);
  flow_.push_back(0);
  basic_.push_back(0);
  return int(cost_.size()) - 1;
}

std::string NetworkSimplex::setBasis(const std::vector<BasisArc>& arcs, const std::vector<int>& roots) {
  const int nodes = root_;
  std::fill(basic_.begin(), basic_.end(), 0);
  std::fill(flow_.begin(), flow_.end(), 0);
  if (int(arcs.size()) > nodes - 1) return "basis has more arcs than a spanning forest can";

  // Adjacency of the forest (compressed rows) and the balance each flow leaves behind.
  std::vector<int> start(std::size_t(nodes) + 1, 0);
  std::vector<Mass> balance(mass_.begin(), mass_.end());
  for (const auto& b : arcs) {
    if (b.arc < 0 || b.arc >= arcCount()) return "basis names an unknown arc";
    if (b.flow < 0) return "basis has a negative flow";
    const auto e = std::size_t(b.arc);
    if (basic_[e]) return "basis names an arc twice";
    basic_[e] = 1;
    flow_[e] = b.flow;
    balance[std::size_t(tail_[e])] -= b.flow;
    balance[std::size_t(head_[e])] -= b.flow;
    ++start[std::size_t(tail_[e]) + 1];
    ++start[std::size_t(head_[e]) + 1];
  }
  for (int v = 0; v < nodes; ++v)
    if (balance[std::size_t(v)] != 0) return "basis flows do not meet the masses exactly";
  std::partial_sum(start.begin(), start.end(), start.begin());
  std::vector<int> adj(std::size_t(start.back())), fill(start.begin(), start.end() - 1);
  for (const auto& b : arcs) {
    const auto e = std::size_t(b.arc);
    adj[std::size_t(fill[std::size_t(tail_[e])]++)] = b.arc;
    adj[std::size_t(fill[std::size_t(head_[e])]++)] = b.arc;
  }

  // Hang each component from the root; a depth-first walk gives parents and the preorder.
  std::vector<std::uint8_t> seen(std::size_t(nodes) + 1, 0);
  std::vector<int> order{root_}, stack;
  order.reserve(std::size_t(nodes) + 1);
  seen[std::size_t(root_)] = 1;
  parent_[std::size_t(root_)] = kNone;
  pred_[std::size_t(root_)] = kNone;
  std::vector<int> starts(roots);
  starts.resize(roots.size() + std::size_t(nodes));
  std::iota(starts.begin() + std::ptrdiff_t(roots.size()), starts.end(), 0);
  for (int s : starts) {
    if (s < 0 || s >= nodes) return "basis root out of range";
    if (seen[std::size_t(s)]) continue;
    seen[std::size_t(s)] = 1;
    parent_[std::size_t(s)] = root_;
    pred_[std::size_t(s)] = kArtificial;
    predFlow_[std::size_t(s)] = 0;
    up_[std::size_t(s)] = 1;
    stack.push_back(s);
    while (!stack.empty()) {
      const int v = stack.back();
      stack.pop_back();
      order.push_back(v);
      for (int k = start[std::size_t(v)]; k < start[std::size_t(v) + 1]; ++k) {
        const int e = adj[std::size_t(k)];
        if (e == pred_[std::size_t(v)]) continue;
        const int w = tail_[std::size_t(e)] == v ? head_[std::size_t(e)] : tail_[std::size_t(e)];
        if (seen[std::size_t(w)]) return "basis arcs contain a cycle";
        seen[std::size_t(w)] = 1;
        parent_[std::size_t(w)] = v;
        pred_[std::size_t(w)] = e;
        predFlow_[std::size_t(w)] = flow_[std::size_t(e)];
        up_[std::size_t(w)] = tail_[std::size_t(e)] == w;
        if (flow_[std::size_t(e)] == 0 && !up_[std::size_t(w)])
          return "basis is not strongly feasible (a zero-flow arc points away from the root)";
        stack.push_back(w);
      }
    }
  }
  // Thread, subtree sizes and last descendants from the preorder.
  for (std::size_t p = 0; p < order.size(); ++p) chain(order[p], order[(p + 1) % order.size()]);
  std::vector<int> position(order.size());
  for (std::size_t p = 0; p < order.size(); ++p) position[std::size_t(order[p])] = int(p);
  std::fill(size_.begin(), size_.end(), 1);
  for (std::size_t p = order.size(); p-- > 1;) size_[std::size_t(parent_[std::size_t(order[p])])] += size_[std::size_t(order[p])];
  for (int v : order) last_[std::size_t(v)] = order[std::size_t(position[std::size_t(v)] + size_[std::size_t(v)] - 1)];
  recomputePotentials();
  return {};
}

void NetworkSimplex::basis(std::vector<BasisArc>* arcs, std::vector<int>* roots) const {
  arcs->clear();
  roots->clear();
  for (int e = 0; e < arcCount(); ++e)
    if (basic_[std::size_t(e)]) arcs->push_back({e, flow_[std::size_t(e)]});
  for (int v = 0; v < root_; ++v)
    if (parent_[std::size_t(v)] == root_) roots->push_back(v);
}

void NetworkSimplex::recomputePotentials() {
  pot_[std::size_t(root_)] = 0.0;
  for (int v = thread_[std::size_t(root_)]; v != root_; v = thread_[std::size_t(v)]) {
    const auto s = std::size_t(v);
    const auto p = std::size_t(parent_[s]);
    const double c = pred_[s] >= 0 ? cost_[std::size_t(pred_[s])] : 0.0;
    pot_[s] = up_[s] ? pot_[p] + c : pot_[p] - c;
  }
}

// Block search: scan arcs in blocks from where the last scan stopped and take the most
// negative reduced cost of the first block that has one.
int NetworkSimplex::findEntering(double tolerance) {
  const int total = arcCount();
  if (total == 0) return kNone;
  const int block = std::max(32, int(std::sqrt(double(total))));
  double best = -tolerance;
  int chosen = kNone;
  int scanned = 0;
  while (scanned < total) {
    const int begin = nextArc_;
    const int end = std::min(total, begin + std::min(block, total - scanned));
    for (int e = begin; e < end; ++e) {
      const auto s = std::size_t(e);
      const double rc = cost_[s] - pot_[std::size_t(tail_[s])] + pot_[std::size_t(head_[s])];
      if (rc < best && !basic_[s]) {
        best = rc;
        chosen = e;
      }
    }
    scanned += end - begin;
    nextArc_ = end == total ? 0 : end;
    if (chosen != kNone) return chosen;
  }
  return kNone;
}

// Adds `shift` to the potentials on the thread from `first` to `last` (inclusive).
void NetworkSimplex::shiftPotentials(int first, int last, double shift) {
  for (int v = first;; v = thread_[std::size_t(v)]) {
    pot_[std::size_t(v)] += shift;
    if (v == last) return;
  }
}

void NetworkSimplex::pivot(int e) {
  const auto se = std::size_t(e);
  const int k = tail_[se], l = head_[se];

  // Walk both ends up to the apex (the larger subtree is the ancestor). On k's side the
  // cycle runs downwards, so arcs pointing up lose flow; on l's side it runs upwards, so
  // arcs pointing down lose flow. Ties go to the last blocking arc in cycle order from the
  // apex: nearest k on k's side (strict <), nearest the apex on l's side (<=), and l's side
  // over k's side. This keeps the tree strongly feasible.
  constexpr Mass kInf = std::numeric_limits<Mass>::max();
  Mass bestK = kInf, bestL = kInf;
  int leaveK = kNone, leaveL = kNone;
  int x = k, y = l;
  while (x != y) {
    if (size_[std::size_t(x)] < size_[std::size_t(y)]) {
      if (up_[std::size_t(x)]) {
        const Mass f = predFlow_[std::size_t(x)];
        if (f < bestK) bestK = f, leaveK = x;
      }
      x = parent_[std::size_t(x)];
    } else {
      if (!up_[std::size_t(y)]) {
        const Mass f = predFlow_[std::size_t(y)];
        if (f <= bestL) bestL = f, leaveL = y;
      }
      y = parent_[std::size_t(y)];
    }
  }
  const int apex = x;
  const bool leaveOnL = leaveL != kNone && bestL <= bestK;
  const Mass delta = leaveOnL ? bestL : bestK;
  const int q = leaveOnL ? leaveL : leaveK;  // the leaving arc is pred(q)

  if (delta > 0) {
    for (int w = k; w != apex; w = parent_[std::size_t(w)])
      predFlow_[std::size_t(w)] += up_[std::size_t(w)] ? -delta : delta;
    for (int w = l; w != apex; w = parent_[std::size_t(w)])
      predFlow_[std::size_t(w)] += up_[std::size_t(w)] ? delta : -delta;
  } else {
    ++degenerate_;
  }
  basic_[se] = 1;
  if (pred_[std::size_t(q)] >= 0) {
    basic_[std::size_t(pred_[std::size_t(q)])] = 0;
    flow_[std::size_t(pred_[std::size_t(q)])] = 0;  // it leaves with zero flow
  }

  // The subtree S under q is cut out and hung again from the entering arc, re-rooted at s
  // (the end of the entering arc inside S). Path s = w0, w1, ..., wr = q; save the old
  // thread neighbours, last descendants and sizes of its nodes first.
  const int s = leaveOnL ? l : k;
  const int t = leaveOnL ? k : l;
  const int oldParentQ = parent_[std::size_t(q)];
  const int sizeS = size_[std::size_t(q)];
  path_.clear();
  pathPrev_.clear();
  pathLast_.clear();
  pathAfter_.clear();
  pathSize_.clear();
  for (int w = s;; w = parent_[std::size_t(w)]) {
    const auto sw = std::size_t(w);
    path_.push_back(w);
    pathPrev_.push_back(revThread_[sw]);
    pathLast_.push_back(last_[sw]);
    pathAfter_.push_back(thread_[std::size_t(last_[sw])]);
    pathSize_.push_back(size_[sw]);
    if (w == q) break;
  }
  const std::size_t r = path_.size() - 1;

  // 1. Cut S out of the thread; ancestors whose subtree ended with S now end before it.
  const int beforeS = pathPrev_[r], afterS = pathAfter_[r], lastS = pathLast_[r];
  chain(beforeS, afterS);
  for (int w = oldParentQ; w != kNone && last_[std::size_t(w)] == lastS; w = parent_[std::size_t(w)])
    last_[std::size_t(w)] = beforeS;
  for (int w = oldParentQ; w != apex; w = parent_[std::size_t(w)]) size_[std::size_t(w)] -= sizeS;

  // 2. Re-thread S in preorder from s: the old subtree of w0, then for each w_i the part of
  //    its old subtree outside w_{i-1}'s (before it, then after it).
  int tailS = pathLast_[0];
  for (std::size_t i = 1; i <= r; ++i) {
    chain(tailS, path_[i]);
    tailS = pathPrev_[i - 1];
    if (pathLast_[i - 1] != pathLast_[i]) {
      chain(tailS, pathAfter_[i - 1]);
      tailS = pathLast_[i];
    }
  }
  for (std::size_t i = 0; i <= r; ++i) {
    last_[std::size_t(path_[i])] = tailS;
    size_[std::size_t(path_[i])] = i == 0 ? sizeS : sizeS - pathSize_[i - 1];
  }

  // 3. Reverse parents along the path and hang s from t by the entering arc.
  for (std::size_t i = r; i >= 1; --i) {
    const auto child = std::size_t(path_[i]);
    const auto below = std::size_t(path_[i - 1]);
    parent_[child] = path_[i - 1];
    pred_[child] = pred_[below];
    predFlow_[child] = predFlow_[below];
    up_[child] = !up_[below];
  }
  parent_[std::size_t(s)] = t;
  pred_[std::size_t(s)] = e;
  predFlow_[std::size_t(s)] = delta;
  up_[std::size_t(s)] = s == k;

  // 4. Splice S in right after t; ancestors whose subtree ended at t now end with S.
  const int afterT = thread_[std::size_t(t)];
  for (int w = t; w != kNone && last_[std::size_t(w)] == t; w = parent_[std::size_t(w)])
    last_[std::size_t(w)] = tailS;
  chain(t, s);
  chain(tailS, afterT);
  for (int w = t; w != apex; w = parent_[std::size_t(w)]) size_[std::size_t(w)] += sizeS;

  // 5. Potentials: the entering arc becomes tight by shifting S by −rc·(±1), or, when S is
  //    the larger part, everything else by the opposite amount (only differences matter).
  const double rc = cost_[se] - pot_[std::size_t(k)] + pot_[std::size_t(l)];
  const double shift = s == k ? rc : -rc;
  const int total = root_ + 1;
  if (2 * sizeS <= total) shiftPotentials(s, tailS, shift);
  else shiftPotentials(afterT, t, -shift);
}

void NetworkSimplex::syncFlows() {
  for (int v = 0; v < root_; ++v)
    if (pred_[std::size_t(v)] >= 0) flow_[std::size_t(pred_[std::size_t(v)])] = predFlow_[std::size_t(v)];
}

NetworkSimplex::RunStatus NetworkSimplex::run(double tolerance, long long maxPivots,
                                              const RunControl* control) {
  const RunStatus status = pivotUntilDone(tolerance, maxPivots, control);
  syncFlows();
  return status;
}

NetworkSimplex::RunStatus NetworkSimplex::pivotUntilDone(double tolerance, long long maxPivots,
                                                         const RunControl* control) {
  bool refreshed = false;
  while (true) {
    if ((pivots_ & 4095) == 0 && control && control->shouldStop(progress())) return RunStatus::Cancelled;
    int e = findEntering(tolerance);
    if (e == kNone) {
      // Confirm with fresh potentials: incremental updates drift by rounding.
      if (refreshed) return RunStatus::Optimal;
      recomputePotentials();
      refreshed = true;
      continue;
    }
    refreshed = false;
    if (maxPivots >= 0 && pivots_ >= maxPivots) return RunStatus::PivotLimit;
    pivot(e);
    ++pivots_;
  }
}

}  // namespace barrow

// Primal network simplex for the uncapacitated bipartite transport problem
//   min Σ c_e f_e  over arcs e = (i → j),  Σ_j f_ij = s_i,  Σ_i f_ij = d_j,  f >= 0,
// on an arc set that may grow between runs (column generation: the caller prices the arcs it
// has not added yet and adds the violated ones).
//
// Method: Dantzig's primal simplex on the spanning-tree basis of the flow network (Ahuja,
// Magnanti & Orlin 1993, "Network Flows", ch. 11 (mem)), block-search pricing (Grigoriadis
// 1986, Math. Prog. Study 26 (mem)), and Cunningham's strongly feasible trees (Math. Prog.
// 11 (1976) 105–116 (mem)) so that degenerate pivots cannot cycle: every zero-flow tree arc
// points towards the root, and the leaving arc is the last blocking arc met when the cycle
// is walked in its orientation from the apex (AMO Sec. 11.5–11.6 (mem)). The tree is kept
// as a preorder thread with subtree sizes, so a pivot costs the cycle, the re-rooted path,
// and one sweep over the smaller side of the cut for the potentials.
//
// Masses are integers (the caller scales the weights to a common total), so flows are exact
// and degeneracy is detected exactly. Costs and node potentials are doubles. An extra root
// node is joined to one node of every component of the initial forest by an artificial arc
// of cost 0; those arcs start at flow 0, are never priced, and can only leave the basis (a
// cycle through the root always meets one of them as a zero-flow blocking arc), so the
// final flow uses real arcs only.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "base/run_control.h"

namespace barrow {

class NetworkSimplex {
 public:
  using Mass = std::int64_t;

  /// One arc of a basis handed in by the caller: `arc` is an id from addArc().
  struct BasisArc {
    int arc = 0;
    Mass flow = 0;
  };

  enum class RunStatus { Optimal, Cancelled, PivotLimit };

  /// supply: masses of the n sources (> 0); demand: masses of the m sinks (> 0); the two
  /// totals must be equal (checked by setBasis, which needs a flow meeting both).
  NetworkSimplex(std::vector<Mass> supply, std::vector<Mass> demand);

  int sources() const { return n_; }
  int sinks() const { return m_; }

  /// Adds the arc i → j with the given cost; returns its id. Arcs added after setBasis()
  /// enter as non-basic with zero flow (the current basis stays feasible).
  int addArc(int i, int j, double cost);
  int arcCount() const { return int(cost_.size()); }
  int arcSource(int e) const { return tail_[std::size_t(e)]; }
  int arcSink(int e) const { return head_[std::size_t(e)] - n_; }
  double arcCost(int e) const { return cost_[std::size_t(e)]; }

  /// Installs a basis: a forest of arcs whose flows meet every supply and demand exactly.
  /// `roots` names, per component, the node that hangs from the root (sources 0..n-1, sinks
  /// n..n+m-1); components without one get their first node. Zero-flow arcs must point
  /// towards their component's root (strong feasibility). Returns the reason on failure.
  std::string setBasis(const std::vector<BasisArc>& arcs, const std::vector<int>& roots = {});

  /// Pivots until no arc has reduced cost below -tolerance (cost units), the pivot budget
  /// is spent, or `control` asks to stop (polled every 4096 pivots, with progress()).
  RunStatus run(double tolerance, long long maxPivots, const RunControl* control);

  /// Recomputes every potential from the tree (clears the drift of incremental updates).
  void recomputePotentials();

  /// Dual potentials with u_i + v_j = c_ij on basic arcs and >= -tolerance reduced costs
  /// on the others after an optimal run.
  double u(int i) const { return pot_[std::size_t(i)]; }
  double v(int j) const { return -pot_[std::size_t(n_ + j)]; }

  Mass flow(int e) const { return flow_[std::size_t(e)]; }
  bool basic(int e) const { return basic_[std::size_t(e)] != 0; }
  long long pivots() const { return pivots_; }
  /// A rough fraction done for progress bars: pivots / (pivots + 2(n + m)), since optimal
  /// bases are typically reached after a small multiple of n + m pivots.
  double progress() const { return double(pivots_) / (double(pivots_) + 2.0 * double(n_ + m_)); }
  long long degeneratePivots() const { return degenerate_; }

  /// The current basis in the form setBasis() accepts (real arcs and component roots).
  void basis(std::vector<BasisArc>* arcs, std::vector<int>* roots) const;

 private:
  static constexpr int kNone = -1;
  static constexpr int kArtificial = -2;  // pred of a node hanging from the root

  int findEntering(double tolerance);
  RunStatus pivotUntilDone(double tolerance, long long maxPivots, const RunControl* control);
  void pivot(int e);
  void syncFlows();
  void chain(int from, int to) {  // thread_[from] = to
    thread_[std::size_t(from)] = to;
    revThread_[std::size_t(to)] = from;
  }
  void shiftPotentials(int first, int last, double shift);

  int n_ = 0, m_ = 0, root_ = 0;
  std::vector<Mass> mass_;  // supply (> 0) of sources, demand (> 0) of sinks

  // Arcs. flow_ holds tree arcs' flows as of the last setBasis() or run().
  std::vector<int> tail_, head_;  // node ids: sources 0..n-1, sinks n..n+m-1
  std::vector<double> cost_;
  std::vector<Mass> flow_;
  std::vector<std::uint8_t> basic_;
  int nextArc_ = 0;

  // Spanning tree over n+m+1 nodes (the last is the root), stored as a preorder thread
  // (circular, through the root): the subtree of v is the thread segment from v to last_[v],
  // of size_[v] nodes. Subtree sizes find the apex of a cycle (the ancestor is the larger);
  // contiguous subtrees make re-hanging a subtree a few splices plus one linear sweep.
  std::vector<int> parent_, pred_, thread_, revThread_, last_, size_;
  std::vector<std::uint8_t> up_;  // pred arc points from the node to its parent
  std::vector<Mass> predFlow_;    // flow on the pred arc (0 for artificial arcs): kept with
                                  // the node, as the cycle walk reads it next to parent_ and
                                  // size_; flow_ is brought up to date when run() returns
  std::vector<double> pot_;       // reduced cost of arc (p → q) is c − pot_p + pot_q
  std::vector<int> path_;         // scratch: the path re-rooted in a pivot
  std::vector<int> pathPrev_, pathLast_, pathAfter_, pathSize_;

  long long pivots_ = 0;
  long long degenerate_ = 0;
};

}  // namespace barrow

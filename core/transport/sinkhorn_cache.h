// A store of finished entropic solves shared by every caller in the process, so that one
// A–B problem is solved once however many measures ask for it: `entropic` and `sinkhorn`
// (its OT_ε(a, b) term) in one `measure` run, at one θ of a sweep, or in one refresh of the
// window.
//
// What makes two requests the same problem: the exact bytes of the points and of the weights
// as given (a 64-bit hash finds the candidate, a byte comparison with the stored copy
// confirms it, so a hash collision can never return another problem's solve), the kind
// (A–B or symmetric self term), and every SinkhornOptions field (ε as a number: an "auto"
// rule and a set ε that give the same number give the same problem). The start is not part
// of the key: a warm start changes only how fast the solver reaches its tolerance, so a solve
// that converged from one start stands for any other start. For that reason only results
// that say so much are kept: a Converged solve (from any start), or a MaxIterations solve
// from the cold start (the cold path is deterministic, independent of the thread count, so
// any cold re-solve returns the same bits). Cancelled and invalid solves are never kept.
//
// Threads: one mutex guards the table. A request whose problem is being solved by another
// thread waits for that solve rather than repeating it (polling its own cancel flag), and
// solves it itself if the other one ends without a result worth keeping (cancelled).
// Memory: least recently used entries go first once the entries' bytes (stored points,
// weights and potentials, O(n + m)) exceed the budget or their count exceeds the limit.
#pragma once

#include <Eigen/Core>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <list>
#include <memory>
#include <mutex>
#include <condition_variable>

#include "transport/sinkhorn_solver.h"

namespace barrow {

class SinkhornCache {
 public:
  struct Stats {
    long long hits = 0, misses = 0, waits = 0;  // waits: hits that waited for another thread
    int entries = 0;
    std::size_t bytes = 0;
  };

  /// The one store used by the measures.
  static SinkhornCache& shared();

  explicit SinkhornCache(std::size_t byteBudget = std::size_t(96) << 20, int maxEntries = 16);
  SinkhornCache(const SinkhornCache&) = delete;
  SinkhornCache& operator=(const SinkhornCache&) = delete;

  /// solveSinkhorn(x, a, y, b, ...) through the store: a kept solve of the same problem is
  /// returned as it was stored (`*reused` = true), else the problem is solved from `start`
  /// and kept when it qualifies. `reused` may be null.
  SinkhornResult solve(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a, const Eigen::MatrixX2d& y,
                       const Eigen::VectorXd& b, const SinkhornOptions& options, const RunControl* control,
                       const SinkhornStart* start, kernel::RowWorkers* workers, bool* reused);

  /// solveSinkhornSymmetric(x, a, ...) through the store, as above.
  SinkhornResult solveSymmetric(const Eigen::MatrixX2d& x, const Eigen::VectorXd& a,
                                const SinkhornOptions& options, const RunControl* control,
                                const Eigen::VectorXd* startF, kernel::RowWorkers* workers, bool* reused);

  /// Drops every kept solve (solves in flight finish but are not kept if they started before).
  void clear();
  /// false: every request is solved and nothing is kept (true by default).
  void setEnabled(bool enabled);
  bool enabled() const;
  Stats stats() const;

 private:
  struct Key;
  struct Entry;
  using Solver = std::function<SinkhornResult()>;

  SinkhornResult through(Key key, const Solver& solver, const RunControl* control, bool* reused);
  void evictLocked();

  mutable std::mutex mutex_;
  std::condition_variable finished_;
  std::list<std::shared_ptr<Entry>> entries_;  // most recently used first; in-flight ones too
  std::size_t byteBudget_;
  int maxEntries_;
  bool enabled_ = true;
  std::uint64_t generation_ = 0;  // bumped by clear(): older in-flight solves are not kept
  Stats stats_;
};

}  // namespace barrow

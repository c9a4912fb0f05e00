// barrow-cli plan --a A.csv --b B.csv [--cost w1|w2] --out plan.csv [--potentials P.csv]   (--out - : standard output)
// Writes the exact optimal transport plan in the plan CSV of core/io/plan_csv.h, one nonzero
// per line, sorted by (i, j):
//   i,j,mass,ax,ay,bx,by,cost
// with i, j the 0-based data rows of A and B, mass under the normalised weights (summing to
// 1) and cost = c(x_i, y_j) (|x-y| for w1, |x-y|^2 for w2). Prints a one-line summary.
// --potentials writes the optimality certificate, the dual potentials of that cost:
//   side,index,potential
// one line per data row of A (side A) and then of B (side B), index 0-based as in the plan.
// They satisfy u_i + v_j <= c_ij for every pair, with equality on the plan's support, and
// sum_i a_i u_i + sum_j b_j v_j = the optimal cost (up to rounding). They are unique only up to
// adding a constant to u and subtracting it from v (more freedom when the problem is
// degenerate). The cost is stated on stdout; the file holds exactly those three columns.
#include <cstdio>
#include <string>

#include "base/number_text.h"
#include "cli/cli_common.h"
#include "cli/commands.h"
#include "io/plan_csv.h"
#include "transport/exact_cost.h"
#include "measures/evaluate.h"
#include "measures/registry.h"

namespace barrow::cli {

int runPlan(const std::vector<std::string>& argv) {
  const CliArgs args("plan", argv, {"a", "b", "cost", "out", "potentials"}, {});
  const std::string costName = args.value("cost").value_or("w1");
  if (costName != "w1" && costName != "w2") throw InputError{"--cost must be w1 or w2, not '" + costName + "'"};
  const std::string out = args.required("out");
  checkWritable(out, "out");
  const auto potentials = args.value("potentials");
  if (potentials) checkWritable(*potentials, "potentials");
  const Cloud a = loadCloud(args.required("a"));
  const Cloud b = loadCloud(args.required("b"));

  const Measure* m = MeasureRegistry::instance().find(costName);
  if (!m) throw InternalError{"measure '" + costName + "' is not registered"};
  EvalRequest req;
  req.wantPlan = true;
  req.params.set(costName + ".exact_limit", "2000000000");  // a plan needs the exact solve, never a bracket
  const Result r = evaluateMeasure(*m, a, b, req);
  if (r.status == Status::InvalidInput) throw InputError{r.message};
  if (r.status != Status::Ok) throw InternalError{costName + " failed: " + r.message};

  const GroundCost cost(costName == "w1" ? 1.0 : 2.0);
  const std::string csv = formatPlanCsv(a, b, r.plan, cost.p());
  if (out == "-") std::fwrite(csv.data(), 1, csv.size(), stdout);
  else if (auto e = atomicWriteFile(out, csv)) throw InputError{*e};
  if (potentials) {
    if (r.u.size() != a.size() || r.v.size() != b.size())
      throw InternalError{costName + " returned no dual potentials for every row"};
    std::string p = "side,index,potential\n";
    for (Eigen::Index i = 0; i < r.u.size(); ++i) p += "A," + std::to_string(i) + "," + shortestText(r.u(i)) + "\n";
    for (Eigen::Index j = 0; j < r.v.size(); ++j) p += "B," + std::to_string(j) + "," + shortestText(r.v(j)) + "\n";
    if (auto e = atomicWriteFile(*potentials, p)) throw InputError{*e};
  }
  std::fprintf(out == "-" ? stderr : stdout, "%s = %s  nonzeros = %zu  marginal error = %.1e  (%.1f ms)  -> %s\n", costName.c_str(),
              shortestText(r.value).c_str(), r.plan.size(), r.details.value("marginal_error", 0.0), r.seconds * 1e3,
              out.c_str());
  if (potentials)
    std::fprintf(out == "-" ? stderr : stdout, "dual potentials of the cost c(x, y) = %s (u on A, v on B; u_i + v_j <= c_ij, equality on the "
                 "plan) -> %s\n",
                 cost.label().c_str(), potentials->c_str());
  return kExitOk;
}

}  // namespace barrow::cli

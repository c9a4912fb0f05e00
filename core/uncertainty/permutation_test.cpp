#include "uncertainty/permutation_test.h"

#include <cmath>

#include "uncertainty/frozen_measure.h"
#include "uncertainty/replicate_loop.h"
#include "uncertainty/weighted_draw.h"

namespace barrow {

std::optional<std::string> checkPermuteRequest(const PermuteRequest& req) {
  if (auto e = checkCount("the number of permutations", req.permutations, kMaxPermutations)) return e;
  if (req.measures.empty()) return std::string("no measures chosen");
  return std::nullopt;
}

PermuteResult runPermutationTest(const Cloud& a, const Cloud& b, const PermuteRequest& req,
                                 const RunControl* control) {
  PermuteResult out;
  out.request = req;
  const std::size_t P = std::size_t(req.permutations);
  std::vector<FrozenMeasure> frozen;
  std::vector<bool> usable;
  for (const Measure* m : req.measures) {
    frozen.emplace_back(*m, req.params, a, b);
    PermuteRow row;
    row.id = m->id();
    row.settings = frozen.back().settings();
    const Result r = frozen.back().evaluate(a, b, control);
    row.status = r.status;
    if (r.usable()) row.value = r.value;
    else row.message = r.message;
    usable.push_back(r.usable() && !std::isnan(r.value));
    row.permuted.assign(P, NAN);
    out.rows.push_back(std::move(row));
  }
  std::vector<std::string> reasons(out.rows.size() * P);

  const PooledPair pooled(a, b);
  const bool complete = runReplicates(req.permutations, req.threads, control, [&](int p, const RunControl* inner) {
    ReplicateRng rng(req.seed, std::uint64_t(p));
    Cloud pa, pb;
    pa.name = a.name;
    pb.name = b.name;
    pooled.split(rng, &pa, &pb);
    for (std::size_t k = 0; k < frozen.size(); ++k) {
      if (!usable[k]) continue;
      const Result res = frozen[k].evaluate(pa, pb, inner);
      if (res.usable()) out.rows[k].permuted[std::size_t(p)] = res.value;
      else reasons[k * P + std::size_t(p)] = res.message;
    }
  });
  out.cancelled = !complete || (control && control->cancel && control->cancel->load());

  for (std::size_t k = 0; k < out.rows.size(); ++k) {
    PermuteRow& row = out.rows[k];
    if (out.cancelled) {
      row.status = Status::Cancelled;
      continue;
    }
    if (!usable[k]) continue;
    int valid = 0;
    for (std::size_t p = 0; p < P; ++p) {
      const double t = row.permuted[p];
      if (std::isnan(t)) {
        if (row.message.empty()) row.message = "permutation " + std::to_string(p + 1) + ": " + reasons[k * P + p];
        continue;
      }
      ++valid;
      // A tie counts (+inf >= +inf too): it is no evidence against the null. The same split in
      // another row order can differ from T_obs in the last bits, hence the rounding allowance.
      const double bar = std::isinf(row.value) ? row.value : row.value - 1e-12 * std::abs(row.value);
      if (t >= bar) ++row.exceed;
    }
    row.failed = req.permutations - valid;
    row.pValue = double(1 + row.exceed) / double(1 + valid);
  }
  return out;
}

}  // namespace barrow

#include "measures/registry.h"

#include <algorithm>
#include <set>

namespace barrow {

const std::vector<std::string>& designMeasureIds() {
  static const std::vector<std::string> order = {
      "w1", "w2", "entropic", "sinkhorn", "sliced", "mmd", "energy", "frechet",
      "chamfer", "hausdorff", "kl_ab", "kl_ba", "js", "tv", "hellinger"};
  return order;
}

namespace {
std::size_t designRank(const std::string& id) {
  const auto& o = designMeasureIds();
  return std::size_t(std::find(o.begin(), o.end(), id) - o.begin());
}
}  // namespace

MeasureRegistry::MeasureRegistry() {
  registerTransportMeasures(*this);
  registerEntropicMeasures(*this);
  registerSlicedMeasures(*this);
  registerKernelMeasures(*this);
  registerGeometricMeasures(*this);
  registerDensityMeasures(*this);
  registerCriticMeasures(*this);
  std::stable_sort(view_.begin(), view_.end(),
                   [](const Measure* x, const Measure* y) { return designRank(x->id()) < designRank(y->id()); });
  for (const Measure* m : view_)
    if (m->inDefaultSet()) defaults_.push_back(m);
}

const MeasureRegistry& MeasureRegistry::instance() {
  static const MeasureRegistry registry;
  return registry;
}

void MeasureRegistry::add(std::unique_ptr<Measure> m) {
  view_.push_back(m.get());
  owned_.push_back(std::move(m));
}

std::size_t MeasureRegistry::rank(const std::string& id) const {
  for (std::size_t k = 0; k < view_.size(); ++k)
    if (view_[k]->id() == id) return k;
  return view_.size();
}

const Measure* MeasureRegistry::find(const std::string& id) const {
  for (const Measure* m : view_)
    if (m->id() == id) return m;
  return nullptr;
}

std::vector<ParamSpec> MeasureRegistry::allParams() const {
  std::vector<ParamSpec> out;
  std::set<std::string> seen;
  for (const Measure* m : view_)
    for (auto& p : m->params())
      if (seen.insert(p.key).second) out.push_back(p);
  return out;
}

}  // namespace barrow

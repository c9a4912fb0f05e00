// The table of all measures, in the order of DEVELOPERS.md, Measure conventions.
#pragma once

#include <memory>
#include <string>
#include <vector>

#include "measures/measure.h"

namespace barrow {

class MeasureRegistry {
 public:
  static const MeasureRegistry& instance();

  /// All registered measures, in the canonical order (w1, w2, entropic, ...).
  const std::vector<const Measure*>& all() const { return view_; }
  /// The measures run when none are named: all() without the opt-in ones (inDefaultSet()).
  const std::vector<const Measure*>& defaults() const { return defaults_; }
  /// nullptr when no measure has that id.
  const Measure* find(const std::string& id) const;
  /// Position of `id` in all() (all().size() when unknown): the order tables and lists use.
  std::size_t rank(const std::string& id) const;
  /// Union of every measure's parameter specs (each key once).
  std::vector<ParamSpec> allParams() const;

  void add(std::unique_ptr<Measure> m);

 private:
  MeasureRegistry();
  std::vector<std::unique_ptr<Measure>> owned_;
  std::vector<const Measure*> view_;
  std::vector<const Measure*> defaults_;
};

/// Every documented measure id (DEVELOPERS.md, Measure conventions), in its order (some may not be registered yet).
const std::vector<std::string>& designMeasureIds();

// Each family of measures registers itself here (one definition per family's file).
void registerTransportMeasures(MeasureRegistry& r);  // w1, w2
void registerEntropicMeasures(MeasureRegistry& r);   // entropic, sinkhorn
void registerSlicedMeasures(MeasureRegistry& r);     // sliced
void registerKernelMeasures(MeasureRegistry& r);     // mmd, energy, frechet
void registerGeometricMeasures(MeasureRegistry& r);  // chamfer, hausdorff
void registerDensityMeasures(MeasureRegistry& r);    // kl_ab, kl_ba, js, tv, hellinger
void registerCriticMeasures(MeasureRegistry& r);     // critic_clip, critic_gp, critic_sn (opt-in)

}  // namespace barrow

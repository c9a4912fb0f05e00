// Settings of one critic run: which Lipschitz rule, the network, the optimiser, the steps.
// Defaults per method are the published algorithms' own:
//  - clip: weight clipping to [−c, c], c = 0.01, RMSProp with α = 5e-5, batch m = 64
//    (Arjovsky, Chintala & Bottou 2017, Alg. 1) [P]; RMSProp decay ρ = 0.99, ε = 1e-8 [CP] (mem).
//  - gp: gradient penalty λ = 10 on uniform interpolates, Adam with α = 1e-4, β1 = 0,
//    β2 = 0.9, batch m = 64 (Gulrajani et al. 2017, Alg. 1) [P].
//  - sn: spectral normalisation with one power iteration per step, Adam with α = 1e-4,
//    β1 = 0.5, β2 = 0.9 (Miyato et al. 2018, Sec. 4, setting "A" of Table 1 (mem)), batch 64.
// n_critic of those algorithms counts critic steps per generator step; here there is no
// generator, so `steps` counts critic updates only.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "critic/mlp.h"
#include "critic/optimizers.h"
#include "base/params.h"

namespace barrow::critic {

enum class Method { Clip, Gp, Sn };

const char* methodName(Method m);  // "clip", "gp", "sn"
bool parseMethod(const std::string& word, Method* out);

struct CriticSettings {
  Method method = Method::Gp;
  MlpShape shape;
  int steps = 1000;
  int batch = 64;  // points drawn from each cloud per step
  OptimizerSettings optimizer;
  double clip = 0.01;       // clip: c
  double lambda = 10.0;     // gp: λ
  int powerIterations = 1;  // sn
  std::uint64_t seed = 1;
  int grid = 64;            // grid points per side for the measured gradient norm
  int curvePoints = 50;     // full-data checkpoints on the training curve
};

/// The published defaults of `m` (see the header comment).
CriticSettings defaultSettings(Method m);

/// The critic.* parameters shared by critic_clip, critic_gp and critic_sn (and the CLI).
std::vector<ParamSpec> criticParamSpecs();

/// defaultSettings(m) overridden by the critic.* values present in `params` (already checked
/// against criticParamSpecs()); "paper" leaves the method's published value.
CriticSettings settingsFromParams(Method m, const ParamSet& params);

/// One-line text of the settings actually used, for details and the CLI.
std::string describeSettings(const CriticSettings& s);

}  // namespace barrow::critic

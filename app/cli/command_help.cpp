// The --help text of the commands that have one of their own: every option, its default and
// unit, and the rules behind the results, written once here.
#include <string>

#include "cli/commands.h"

namespace barrow::cli {

namespace {

const char* kSweepOptions = R"(Sweep options (sweep, findings, report):
  --a FILE --b FILE   the clouds (CSV x,y[,w] or .npy); A moves, B stays fixed
  --family NAME       how A moves with θ:
      shift        A + θ·u, u = --direction normalised to unit length; θ in cloud units
                   (default range -1 … 1)
      rotate       A turned by θ degrees (counter-clockwise) about --center
                   (default range -180 … 180)
      scale        A scaled by the factor θ about --center (default range 0.25 … 2;
                   θ = 1 is A as given)
      interpolate  displacement interpolation along the exact W2 plan from A to B: every plan
                   entry (i, j, m) becomes the point (1-θ)x_i + θy_j with mass m; θ in [0, 1]
                   (default 0 … 1); θ = 1 is B
      mix          the mass mixture (1-θ)A + θB: both point sets, A's normalised weights
                   times (1-θ) and B's times θ; nothing moves; θ in [0, 1] (default 0 … 1)
  --direction dx,dy   shift direction (default 1,0; any non-zero length, normalised)
  --center x,y        pivot of rotate and scale (default: A's weighted centroid)
  --from F --to T     θ range (defaults above); --steps N  θ values on the grid (default 81)
  --reference R       θ0 where data-dependent settings (ε, bandwidths, histogram grids, σ) are
                      frozen for the whole sweep (default: the family's identity, θ0 = 1 for
                      scale and 0 otherwise, i.e. A as given); printed after the run
  --measures ids      comma-separated (default: every measure except the slow critic_*)
  --set key=value     measure parameters (see measure --help)
  --threads N         worker threads (default 0 = all cores); results do not depend on it
  --refine-budget N   θ values refinement may add near suspected jumps (default max(64, steps);
                      shared in turns between the measures that have suspects)
  --resolution H      θ width suspects are bisected down to (default 1e-5 × (to - from))
  --no-refine         no refinement: steep steps stay "unresolved", never "jumps"
  --no-warm-start     solve every θ from scratch (same results, slower)
)";

const char* kFindingsRule = R"(How a jump is decided:
  A step between neighbouring θ is *suspect* when it exceeds 0.1 % of the curve's range and its
  slope is over 4× the median slope of up to 3 intervals on each side. The sweep bisects each
  suspect down to the resolution H. A suspect is reported as a *jump* only when, at width <= H,
  its change is above the noise floor (0.1 % of the range, and twice the solver's stated
  accuracy) and above 4 × (the largest slope of up to 3 neighbouring intervals) × its width:
  no slope seen around it can explain the change. Detection limit: a jump of size J where the
  curve's slope is L is seen on a grid of spacing Δθ when |J| is above about 4·L·Δθ; smaller
  jumps pass as slope (raise --steps to see them). A change to or from +∞ is a jump once
  bisected to H. A suspect the budget could not bring down to H is listed as *unresolved*
  (JSON "unresolved"), never as a jump. Assumption: the slope of D does not grow more than
  4-fold within a few widths H; a continuous change steeper than that below H cannot be told
  from a jump at this resolution.
Flat: at least 3 θ values spanning 2 typical spacings where |dD/dθ| < 0.1 % of range/θ-range
  (or D = +∞) while D is more than 1 % of its range above its minimum: no useful gradient.
Lipschitz: the largest |ΔD/Δθ| between neighbours, jumps and unresolved suspects left out.
Monotone: D never falls (by more than 0.1 % of its range) walking away from its best θ.
)";

}  // namespace

std::string commandHelp(const std::string& command) {
  if (command == "sweep")
    return std::string(R"(barrow-cli sweep --a A --b B --family F [options] --out sweep.csv

Evaluates the measures on (A_θ, B) over a θ grid, with dD/dθ, refining near suspected jumps.
--out FILE (checked writable before the run) gets CSV: '#' lines with the settings (family,
normalised direction, range, reference θ0, frozen parameters and the rules they came from,
refinement budget and resolution), then theta,<id>...,d_<id>... ; +∞ is 'inf', a failed cell
is empty.

)") + kSweepOptions;
  if (command == "findings")
    return std::string(R"(barrow-cli findings --sweep sweep.csv [--json]
barrow-cli findings <sweep options> [--out sweep.csv] [--json]

One verdict per measure: jumps, unresolved suspects, flat stretches, a Lipschitz estimate and
whether D grows away from its best θ, in words, or as JSON:
  {"findings":[{"id","continuous","jumps":[{"theta","size"}],"unresolved":[...],"flat",
                "lipschitz","monotone","summary"}]}
A jump to or from +∞ has "size": null and "to": "inf" or "from": "inf". "continuous" is
false when there is a jump or an unresolved suspect.

)") + kFindingsRule + "\n" + kSweepOptions;
  if (command == "report")
    return std::string(R"(barrow-cli report --session S.json [--title T] [--threads N] [--no-refine] --out report.html
barrow-cli report --a A --b B <sweep options> [--title T] --out report.html

Runs the sweep, its findings and every swept measure on A against B, then writes one HTML file
that opens offline in any browser: both clouds with the exact W2 plan at the reference θ, the
measures with their settings, the curves with a θ slider that moves A and reads every measure
out at that θ (the sweep's own values), the findings in words, cautions, and the barrow-cli
lines that reproduce it. The numbers are inside as JSON in
<script type="application/json" id="barrow-report-data"> (keys clouds, settings, measures,
sweep {columns, rows}, findings).

)") + kSweepOptions;
  if (command == "plan")
    return R"(barrow-cli plan --a A --b B [--cost w1|w2] --out plan.csv [--potentials P.csv]

Solves exact optimal transport (network simplex) and writes the plan, one nonzero per line:
  i,j,mass,ax,ay,bx,by,cost
i, j: 0-based data rows of A and B; mass under the normalised weights (sums to 1);
cost = |x_i - y_j| (w1, the default) or |x_i - y_j|^2 (w2).
--out - writes the CSV to standard output (the summary then goes to standard error).
The output file is checked for writability before the solve.
--potentials P.csv writes the dual potentials, the optimality certificate, with the header
  side,index,potential
side A or B, index the 0-based data row. They belong to the cost above (|x-y|^2 for w2, not
W2 itself): u_i + v_j <= c_ij for every pair, with equality on the plan, and
sum_i a_i u_i + sum_j b_j v_j = the optimal cost. They are unique only up to u + t, v - t
(more freedom when the problem is degenerate). The summary names the cost.
)";
  if (command == "critic")
    return R"(barrow-cli critic --a A --b B [--method clip|gp|sn|all] [--steps N] [--seed S]
                  [--set critic.key=value ...] [--json]

Trains a small MLP critic f (default 2-64-64-1, ReLU) to maximise E_A f - E_B f on minibatches
drawn from the weighted clouds, kept near 1-Lipschitz by weight clipping + RMSProp, gradient
penalty + Adam, or spectral normalisation + Adam, each with its paper's defaults, and compares
it with the exact W1 (default --method all, --steps 1000, --seed 1).
Per method: estimate E_A f - E_B f; lower_bound = estimate / L_upper <= W1 (Kantorovich-
Rubinstein duality); L_upper = product of the layers' spectral norms; L_measured = largest
|grad f| on a grid over both clouds and on the data; potential_correlation = correlation of f
with the exact W1 potential on the data points; steps; seconds; status.
--json: {"critics":[{"method","estimate","lower_bound","w1","lipschitz_upper",
                     "lipschitz_measured","potential_correlation","steps","seconds","status"}]}
Parameters (critic.*) as listed below; --steps and --seed set critic.steps and critic.seed.
)";
  return "";
}

}  // namespace barrow::cli

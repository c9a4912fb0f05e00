// barrow-cli: headless access to Barrow's engine. Exit codes: 0 ok, 2 bad input, 1 failure.
#include <cstdio>
#include <cstring>
#include <exception>
#include <string>
#include <vector>

#include "cli/cli_common.h"
#include "cli/commands.h"
#include "cli/measures_help.h"
#include "cli/resampling_cli.h"

namespace {

const char* kUsage = R"(barrow-cli — measure distances between two weighted 2-D point clouds

usage:
  barrow-cli measure  --a A.csv --b B.csv [--measures w1,w2,...] [--set key=value ...] [--json]
  barrow-cli plan     --a A.csv --b B.csv [--cost w1|w2] --out plan.csv [--potentials P.csv]
  barrow-cli sweep    --a A.csv --b B.csv --family shift|rotate|scale|interpolate|mix
                      [--direction dx,dy] [--from F --to T --steps N] [--measures ...] --out sweep.csv
                      [--center x,y] [--reference R] [--set key=value ...] [--threads N]
                      [--refine-budget N] [--resolution H] [--no-refine] [--no-warm-start]
                      [--resamples B [--level L] [--seed S]]
  barrow-cli findings --sweep sweep.csv  (or the sweep options)  [--json]
  barrow-cli demo     (writes a demo scenario and runs a sweep on it)  [--out DIR] [--json]
  barrow-cli report   (--session S.json | --a A --b B [sweep options]) --out report.html [--title T]
  barrow-cli spread   --a A --b B [--measures ...] [--resamples 200] [--level 0.95] [--seed S] [--json]
  barrow-cli permute  --a A --b B [--measures ...] [--permutations 999] [--seed S] [--json]
  barrow-cli sizes    --a A --b B [--measures ...] [--sizes n1,n2,...] [--repeats 20] [--seed S] [--json]
  barrow-cli critic   --a A --b B [--method clip|gp|sn|all] [--steps N] [--seed S]
                      [--set critic.key=value ...] [--json]   (Lipschitz critics against exact W1)
  barrow-cli --help | --version | COMMAND --help

Clouds are CSV (columns x,y[,w]; header optional) or NumPy .npy of shape (n,2) or (n,3).
plan --potentials writes side,index,potential (side A or B, index = 0-based data row): the dual
  potentials of the plan's cost, |x-y| for w1 and |x-y|^2 for w2 (not its root): u_i + v_j <= c_ij
  for every pair, equal on the plan, sum a_i u_i + sum b_j v_j = the optimal cost.
Parameters: --set group.key=value, e.g. --set sinkhorn.epsilon=0.01 --set density.bin=0.25
Measures: w1 w2 entropic sinkhorn sliced mmd energy frechet chamfer hausdorff
          kl_ab kl_ba js tv hellinger   (formulas and parameters: barrow-cli measure --help)
          critic_clip critic_gp critic_sn   (slow; run only when named in --measures)
Exit codes: 0 ok, 2 bad input (the message names file, line and reason), 1 internal failure.
Every value is an estimate from finite samples under the chosen settings.
)";

}  // namespace

int main(int argc, char** argv) {
  using namespace barrow::cli;
  if (argc < 2 || !std::strcmp(argv[1], "--help") || !std::strcmp(argv[1], "-h") ||
      !std::strcmp(argv[1], "help")) {
    std::fputs(kUsage, argc < 2 ? stderr : stdout);
    return argc < 2 ? kExitBadInput : kExitOk;
  }
  if (!std::strcmp(argv[1], "--version")) {
    std::puts("barrow-cli 0.1.0");
    return kExitOk;
  }
  const std::string cmd = argv[1];
  const std::vector<std::string> rest(argv + 2, argv + argc);
  for (const auto& a : rest)
    if (a == "--help" || a == "-h") {
      const std::string own = resamplingHelp(cmd).empty() ? commandHelp(cmd) : resamplingHelp(cmd);
      std::fputs(own.empty() ? kUsage : own.c_str(), stdout);
      if (cmd == "measure" || cmd == "sweep" || cmd == "critic") std::fputs(("\n" + measuresHelp()).c_str(), stdout);
      return kExitOk;
    }
  try {
    if (cmd == "measure") return runMeasure(rest);
    if (cmd == "plan") return runPlan(rest);
    if (cmd == "sweep") return runSweep(rest);
    if (cmd == "findings") return runFindings(rest);
    if (cmd == "demo") return runDemo(rest);
    if (cmd == "report") return runReport(rest);
    if (cmd == "spread") return runSpread(rest);
    if (cmd == "permute") return runPermute(rest);
    if (cmd == "sizes") return runSizes(rest);
    if (cmd == "critic") return runCritic(rest);
    std::fprintf(stderr, "barrow-cli: unknown command '%s' (see --help)\n", cmd.c_str());
    return kExitBadInput;
  } catch (const UsageError& e) {
    std::fprintf(stderr, "barrow-cli %s: %s\n", cmd.c_str(), e.message.c_str());
    return kExitBadInput;
  } catch (const InputError& e) {
    std::fprintf(stderr, "barrow-cli %s: %s\n", cmd.c_str(), e.message.c_str());
    return kExitBadInput;
  } catch (const InternalError& e) {
    std::fprintf(stderr, "barrow-cli %s: %s\n", cmd.c_str(), e.message.c_str());
    return kExitInternal;
  } catch (const std::exception& e) {
    std::fprintf(stderr, "barrow-cli %s: internal error: %s\n", cmd.c_str(), e.what());
    return kExitInternal;
  }
}

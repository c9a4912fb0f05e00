// Optimality certificate of a transport plan with dual potentials (LP duality for the
// transport problem; Villani 2009, "Optimal Transport: Old and New", Thm 5.10 (mem)):
// the plan is optimal iff it is feasible (marginals), the potentials are feasible
// (u_i + v_j <= c_ij for every pair), and the duality gap Σπc − (Σa u + Σb v) is zero,
// equivalently c_ij = u_i + v_j wherever π_ij > 0 (complementary slackness).
// Checked by brute force over all n·m pairs: for tests, the CLI summary and diagnostics.
#pragma once

#include <Eigen/Core>
#include <string>
#include <vector>

#include "base/plan_entry.h"
#include "cloud/cloud.h"

namespace barrow {

struct TransportCertificate {
  bool wellFormed = false;          // indices in range, masses finite and >= 0
  double marginalError = 0.0;       // max |Σ_j π_ij − a_i| and |Σ_i π_ij − b_j| (absolute)
  double marginalRelError = 0.0;    // the same divided by the weight (rows of positive weight)
  double dualViolation = 0.0;       // max over all pairs of u_i + v_j − c_ij (<= 0 is feasible)
  double slackness = 0.0;           // max over the support of |c_ij − u_i − v_j|
  double primal = 0.0;              // Σ π_ij c_ij
  double dual = 0.0;                // Σ a_i u_i + Σ b_j v_j
  int support = 0;                  // entries with positive mass
  Eigen::Index n = 0, m = 0;        // sizes of A and B
  double costScale = 0.0;           // (bounding-box diagonal of all points)^p
};

/// Weights are normalised; cost c = ‖x − y‖^p. u, v must have one entry per row.
TransportCertificate certifyTransport(const Cloud& a, const Cloud& b, double p, const std::vector<PlanEntry>& plan,
                                      const Eigen::VectorXd& u, const Eigen::VectorXd& v);

/// Empty when the certificate holds: marginals within relTol of each weight, dual
/// violation within relTol·costScale, slackness and |primal − dual| within 10·relTol·costScale,
/// support at most n + m − 1 (a basic solution). Otherwise the first failure, in words.
std::string certificateFailure(const TransportCertificate& t, double relTol = 1e-12);

}  // namespace barrow

// barrow-cli plan --potentials: the dual potentials as an optimality certificate, checked on
// random instances against the plan itself and against an independent LP solver (HiGHS through
// scipy.optimize.linprog).
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>
#include <vector>

#include "support/test_support.h"

namespace barrow {
namespace {

int cli(const std::string& args, std::string* out = nullptr, std::string* err = nullptr) {
  return test::runCommand(std::string(BARROW_CLI) + " " + args, out, err);
}

struct Instance {
  std::vector<double> x, y, w;
};

// n points, N(0,1) coordinates plus `offset`; some duplicates and one zero weight when asked
// (degenerate problems: ties in the costs and in the marginals).
Instance randomInstance(int n, unsigned seed, double offset, bool awkward) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> g(0.0, 1.0);
  std::uniform_real_distribution<double> u(0.1, 1.0);
  Instance c;
  for (int i = 0; i < n; ++i) {
    const bool copy = awkward && i > 0 && i % 4 == 0;
    c.x.push_back(copy ? c.x[std::size_t(i - 1)] : offset + g(rng));
    c.y.push_back(copy ? c.y[std::size_t(i - 1)] : g(rng));
    c.w.push_back(awkward ? double(1 + i % 3) : u(rng));
  }
  if (awkward) c.w[1] = 0.0;
  return c;
}

std::string csvOf(const Instance& c) {
  std::ostringstream o;
  o.precision(17);
  for (std::size_t i = 0; i < c.x.size(); ++i) o << c.x[i] << "," << c.y[i] << "," << c.w[i] << "\n";
  return o.str();
}

std::string pyList(const std::vector<double>& v) {
  std::ostringstream o;
  o.precision(17);
  o << "[";
  for (double d : v) o << d << ",";
  return o.str() + "]";
}

// [P] LP duality for the transport problem min <π, C> s.t. π1 = a, πᵀ1 = b, π ≥ 0 (Peyré &
// Cuturi 2019, Sec. 3.2 (mem); any LP text): (u, v) is optimal iff u_i + v_j ≤ c_ij for all
// pairs (dual feasible) and u_i + v_j = c_ij wherever π_ij > 0 (complementary slackness),
// equivalently Σ a_i u_i + Σ b_j v_j = <π, C>. Potentials are unique only up to u + t, v − t
// (more under degeneracy), so raw values are not compared with HiGHS's: the objective is, and
// each solver's duals are checked against the other's primal (any optimal dual is
// complementary to every optimal primal).
TEST(CliPotentialsTest, PotentialsCertifyThePlanAgainstHighsOnRandomInstances) {
  if (!test::pythonHas("numpy, scipy")) GTEST_SKIP() << "python3-scipy not installed";
  struct Case {
    int n, m;
    unsigned seed;
    bool awkward;
    const char* cost;
  };
  const Case cases[] = {{5, 7, 1, false, "w1"},  {5, 7, 1, false, "w2"}, {30, 20, 2, true, "w1"},
                        {30, 20, 2, true, "w2"}, {60, 80, 3, false, "w2"}, {40, 40, 4, true, "w1"},
                        {8, 3, 5, true, "w2"}};
  for (const Case& c : cases) {
    const std::string tag = std::to_string(c.n) + "x" + std::to_string(c.m) + "-" + c.cost;
    const Instance A = randomInstance(c.n, c.seed, 0.0, c.awkward);
    const Instance B = randomInstance(c.m, c.seed + 100, 1.5, c.awkward);
    const std::string pa = test::tempPath("pot-a-" + tag + ".csv"), pb = test::tempPath("pot-b-" + tag + ".csv");
    const std::string plan = test::tempPath("pot-plan-" + tag + ".csv"), pot = test::tempPath("pot-" + tag + ".csv");
    test::writeText(pa, csvOf(A));
    test::writeText(pb, csvOf(B));
    std::string out, err;
    ASSERT_EQ(cli("plan --a " + pa + " --b " + pb + " --cost " + c.cost + " --out " + plan + " --potentials " + pot,
                  &out, &err),
              0)
        << tag << ": " << err;
    // The cost the potentials belong to is stated on stdout.
    EXPECT_NE(out.find(std::string("c(x, y) = ") + (std::string(c.cost) == "w1" ? "|x-y| " : "|x-y|^2 ")),
              std::string::npos)
        << out;

    // The file: exactly the contract's header, every A row then every B row, 0-based.
    std::istringstream in(test::readText(pot));
    std::string line;
    std::getline(in, line);
    EXPECT_EQ(line, "side,index,potential");
    std::vector<double> u, v;
    while (std::getline(in, line)) {
      std::istringstream s(line);
      std::string side, index, value;
      std::getline(s, side, ',');
      std::getline(s, index, ',');
      std::getline(s, value);
      auto& vec = side == "A" ? u : v;
      ASSERT_TRUE(side == "A" || side == "B") << line;
      ASSERT_EQ(std::stoi(index), int(vec.size())) << line;
      vec.push_back(std::stod(value));
    }
    ASSERT_EQ(int(u.size()), c.n) << tag;
    ASSERT_EQ(int(v.size()), c.m) << tag;

    std::ostringstream py;
    py << "import numpy as np\nfrom scipy.optimize import linprog\n"
       << "ax=np.array(" << pyList(A.x) << ");ay=np.array(" << pyList(A.y) << ");aw=np.array(" << pyList(A.w)
       << ")\nbx=np.array(" << pyList(B.x) << ");by=np.array(" << pyList(B.y) << ");bw=np.array(" << pyList(B.w)
       << ")\nu=np.array(" << pyList(u) << ");v=np.array(" << pyList(v) << ")\np=" << (c.cost[1] == '1' ? 1 : 2)
       << "\n"
       << R"(a=aw/aw.sum(); b=bw/bw.sum(); n=len(a); m=len(b)
C=np.hypot(ax[:,None]-bx[None,:], ay[:,None]-by[None,:])**p
P=np.zeros((n,m))
for l in open(')" << plan << R"(').read().splitlines()[1:]:
    f=l.split(','); P[int(f[0]),int(f[1])]+=float(f[2])
scale=C.max()
R=C-u[:,None]-v[None,:]                      # reduced costs of our potentials
Aeq=np.zeros((n+m,n*m))
for i in range(n): Aeq[i,i*m:(i+1)*m]=1
for j in range(m): Aeq[n+j,j::m]=1
res=linprog(C.ravel(),A_eq=Aeq,b_eq=np.concatenate([a,b]),bounds=(0,None),method='highs')
assert res.status==0, res.message
uh=res.eqlin.marginals[:n]; vh=res.eqlin.marginals[n:]; X=res.x.reshape(n,m)
Rh=C-uh[:,None]-vh[None,:]
print(repr(-R.min()/scale))                                  # dual feasibility of ours
print(repr(np.abs(R[P>0]).max()/scale))                      # our slackness on our plan
print(repr(np.abs(R[X>1e-12]).max()/scale))                  # our duals vs HiGHS's plan
print(repr(np.abs(Rh[P>0]).max()/scale))                     # HiGHS's duals vs our plan
print(repr(abs(a@u+b@v-res.fun)/scale))                      # our dual objective = LP optimum
print(repr(abs((P*C).sum()-res.fun)/scale))                  # our plan's cost = LP optimum
)";
    std::istringstream r(test::runPython(py.str()));
    double infeasible = NAN, slackOurs = NAN, slackVsHighsPlan = NAN, highsVsOurPlan = NAN, dualGap = NAN,
           primalGap = NAN;
    r >> infeasible >> slackOurs >> slackVsHighsPlan >> highsVsOurPlan >> dualGap >> primalGap;
    ASSERT_TRUE(r) << tag;
    // Tolerances relative to the largest cost: the solver's own (1e-12 of the box's cost
    // scale) plus rounding of sums over n + m terms; HiGHS's default primal and dual
    // feasibility tolerances are 1e-7 absolute, so its side gets 1e-6 relative.
    EXPECT_LE(infeasible, 1e-10) << tag;
    EXPECT_LE(slackOurs, 1e-10) << tag;
    EXPECT_LE(slackVsHighsPlan, 1e-6) << tag;
    EXPECT_LE(highsVsOurPlan, 1e-6) << tag;
    EXPECT_LE(dualGap, 1e-8) << tag;
    EXPECT_LE(primalGap, 1e-8) << tag;
  }
}

TEST(CliPotentialsTest, HelpStatesTheOptionAndItsCost) {
  std::string out;
  ASSERT_EQ(cli("--help", &out), 0);
  EXPECT_NE(out.find("--potentials P.csv"), std::string::npos);
  EXPECT_NE(out.find("side,index,potential"), std::string::npos);
  EXPECT_NE(out.find("|x-y|^2 for w2"), std::string::npos);
}

}  // namespace
}  // namespace barrow

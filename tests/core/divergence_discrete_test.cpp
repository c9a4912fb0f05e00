// Discrete f-divergences (core/density/discrete_divergence.h) against SciPy, published worked
// values and the classical inequalities. Sources per REFERENCES.md rows 10a–10c.
#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <sstream>

#include "density/discrete_divergence.h"
#include "support/test_support.h"

namespace barrow {
namespace {

Eigen::VectorXd vec(std::initializer_list<double> v) {
  Eigen::VectorXd out(Eigen::Index(v.size()));
  Eigen::Index i = 0;
  for (double x : v) out(i++) = x;
  return out;
}

// A random distribution on `cells` cells, some cells empty when `holes`.
Eigen::VectorXd randomDistribution(std::mt19937& rng, int cells, bool holes) {
  std::uniform_real_distribution<double> u(0.0, 1.0);
  Eigen::VectorXd p(cells);
  for (int i = 0; i < cells; ++i) p(i) = (holes && u(rng) < 0.3) ? 0.0 : std::pow(u(rng), 3.0);
  if (p.sum() == 0) p(0) = 1;
  return p / p.sum();
}

std::string pyVector(const Eigen::VectorXd& v) {
  std::ostringstream s;
  s.precision(17);
  s << "np.array([";
  for (Eigen::Index i = 0; i < v.size(); ++i) s << v(i) << ",";
  s << "])";
  return s.str();
}

// [P] Lin 1991, IEEE TIT 37:145–151 (JS with ½ factors); values from scipy.stats.entropy and
// scipy.spatial.distance.jensenshannon(p, q)**2 as listed in REFERENCES.md row 10a.
TEST(DiscreteDivergenceTest, MatchesWorkedExampleOfReferenceRow10a) {
  const Eigen::VectorXd p = vec({0.5, 0.5}), q = vec({0.9, 0.1});
  EXPECT_NEAR(discreteKl(p, q).value, 0.510825623766, 1e-12);
  EXPECT_NEAR(discreteKl(q, p).value, 0.368064207168, 1e-12);
  EXPECT_NEAR(discreteJs(p, q), 0.101749225079, 1e-12);
  EXPECT_NEAR(discreteJs(p, q) / std::log(2.0), 0.146793, 1e-6);  // in bits (base=2)
  EXPECT_NEAR(discreteTv(p, q), 0.4, 1e-15);
  EXPECT_NEAR(std::pow(discreteHellinger(p, q), 2), 0.105572809, 1e-9);  // H² = 1 − Σ√(pq)
  EXPECT_NEAR(discreteDivergence(DivergenceKind::KlBA, p, q), 0.368064207168, 1e-12);
}

// Reference library: scipy.stats.entropy (normalises, natural log), jensenshannon (returns
// the square root, so it is squared here), and NumPy for TV and Hellinger from their
// definitions (REFERENCES.md conventions). Random pairs with empty cells on both sides.
TEST(DiscreteDivergenceTest, AgreesWithScipyOnRandomPairsTo1e12) {
  if (!test::pythonHas("scipy, numpy")) GTEST_SKIP() << "python3-scipy not installed";
  std::mt19937 rng(17);
  std::ostringstream py;
  py << "import numpy as np\nfrom scipy.stats import entropy\n"
        "from scipy.spatial.distance import jensenshannon, euclidean\n";
  std::vector<std::pair<Eigen::VectorXd, Eigen::VectorXd>> pairs;
  for (int t = 0; t < 40; ++t) {
    const int cells = 2 + t * 7;
    pairs.push_back({randomDistribution(rng, cells, t % 2 == 1), randomDistribution(rng, cells, false)});
    const auto& [p, q] = pairs.back();
    py << "p=" << pyVector(p) << "\nq=" << pyVector(q) << "\n"
       << "print(repr(entropy(p,q)), repr(entropy(q,p)), repr(jensenshannon(p,q)**2),"
          " repr(0.5*np.abs(p-q).sum()), repr(euclidean(np.sqrt(p),np.sqrt(q))/np.sqrt(2)))\n";
  }
  std::istringstream out(test::runPython(py.str()));
  for (const auto& [p, q] : pairs) {
    std::string kl, rkl;
    double js = 0, tv = 0, h = 0;
    out >> kl >> rkl >> js >> tv >> h;
    ASSERT_TRUE(out) << "python output ended early";
    // q has no empty cell, so KL(p‖q) is finite; KL(q‖p) is +inf exactly when p has holes.
    EXPECT_NEAR(discreteKl(p, q).value, std::stod(kl), 1e-12);
    if (rkl == "inf") {
      EXPECT_TRUE(std::isinf(discreteKl(q, p).value));
    } else {
      EXPECT_NEAR(discreteKl(q, p).value, std::stod(rkl), 1e-12);
    }
    EXPECT_NEAR(discreteJs(p, q), js, 1e-12);
    EXPECT_NEAR(discreteTv(p, q), tv, 1e-12);
    EXPECT_NEAR(discreteHellinger(p, q), h, 1e-12);
  }
}

// [D] with scipy's convention (entropy returns +inf when q = 0 < p): the infinity is exact and
// the count and mass of the offending cells are reported.
TEST(DiscreteDivergenceTest, KlIsInfiniteWithCountAndMassOfEmptyCells) {
  const Eigen::VectorXd p = vec({0.2, 0.3, 0.5, 0.0}), q = vec({0.4, 0.0, 0.0, 0.6});
  const DiscreteKl kl = discreteKl(p, q);
  EXPECT_TRUE(std::isinf(kl.value) && kl.value > 0);
  EXPECT_EQ(kl.emptyCells, 2);
  EXPECT_NEAR(kl.unmatchedMass, 0.8, 1e-15);
  // JS, TV and H stay finite on disjoint supports and reach their maxima ln 2, 1, 1.
  const Eigen::VectorXd a = vec({0.5, 0.5, 0.0}), b = vec({0.0, 0.0, 1.0});
  EXPECT_NEAR(discreteJs(a, b), std::log(2.0), 1e-15);
  EXPECT_DOUBLE_EQ(discreteTv(a, b), 1.0);
  EXPECT_DOUBLE_EQ(discreteHellinger(a, b), 1.0);
  EXPECT_EQ(discreteJs(a, a), 0.0);
}

// Pinsker TV ≤ √(KL/2) (Cover & Thomas (mem)); JS ≤ ln2·TV [D]; H² ≤ TV ≤ √2·H with
// H² = ½Σ(√p−√q)² (Le Cam; Tsybakov 2009 Lemma 2.3 (mem), whose H² is twice this one).
// REFERENCES.md row 10b: 0 violations in 2000 random pairs.
TEST(DiscreteDivergenceTest, ClassicalInequalitiesHoldOnRandomHistograms) {
  std::mt19937 rng(5);
  const double slack = 1e-12;
  for (int t = 0; t < 2000; ++t) {
    const int cells = 2 + t % 50;
    const Eigen::VectorXd p = randomDistribution(rng, cells, t % 3 == 0);
    const Eigen::VectorXd q = randomDistribution(rng, cells, t % 5 == 0);
    const double kl = discreteKl(p, q).value, tv = discreteTv(p, q), js = discreteJs(p, q);
    const double h = discreteHellinger(p, q);
    EXPECT_LE(tv, std::sqrt(kl / 2) + slack) << t;
    EXPECT_LE(js, std::log(2.0) * tv + slack) << t;
    EXPECT_LE(h * h, tv + slack) << t;
    EXPECT_LE(tv, std::sqrt(2.0) * h + slack) << t;
  }
}

// Mass of N(mu, sd²) in [lo, hi), without cancellation in either tail.
double normalMass(double lo, double hi, double mu, double sd) {
  const double a = (lo - mu) / (sd * std::sqrt(2.0)), b = (hi - mu) / (sd * std::sqrt(2.0));
  if (a >= 0) return 0.5 * (std::erfc(a) - std::erfc(b));
  return 0.5 * (std::erfc(-b) - std::erfc(-a));
}

// Exact masses of P and Q on the square bins [kh, (k+1)h)² over [-12, 13) × [-10, 10), and
// one cell for everything outside (so the cells partition the plane).
void exactBinMasses(double h, Eigen::VectorXd* p, Eigen::VectorXd* q) {
  // P = N(0, I), Q = N((1,0), diag(2.25, 1)): the axes are independent, so masses factorise.
  const int nx = int(std::lround(25 / h)), ny = int(std::lround(20 / h));
  std::vector<double> px(nx), qx(nx), py(ny), qy(ny);
  for (int i = 0; i < nx; ++i) {
    px[i] = normalMass(-12 + i * h, -12 + (i + 1) * h, 0, 1);
    qx[i] = normalMass(-12 + i * h, -12 + (i + 1) * h, 1, 1.5);
  }
  for (int j = 0; j < ny; ++j) {
    py[j] = normalMass(-10 + j * h, -10 + (j + 1) * h, 0, 1);
    qy[j] = py[j];
  }
  p->resize(nx * ny + 1);
  q->resize(nx * ny + 1);
  for (int i = 0; i < nx; ++i)
    for (int j = 0; j < ny; ++j) {
      (*p)(i * ny + j) = px[i] * py[j];
      (*q)(i * ny + j) = qx[i] * qy[j];
    }
  (*p)(nx * ny) = std::max(0.0, 1.0 - p->head(nx * ny).sum());
  (*q)(nx * ny) = std::max(0.0, 1.0 - q->head(nx * ny).sum());
}

// [P] data-processing inequality for f-divergences (Csiszár): binning can only lower them, and
// refining a partition can only raise them. REFERENCES.md row 10c: continuous KL 0.34990955
// (closed form, Kullback 1959 (mem)), JS 0.09929010, TV 0.34612308, H² 0.11036537.
TEST(DiscreteDivergenceTest, ExactBinMassesNeverExceedContinuousValues) {
  // KL(N0‖N1) = ½[tr(S1⁻¹S0) + Δmᵀ S1⁻¹ Δm − 2 + ln(det S1/det S0)], S1 = diag(2.25, 1).
  const double klExact = 0.5 * (1 / 2.25 + 1 + 1 / 2.25 - 2 + std::log(2.25));
  EXPECT_NEAR(klExact, 0.34990955, 1e-8);
  double previous = 0.0;
  for (double h : {2.0, 1.0, 0.5, 0.25, 0.125, 0.05}) {
    Eigen::VectorXd p, q;
    exactBinMasses(h, &p, &q);
    const double kl = discreteKl(p, q).value;
    EXPECT_LE(kl, klExact) << "h = " << h;
    if (h != 0.05) {
      EXPECT_GE(kl, previous - 1e-12) << "refinement lowered KL at h = " << h;
    }
    previous = kl;
    EXPECT_LE(discreteJs(p, q), 0.09929010 + 1e-8);
    EXPECT_LE(discreteTv(p, q), 0.34612308 + 1e-8);
    EXPECT_LE(std::pow(discreteHellinger(p, q), 2), 0.11036537 + 1e-8);
    // Values listed in REFERENCES.md row 10c for h = 2, 0.5, 0.05 (bins at multiples of h).
    if (h == 2.0) {
      EXPECT_NEAR(kl, 0.2790, 5e-5);
    }
    if (h == 0.5) {
      EXPECT_NEAR(kl, 0.3447, 5e-5);
    }
    if (h == 0.05) {
      EXPECT_NEAR(kl, 0.34986, 5e-6);
      EXPECT_NEAR(discreteJs(p, q), 0.09929010, 1e-4);
      EXPECT_NEAR(discreteTv(p, q), 0.34612308, 1e-3);
    }
  }
}

}  // namespace
}  // namespace barrow

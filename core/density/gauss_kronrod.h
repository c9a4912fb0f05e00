// The 7-point Gauss / 15-point Kronrod pair on one interval (Piessens, de Doncker-Kapenga,
// Überhuber, Kahaner 1983, QUADPACK, rule qk15; nodes and weights as published there, to 33
// digits, rounded to double). K15 integrates polynomials of degree ≤ 22 exactly, G7 those of
// degree ≤ 13 (checked in tests/core/kde_tv_test.cpp, with G7 against numpy's leggauss).
#pragma once

#include <array>

namespace barrow {

/// Kronrod nodes on [−1, 1], descending; kKronrodX[1], [3], [5] and [7] = 0 are the Gauss nodes.
inline constexpr std::array<double, 8> kKronrodX = {
    0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
    0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
    0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
    0.207784955007898467600689403773245, 0.0};
inline constexpr std::array<double, 8> kKronrodW = {
    0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
    0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
    0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
    0.204432940075298892414161999234649, 0.209482141084727828012999174891714};
/// Gauss weights at kKronrodX[1], [3], [5], [7].
inline constexpr std::array<double, 4> kGaussW = {
    0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
    0.381830050505118944950369775488975, 0.417959183673469387755102040816327};

/// The 15 abscissae of [lo, hi] in the order kronrodSums expects (index 7 is the midpoint).
inline std::array<double, 15> kronrodNodes(double lo, double hi) {
  const double c = 0.5 * (lo + hi), h = 0.5 * (hi - lo);
  std::array<double, 15> x{};
  for (int k = 0; k < 7; ++k) {
    x[std::size_t(k)] = c - h * kKronrodX[std::size_t(k)];
    x[std::size_t(14 - k)] = c + h * kKronrodX[std::size_t(k)];
  }
  x[7] = c;
  return x;
}

struct KronrodSums {
  double kronrod = 0.0;  // K15
  double gauss = 0.0;    // G7
};

/// K15 and G7 on [lo, hi] from f at kronrodNodes(lo, hi).
inline KronrodSums kronrodSums(double lo, double hi, const std::array<double, 15>& f) {
  const double h = 0.5 * (hi - lo);
  KronrodSums s;
  for (int k = 0; k < 7; ++k) {
    const double pair = f[std::size_t(k)] + f[std::size_t(14 - k)];
    s.kronrod += kKronrodW[std::size_t(k)] * pair;
    if (k % 2 == 1) s.gauss += kGaussW[std::size_t(k / 2)] * pair;
  }
  s.kronrod += kKronrodW[7] * f[7];
  s.gauss += kGaussW[3] * f[7];
  s.kronrod *= h;
  s.gauss *= h;
  return s;
}

}  // namespace barrow

// Which f-divergence a density measure reports (DEVELOPERS.md, "Measure conventions").
#pragma once

namespace barrow {

// The order indexes tables (density_measures.cpp): append new kinds at the end.
enum class DivergenceKind {
  KlAB,       // KL(A‖B) = Σ p ln(p/q), nats; A is the first argument
  KlBA,       // KL(B‖A)
  Js,         // ½KL(P‖M) + ½KL(Q‖M), M = (P+Q)/2; in [0, ln 2]; not its square root
  Tv,         // ½Σ|p−q| in [0, 1]
  Hellinger,  // sqrt(½Σ(√p−√q)²) in [0, 1]
};

inline bool isKl(DivergenceKind k) { return k == DivergenceKind::KlAB || k == DivergenceKind::KlBA; }

/// Short ASCII label for messages: "KL(A||B)", "KL(B||A)", "JS", "TV", "Hellinger".
inline const char* divergenceLabel(DivergenceKind k) {
  switch (k) {
    case DivergenceKind::KlAB: return "KL(A||B)";
    case DivergenceKind::KlBA: return "KL(B||A)";
    case DivergenceKind::Js: return "JS";
    case DivergenceKind::Tv: return "TV";
    case DivergenceKind::Hellinger: return "Hellinger";
  }
  return "?";
}

}  // namespace barrow

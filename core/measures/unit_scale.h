// Evaluating a measure on clouds whose coordinates are all very small or very large.
//
// Distances are computed through their squares, which underflow to 0 below ~1e-154 and
// overflow to +inf above ~1e154: A = (0,0), B = (1e-300,0) gave W1 = 0 with status ok. For
// such clouds a measure that is positively homogeneous in the coordinates
// (D(sA, sB) = s^k D(A, B): k = 1 for W1, W2, sliced W2 and Fréchet; k = ½ for the energy
// distance, the square root of a mean of distances) is evaluated on copies divided by a
// power of two — exact in binary, so nothing is rounded except subnormal leftovers — and
// the value multiplied back by unit^k. [D] the degrees follow from each definition.
#pragma once

#include <initializer_list>
#include <utility>

#include "cloud/cloud.h"
#include "measures/measure.h"

namespace barrow {

/// 1 when the largest coordinate magnitude of a and b is within [2^-60, 2^60] or all are 0
/// (squares of such coordinates and of their differences stay normal numbers, and nothing
/// changes for ordinary data); otherwise the power of two nearest below that magnitude.
double extremeCoordinateUnit(const Cloud& a, const Cloud& b);

/// A copy of c with every coordinate divided by `unit`.
Cloud dividedBy(const Cloud& c, double unit);

/// When extremeCoordinateUnit(a, b) != 1: evaluates m on the divided copies (no warm start:
/// a warm state holds numbers in the other unit), multiplies the value by unit^k — k the
/// exponent of m's own unit, "length^k" (Measure::unit), so the degree is stated once — and
/// each listed detail by unit^degree, and records the unit in details. nullopt otherwise.
/// Pre: m's value is a power of length and m has no length-valued parameter.
std::optional<Result> evaluateAtUnitScale(const Measure& m, const Cloud& a, const Cloud& b, const EvalContext& ctx,
                                          std::initializer_list<std::pair<const char*, int>> detailDegrees = {});

}  // namespace barrow

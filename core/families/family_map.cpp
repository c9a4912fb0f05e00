#include "families/family_map.h"

#include <cmath>
#include <utility>

#include "measures/evaluate.h"
#include "measures/registry.h"

namespace barrow {

namespace {

constexpr double kRadiansPerDegree = M_PI / 180.0;

Eigen::Matrix2d rotation(double degrees) {
  const double t = degrees * kRadiansPerDegree;
  Eigen::Matrix2d r;
  r << std::cos(t), -std::sin(t), std::sin(t), std::cos(t);
  return r;
}

}  // namespace

FamilyMap::FamilyMap(const Cloud& a, const Cloud& b, const FamilySettings& s)
    : family_(s.family), a_(a), b_(b) {
  if (auto e = a.validate()) {
    error_ = "A: " + *e;
    return;
  }
  if (auto e = b.validate()) {
    error_ = "B: " + *e;
    return;
  }
  const Eigen::Vector2d d(s.direction[0], s.direction[1]);
  if (family_ == Family::Shift) {
    if (!std::isfinite(d.norm()) || d.norm() == 0.0) {
      error_ = "the shift direction must be a finite, non-zero vector";
      return;
    }
    direction_ = d / d.norm();
  }
  center_ = s.center ? Eigen::Vector2d((*s.center)[0], (*s.center)[1]) : a.mean();
  if (!center_.allFinite()) {
    error_ = "the pivot must be a finite point";
    return;
  }
  if (family_ != Family::Interpolate) return;

  const Measure* w2 = MeasureRegistry::instance().find("w2");
  if (!w2) {
    error_ = "interpolate needs the exact W2 plan, but the w2 measure is not available in this build";
    return;
  }
  EvalRequest req;
  req.wantPlan = true;
  const Result r = evaluateMeasure(*w2, a, b, req);
  if (r.status != Status::Ok || r.plan.empty()) {
    error_ = "interpolate: the exact W2 plan failed (" + std::string(statusName(r.status)) +
             (r.message.empty() ? std::string() : ": " + r.message) + ")";
    return;
  }
  plan_ = r.plan;
  const auto k = Eigen::Index(plan_.size());
  from_.resize(k, 2);
  to_.resize(k, 2);
  mass_.resize(k);
  for (Eigen::Index e = 0; e < k; ++e) {
    const PlanEntry& p = plan_[std::size_t(e)];
    if (p.i < 0 || p.i >= a.size() || p.j < 0 || p.j >= b.size() || !(p.mass >= 0)) {
      error_ = "interpolate: the W2 plan has an entry outside the clouds";
      plan_.clear();
      return;
    }
    from_.row(e) = a.points.row(p.i);
    to_.row(e) = b.points.row(p.j);
    mass_(e) = p.mass;
  }
}

Cloud FamilyMap::at(double theta) const {
  if (error_) return a_;
  const std::string name = a_.name.empty() ? std::string("A") : a_.name;
  if (family_ == Family::Shift) {
    Eigen::MatrixX2d p = a_.points;
    p.rowwise() += (theta * direction_).transpose();
    return Cloud(name, std::move(p), a_.weights);
  }
  if (family_ == Family::Rotate || family_ == Family::Scale) {
    Eigen::MatrixX2d p = a_.points;
    p.rowwise() -= center_.transpose();
    if (family_ == Family::Rotate) p = p * rotation(theta).transpose();
    else p *= theta;
    p.rowwise() += center_.transpose();
    return Cloud(name, std::move(p), a_.weights);
  }
  if (family_ == Family::Interpolate)
    return Cloud(name, (1.0 - theta) * from_ + theta * to_, mass_);
  // mix: A's and B's normalised weights, so each side carries its share of the unit mass.
  Eigen::MatrixX2d p(a_.size() + b_.size(), 2);
  p << a_.points, b_.points;
  Eigen::VectorXd w(a_.size() + b_.size());
  w << (1.0 - theta) * a_.normalizedWeights(), theta * b_.normalizedWeights();
  return Cloud(name, std::move(p), std::move(w));
}

Eigen::MatrixX2d FamilyMap::velocity(double theta) const {
  if (error_ || !familySpec(family_).pointsMove) return {};
  if (family_ == Family::Shift) {
    Eigen::MatrixX2d v(a_.size(), 2);
    v.rowwise() = direction_.transpose();
    return v;
  }
  if (family_ == Family::Interpolate) return to_ - from_;
  Eigen::MatrixX2d rel = a_.points;
  rel.rowwise() -= center_.transpose();
  if (family_ == Family::Scale) return rel;
  // d/dθ R(θ)r = (π/180)·J·R(θ)r with J the quarter turn.
  Eigen::Matrix2d j;
  j << 0.0, -1.0, 1.0, 0.0;
  return kRadiansPerDegree * rel * (j * rotation(theta)).transpose();
}

}  // namespace barrow

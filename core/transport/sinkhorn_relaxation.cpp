#include "transport/sinkhorn_relaxation.h"

#include <algorithm>
#include <cmath>

namespace barrow {

namespace {

double optimalOmega(double lambda) { return 2.0 / (1.0 + std::sqrt(1.0 - std::min(lambda, 1.0 - 1e-12))); }

}  // namespace

void SinkhornRelaxation::resetWindow() {
  windowSteps_ = 0;
  logRatioSum_ = 0.0;
}

void SinkhornRelaxation::endWindow(double rho) {
  if (settling_) {  // the window right after a change of ω shows the switch, not the rate
    settling_ = false;
    return;
  }
  if (!(rho < 1.0)) {
    previousPlainRho_ = -1.0;
    return;
  }
  if (omega_ == 1.0) {
    // Two plain windows agreeing within 5 % in log-rate: past the transient.
    if (previousPlainRho_ > 0.0 && std::abs(std::log(rho) / std::log(previousPlainRho_) - 1.0) < 0.05) {
      omega_ = std::min(cap_, optimalOmega(rho));
      settling_ = true;
    }
    previousPlainRho_ = rho;
  } else if (rho > omega_ - 1.0 + 0.5 * (2.0 - omega_)) {
    // Clearly slower than the optimum would be: the real-eigenvalue regime, λ too small.
    const double lambda = (rho + omega_ - 1.0) * (rho + omega_ - 1.0) / (rho * omega_ * omega_);
    const double better = std::clamp(optimalOmega(lambda), omega_, cap_);
    settling_ = better != omega_;
    omega_ = better;
  }
}

void SinkhornRelaxation::startAt(double omega) {
  if (!(omega > 1.0) || !std::isfinite(omega)) return;
  omega_ = std::min(omega, cap_);
  settling_ = true;  // the first window shows the start, not the rate
  resetWindow();
}

bool SinkhornRelaxation::accept(double error, double dual) {
  if (omega_ > 1.0 && (!std::isfinite(dual) || !std::isfinite(error) ||
                       (haveDual_ && dual < lastDual_ - 1e-13 * (1.0 + std::abs(lastDual_))))) {
    ++rejections_;
    cap_ = 1.0 + 0.5 * (cap_ - 1.0);  // retry more cautiously...
    errorAtRejection_ = lastError_;
    omega_ = 1.0;
    resetWindow();
    previousPlainRho_ = -1.0;
    settling_ = false;
    lastError_ = -1.0;  // the caller restores the state whose dual we still hold
    return false;
  }
  if (error < 0.1 * errorAtRejection_) {
    cap_ = kMaxOmega;  // ...until the error has come down a decade: the linear regime is nearer
    errorAtRejection_ = 0.0;
  }
  if (rejections_ < kMaxRejections) {
    if (lastError_ > 0.0 && error > 0.0 && std::isfinite(error)) {
      logRatioSum_ += std::log(error / lastError_);
      if (++windowSteps_ == kWindow) {
        endWindow(std::exp(logRatioSum_ / kWindow));
        resetWindow();
      }
    } else {
      resetWindow();
    }
  }
  lastError_ = error;
  lastDual_ = dual;
  haveDual_ = true;
  return true;
}

}  // namespace barrow

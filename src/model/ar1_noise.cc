#include "src/model/ar1_noise.h"

#include <cmath>
#include <stdexcept>

namespace coilspin::model {

Ar1Noise::Ar1Noise(std::uint64_t seed, std::uint32_t stream, double sigma, double lag1_correlation)
    : deviates_(seed, stream), sigma_(sigma), phi_(lag1_correlation) {
  if (!(std::isfinite(sigma) && sigma >= 0.0)) throw std::invalid_argument("AR(1) noise: sigma must be >= 0");
  if (!(lag1_correlation > -1.0 && lag1_correlation < 1.0)) {
    throw std::invalid_argument("AR(1) noise: the lag-1 correlation must lie in (-1, 1)");
  }
  innovation_sigma_ = std::sqrt(1.0 - phi_ * phi_) * sigma_;
}

double Ar1Noise::Next() {
  const double z = deviates_.StandardNormal();
  if (!started_) {
    started_ = true;
    previous_ = sigma_ * z;  // e_0 = σ·z_0: the stationary distribution
    return previous_;
  }
  previous_ = phi_ * previous_ + innovation_sigma_ * z;  // e_k = φ·e_(k−1) + √(1 − φ²)·σ·z_k
  return previous_;
}

}  // namespace coilspin::model

#include "src/model/commutation_ripple.h"

#include <cmath>
#include <stdexcept>

namespace coilspin::model {

bool HasRipple(const CommutationRipple& ripple) {
  return ripple.segments_per_turn > 0 && ripple.relative_amplitude > 0.0;
}

double RippleFactor(const CommutationRipple& ripple, double shaft_angle_rad) {
  // 1 + a·cos(N·θ + φ0)
  return 1.0 + ripple.relative_amplitude *
                   std::cos(static_cast<double>(ripple.segments_per_turn) * shaft_angle_rad + ripple.phase_rad);
}

void ValidateRipple(const CommutationRipple& ripple) {
  if (ripple.segments_per_turn < 0) {
    throw std::invalid_argument("commutation ripple: the segments per turn must be >= 0");
  }
  if (!(ripple.relative_amplitude >= 0.0 && ripple.relative_amplitude < 1.0)) {
    throw std::invalid_argument("commutation ripple: the relative amplitude must lie in [0, 1)");
  }
  if (!std::isfinite(ripple.phase_rad)) throw std::invalid_argument("commutation ripple: the phase must be finite");
}

}  // namespace coilspin::model

#include "src/model/free_shaft_time_constants.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace coilspin::model {

namespace {

constexpr double kNever = std::numeric_limits<double>::infinity();

// 1/rate, +∞ for a rate of zero.
double TimeConstantOfRate(double rate_per_s) { return rate_per_s > 0.0 ? 1.0 / rate_per_s : kNever; }

}  // namespace

FreeShaftTimeConstants TimeConstantsOf(const MotorParameters& motor, const FreeShaftInput& input) {
  const double viscous_rate = motor.viscous_friction_N_m_s_per_rad / motor.inertia_kg_m2;  // B/J
  if (input.open_circuit) {
    const double viscous_s = TimeConstantOfRate(viscous_rate);
    return {viscous_s, viscous_s};
  }
  const double loop_ohm = motor.resistance_ohm + input.supply_resistance_ohm;  // R_t = R + R_s
  const double electrical_rate = loop_ohm / motor.inductance_H;               // R_t/L
  const double coupling = motor.torque_constant_N_m_per_A * motor.back_emf_constant_V_s_per_rad /
                          (motor.inductance_H * motor.inertia_kg_m2);  // Kt·Ke/(L·J)
  const double mechanical_rate = coupling * motor.inductance_H / loop_ohm;  // Kt·Ke/(J·R_t)
  const double half_trace = 0.5 * (electrical_rate + viscous_rate);         // −tr/2
  const double determinant = electrical_rate * viscous_rate + coupling;     // det A
  const double discriminant = half_trace * half_trace - determinant;        // tr²/4 − det
  double largest_modulus = 0.0;
  double slowest_decay = 0.0;
  if (discriminant >= 0.0) {
    // real: |λ|max = −tr/2 + √disc; |λ|min = det/|λ|max (no cancellation)
    largest_modulus = half_trace + std::sqrt(discriminant);
    slowest_decay = largest_modulus > 0.0 ? determinant / largest_modulus : 0.0;
  } else {
    // complex pair: |λ| = √det, Re λ = tr/2
    largest_modulus = std::sqrt(determinant);
    slowest_decay = half_trace;
  }
  const double fastest_rate =
      std::max({electrical_rate, mechanical_rate, viscous_rate, largest_modulus});
  return {TimeConstantOfRate(fastest_rate), TimeConstantOfRate(slowest_decay)};
}

double DragTimeConstant_s(const MotorParameters& motor, const FreeShaftInput& input, double speed_rad_s) {
  // 1/τ = 2c·|ω|/J
  return TimeConstantOfRate(2.0 * input.drag_N_m_s2_per_rad2 * std::abs(speed_rad_s) / motor.inertia_kg_m2);
}

}  // namespace coilspin::model

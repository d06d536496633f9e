#include "src/tune/cascade_design.h"

#include <algorithm>
#include <limits>

namespace coilspin::tune {

double DefaultCurrentBandwidth_rad_s(const model::MotorParameters& p) {
  return kCurrentBandwidthOverWindingPole * p.resistance_ohm / p.inductance_H;  // 5/τe
}

double DefaultSpeedBandwidth_rad_s(double current_bandwidth_rad_s) {
  return current_bandwidth_rad_s / kCurrentOverSpeedBandwidth;
}

PiGains CurrentLoopGains(const model::MotorParameters& p, double wc) {
  return {p.inductance_H * wc, p.resistance_ohm * wc};  // kp = L·ωc, ki = R·ωc
}

PiGains SpeedLoopGains(const model::MotorParameters& p, double wc, double ws) {
  const double lag_s = 1.0 / wc;                 // τ2, the closed current loop
  const double delay_s = 0.5 * lag_s;            // θ = τ2/2 (half rule)
  const double closed_loop_s = 1.0 / ws;         // τc
  const double b = p.viscous_friction_N_m_s_per_rad, j = p.inertia_kg_m2;
  const double kc = (j + b * delay_s) / (p.torque_constant_N_m_per_A * (closed_loop_s + delay_s));
  const double tau1 = b > 0.0 ? j / b + delay_s : std::numeric_limits<double>::infinity();  // τ1' = τ1 + τ2/2
  const double integral_s = std::min(tau1, 4.0 * (closed_loop_s + delay_s));               // τI
  return {kc, kc / integral_s};
}

}  // namespace coilspin::tune

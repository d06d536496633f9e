#pragma once
// Phase margins of the two loops from the fitted model's frequency response
// (docs/exports.md, "Tuning"), with the back-EMF coupling that the design
// rules leave aside:
//   winding and shaft    G_vi(s) = (J·s + B) / ((L·s + R)(J·s + B) + Kt·Ke)   (voltage → current, free shaft)
//   current loop open    L_i(s)  = C_i(s)·G_vi(s),   C(s) = kp + ki/s
//   closed current loop  T_i(s)  = C_i / (L·s + R + C_i + Kt·Ke/(J·s + B))     (command → current)
//   speed loop open      L_s(s)  = C_s(s)·T_i(s)·Kt/(J·s + B)
// The crossover ω_x is the lowest frequency where |L(jω)| falls through 1; the
// phase margin is 180° + ∠L(jω_x), the phase followed continuously from low
// frequency (each factor's phase unwrapped along a sweep, so a loop that turns
// through −180° is not folded back).

#include <optional>

#include "src/model/motor_parameters.h"
#include "src/tune/cascade_design.h"

namespace coilspin::tune {

struct Margin {
  double crossover_rad_s = 0.0;
  double phase_margin_deg = 0.0;
};

// Empty when |L| does not cross 1 between 10⁻⁴ and 10⁴ times `design_rad_s`.
std::optional<Margin> CurrentLoopMargin(const model::MotorParameters& p, const PiGains& current, double design_rad_s);
std::optional<Margin> SpeedLoopMargin(const model::MotorParameters& p, const PiGains& current, const PiGains& speed,
                                      double design_rad_s);

}  // namespace coilspin::tune

#pragma once
// Phase margins of the two loops from the fitted model's frequency response
// (docs/exports.md, "Tuning"), with the back-EMF coupling that the design
// rules leave aside:
//   winding and shaft    G_vi(s) = (J·s + B) / ((L·s + R)(J·s + B) + Kt·Ke)   (voltage → current, free shaft)
//   current loop open    L_i(s)  = C_i(s)·G_vi(s),   C(s) = kp + ki/s
//   closed current loop  T_i(s)  = C_i / (L·s + R + C_i + Kt·Ke/(J·s + B))     (command → current)
//   speed loop open      L_s(s)  = C_s(s)·T_i(s)·Kt/(J·s + B)
// A drive's delay T from a measurement to the output it causes (sampling,
// computation, PWM; `loop_delay_s`, 0 when none is given) follows each
// controller of the cascade, both run by the same digital drive:
//   current loop open    L_i(s)  = C_i(s)·e^(−sT)·G_vi(s)
//   closed current loop  T_i(s)  = C_i·e^(−sT) / (L·s + R + C_i·e^(−sT) + Kt·Ke/(J·s + B))
//   speed loop open      L_s(s)  = C_s(s)·e^(−sT)·T_i(s)·Kt/(J·s + B)
// (well below ωc the closed current loop passes its own delay almost unchanged
// in phase, T_i → 1; the speed loop's margin then loses ω·T to its own
// delay). |e^(−jωT)| = 1 and ∠e^(−jωT) = −ω·T exactly, so a delay outside a
// sum is added to the phase as −ω·T rather than unwrapped.
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
std::optional<Margin> CurrentLoopMargin(const model::MotorParameters& p, const PiGains& current, double design_rad_s,
                                        double loop_delay_s = 0.0);
std::optional<Margin> SpeedLoopMargin(const model::MotorParameters& p, const PiGains& current, const PiGains& speed,
                                      double design_rad_s, double loop_delay_s = 0.0);

}  // namespace coilspin::tune

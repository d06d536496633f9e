#pragma once
// The open-circuit coast in closed form (references.md, physics: solve the ODE).
// With the terminals open i = 0, so from ω₀ > 0 at t = 0
//     J·dω/dt = −B·ω − Tc
//     ω(t) = (ω₀ + Tc/B)·e^(−t·B/J) − Tc/B,   until   t_stop = (J/B)·ln(1 + B·ω₀/Tc),
// after which the rotor stays at rest (no drive torque, so stiction holds it).
// Limits: B → 0 gives ω(t) = ω₀ − (Tc/J)·t and t_stop = J·ω₀/Tc; Tc = 0 gives
// ω₀·e^(−t·B/J), which never stops (t_stop = +∞). ω₀ < 0 is the mirror image.
// Written with expm1/log1p so that the small-B limit keeps its digits.

#include "src/model/motor_parameters.h"

namespace coilspin::model {

// ω(t) of the coast (0 once stopped). Expects J > 0, B ≥ 0, Tc ≥ 0, t ≥ 0.
double CoastSpeed_rad_s(const MotorParameters& motor, double initial_speed_rad_s, double time_s);

// t_stop; +∞ when the rotor never stops (Tc = 0 and ω₀ ≠ 0, or B = Tc = 0); 0 for ω₀ = 0.
double CoastStopTime_s(const MotorParameters& motor, double initial_speed_rad_s);

}  // namespace coilspin::model

#pragma once
// The motor model (docs/methods.md §1) as a continuous-time state-space system
// for simulators and controller design, SI throughout:
//   L·di/dt = v − R·i − Ke·ω − Vb·sgn(i)
//   J·dω/dt = Kt·i − B·ω − Tc·sgn(ω) − τ_load
// States x = [i, ω], inputs u = [v, τ_load], outputs y = [i, ω]:
//   ẋ = A·x + B·u_eff,  y = C·x + D·u_eff,
//   A = [[−R/L, −Ke/L], [Kt/J, −B/J]],  B = [[1/L, 0], [0, −1/J]],  C = I,  D = 0,
// where the two sign terms enter as offsets of the inputs they add to:
//   u_eff = [v − Vb·sgn(i), τ_load + Tc·sgn(ω)].
// With Vb = Tc = 0 (or away from i = 0 and ω = 0, with the offsets as known
// inputs) the model is linear and exact; the sign terms are what makes it not.

#include <array>

#include "src/model/motor_parameters.h"

namespace coilspin::model {

using Matrix2 = std::array<std::array<double, 2>, 2>;  // [row][column]

struct StateSpace {
  Matrix2 a{}, b{}, c{}, d{};
  double brush_drop_V = 0.0;          // Vb: subtracted from the voltage input, times sgn(i)
  double coulomb_friction_N_m = 0.0;  // Tc: added to the load-torque input, times sgn(ω)
};

// Needs L > 0 and J > 0 (the states' derivatives divide by them).
StateSpace MotorStateSpace(const MotorParameters& p);

}  // namespace coilspin::model

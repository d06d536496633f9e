#include "src/model/state_space.h"

namespace coilspin::model {

StateSpace MotorStateSpace(const MotorParameters& p) {
  const double r = p.resistance_ohm, l = p.inductance_H, ke = p.back_emf_constant_V_s_per_rad;
  const double kt = p.torque_constant_N_m_per_A, j = p.inertia_kg_m2, b = p.viscous_friction_N_m_s_per_rad;
  StateSpace s;
  s.a = {{{-r / l, -ke / l}, {kt / j, -b / j}}};  // di/dt = (−R·i − Ke·ω)/L, dω/dt = (Kt·i − B·ω)/J
  s.b = {{{1.0 / l, 0.0}, {0.0, -1.0 / j}}};      // + v/L, − τ_load/J
  s.c = {{{1.0, 0.0}, {0.0, 1.0}}};               // y = [i, ω]
  s.d = {{{0.0, 0.0}, {0.0, 0.0}}};
  s.brush_drop_V = p.brush_drop_V;
  s.coulomb_friction_N_m = p.coulomb_friction_N_m;
  return s;
}

}  // namespace coilspin::model

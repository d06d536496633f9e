#pragma once
// Test helper: the small motor of the artefact tests (invented, typical of a
// 12 V hobby motor, from memory): R = 2 ohm, L = 1 mH (L/R = 0.5 ms),
// Ke = Kt = 0.03 (SI), J = 2e-5 kg·m² (τm = J·R/(Ke·Kt) ≈ 44 ms),
// B = 1e-5 N·m·s/rad, Tc = 2e-3 N·m, no brush drop. At 6 V it turns at about
// 190 rad/s.

#include "src/model/motor_parameters.h"

namespace coilspin::model {

inline MotorParameters SmallMotor() {
  MotorParameters m;
  m.resistance_ohm = 2.0;
  m.inductance_H = 1e-3;
  m.back_emf_constant_V_s_per_rad = 0.03;
  m.torque_constant_N_m_per_A = 0.03;
  m.inertia_kg_m2 = 2e-5;
  m.viscous_friction_N_m_s_per_rad = 1e-5;
  m.coulomb_friction_N_m = 2e-3;
  return m;
}

}  // namespace coilspin::model

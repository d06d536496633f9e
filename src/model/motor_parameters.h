#pragma once
// The parameter set of the permanent-magnet brushed DC motor model
// (docs/methods.md §1), in SI units:
//   electrical:  v = R·i + L·di/dt + Ke·ω + Vb·sgn(i)
//   mechanical:  J·dω/dt = Kt·i − B·ω − Tc·sgn(ω) − τ_load

namespace coilspin::model {

struct MotorParameters {
  double resistance_ohm = 0.0;                  // R
  double inductance_H = 0.0;                    // L
  double back_emf_constant_V_s_per_rad = 0.0;   // Ke
  double torque_constant_N_m_per_A = 0.0;       // Kt
  double inertia_kg_m2 = 0.0;                   // J
  double viscous_friction_N_m_s_per_rad = 0.0;  // B
  double coulomb_friction_N_m = 0.0;            // Tc
  double brush_drop_V = 0.0;                    // Vb
};

}  // namespace coilspin::model

#pragma once
// Test helper: simulated free-shaft step logs for motors with known
// parameters, from the forward model of src/model (RK4 with exact switching,
// itself checked against SciPy solve_ivp in tests/model).

#include <string>

#include "free_shaft/free_shaft_bench.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_step.h"

namespace coilspin::testing {

// Two motors unlike each other: a small hobby motor and a larger servo-class one.
inline model::MotorParameters SmallMotor() { return IdealMotor(2.2, 0.6e-3, 0.012, 1.5e-6, 2e-7, 6e-4, 0.0); }

inline model::MotorParameters ServoMotor() { return IdealMotor(0.8, 2.5e-3, 0.06, 8e-5, 2e-5, 0.012, 0.0); }

inline model::BenchConditions StepNoise(std::uint64_t seed, bool encoder, double scale = 1.0) {
  model::BenchConditions b;
  b.voltage_noise_sigma_V = 2e-3 * scale;
  b.current_noise_sigma_A = 5e-3 * scale;
  b.speed_noise_sigma_rad_s = encoder ? 0.0 : 0.3 * scale;
  b.encoder_counts_per_rev = encoder ? 4096 : 0;
  b.seed = seed;
  return b;
}

// A step from rest to `supply_V`, sampled at 1/20 of the electrical time constant,
// logged long enough for the speed to settle (five mechanical time constants).
inline model::FreeShaftStepPlan StepFromRest(const model::MotorParameters& m, double supply_V, bool encoder) {
  model::FreeShaftStepPlan plan;
  plan.final_supply_V = supply_V;
  plan.sample_period_s = m.inductance_H / m.resistance_ohm / 20.0;
  const double tau_m_s = m.inertia_kg_m2 * m.resistance_ohm /
                         (m.back_emf_constant_V_s_per_rad * m.torque_constant_N_m_per_A);
  plan.pre_step_s = 20.0 * plan.sample_period_s;
  plan.hold_s = 5.0 * tau_m_s;
  plan.shaft = encoder ? model::ShaftChannels::kPosition : model::ShaftChannels::kSpeed;
  return plan;
}

}  // namespace coilspin::testing

#pragma once
// Test helper: a simulated free-shaft bench (locked-rotor plateaus, no-load
// plateaus, spin-down, free-shaft step) for a motor with known parameters. The logs come from
// the forward model in src/model, itself checked against SciPy solve_ivp and
// the closed-form coast in tests/model.

#include <string>
#include <vector>

#include "fitters/joint/motor_fit.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"
#include "src/model/simulate_no_load.h"
#include "src/model/simulate_spin_down.h"
#include "src/model/simulate_step.h"

namespace coilspin::testing {

struct BenchOptions {
  bool locked_rotor = true;
  bool no_load = true;
  bool spin_down = true;
  bool encoder = false;              // position in counts instead of speed
  bool torque_column = false;        // load cell in the locked-rotor test
  bool coast_voltage = true;
  bool step = false;                 // a free-shaft voltage step from rest to top_V
  std::uint64_t seed = 1;
  double noise_scale = 1.0;          // 0: the same bench without noise (the truth a model should follow)
};

// An ideal machine: Kt = Ke in SI (physics: power balance).
inline model::MotorParameters IdealMotor(double r, double l, double k, double j, double b, double tc, double vb) {
  model::MotorParameters m;
  m.resistance_ohm = r;
  m.inductance_H = l;
  m.back_emf_constant_V_s_per_rad = k;
  m.torque_constant_N_m_per_A = k;
  m.inertia_kg_m2 = j;
  m.viscous_friction_N_m_s_per_rad = b;
  m.coulomb_friction_N_m = tc;
  m.brush_drop_V = vb;
  return m;
}

inline model::BenchConditions Noise(std::uint64_t seed, bool encoder, double scale = 1.0) {
  model::BenchConditions b;
  b.voltage_noise_sigma_V = 5e-3 * scale;
  b.current_noise_sigma_A = 2e-3 * scale;
  b.speed_noise_sigma_rad_s = encoder ? 0.0 : 0.2 * scale;
  b.torque_noise_sigma_N_m = 2e-4 * scale;
  b.encoder_counts_per_rev = encoder ? 2048 : 0;
  b.seed = seed;
  return b;
}

inline std::vector<joint::TestLog> SimulateBench(const model::MotorParameters& m, double top_V, const BenchOptions& o) {
  std::vector<joint::TestLog> logs;
  const auto shaft = o.encoder ? model::ShaftChannels::kPosition : model::ShaftChannels::kSpeed;
  if (o.locked_rotor) {
    model::PlateauPlan p;
    for (double f : {0.1, 0.2, 0.3, 0.4, -0.15, -0.3}) p.supply_levels_V.push_back(f * top_V);
    p.hold_s = 0.3;
    p.log_torque = o.torque_column;
    logs.push_back({TestKind::kLockedRotor,
                    ToBenchLog(model::SimulateLockedRotorPlateaus(m, p, Noise(o.seed, false, o.noise_scale)), "locked.csv")});
  }
  if (o.no_load) {
    model::NoLoadPlan p;
    for (double f : {0.25, 0.4, 0.55, 0.7, 0.85, 1.0}) p.supply_levels_V.push_back(f * top_V);
    p.hold_s = 1.0;
    p.shaft = shaft;
    logs.push_back({TestKind::kNoLoad, ToBenchLog(model::SimulateNoLoad(m, p, Noise(o.seed + 1, o.encoder, o.noise_scale)), "noload.csv")});
  }
  if (o.spin_down) {
    model::SpinDownPlan p;
    p.supply_V = top_V;
    p.run_s = 1.0;
    p.coast_s = 4.0;
    p.log_voltage = o.coast_voltage;
    p.shaft = shaft;
    logs.push_back({TestKind::kSpinDown, ToBenchLog(model::SimulateSpinDown(m, p, Noise(o.seed + 2, o.encoder, o.noise_scale)), "coast.csv")});
  }
  if (o.step) {
    // A fast logger: 20 samples per electrical time constant, three mechanical ones logged.
    model::FreeShaftStepPlan p;
    p.final_supply_V = top_V;
    p.sample_period_s = m.inductance_H / m.resistance_ohm / 20.0;
    p.pre_step_s = 20.0 * p.sample_period_s;
    p.hold_s = 3.0 * m.inertia_kg_m2 * m.resistance_ohm / (m.back_emf_constant_V_s_per_rad * m.torque_constant_N_m_per_A);
    p.shaft = shaft;
    logs.push_back({TestKind::kStep, ToBenchLog(model::SimulateStep(m, p, Noise(o.seed + 3, o.encoder, o.noise_scale)), "step.csv")});
  }
  return logs;
}

}  // namespace coilspin::testing

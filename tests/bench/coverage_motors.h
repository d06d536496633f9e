#pragma once
// Coverage benchmark helper: the simulated motors and benches it fits.
//
// joint  four motors, each bench a locked-rotor plateau log, a locked-rotor step
//        capture, no-load plateaus, a spin-down and a free-shaft voltage step
//        from rest to the top voltage (speed or encoder like the other free-shaft logs);
//        SessionBench makes these logs with any bench per log (coverage_real_rig.h
//        gives them a real rig's artefacts), with or without the two steps.
// step   three motors, each bench one free-shaft step from rest; they differ in
//        R, L, J, shaft sensor, noise scale and supply resistance.
// Step logs follow tests/step/step_bench.h: 20 samples per electrical time
// constant (twice the least the step fitter asks for, fitters/step/step_fit.cc),
// 20 samples at rest before the step, five mechanical time constants after it.
// The logs come from the forward model of src/model (checked against SciPy
// solve_ivp in tests/model). All parameter values are invented, typical of
// small brushed motors (from memory).

#include <cstdint>
#include <functional>
#include <random>
#include <string>
#include <vector>

#include "fitters/joint/motor_fit.h"
#include "free_shaft/free_shaft_bench.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"
#include "src/model/simulate_no_load.h"
#include "src/model/simulate_spin_down.h"
#include "src/model/simulate_step.h"

namespace coilspin::bench {

struct Motor {
  const char* name;
  model::MotorParameters p;
  double top_V;
  bool encoder;
  double noise_scale = 1.0;             // step mode: every noise σ times this
  double supply_resistance_ohm = 0.0;   // step mode: R_s of the bench supply
};

// Encoder resolutions: a common incremental encoder (joint) and a finer one (step).
inline constexpr int kJointEncoderCountsPerRev = 1024;
inline constexpr int kStepEncoderCountsPerRev = 4096;

// Where the shaft rests within a count at the start of a log: anywhere, uniform
// in [0, 1) of a count, drawn from the log's seed (a shaft stopped by the last
// test rests at no particular place relative to the encoder's edges).
inline double EncoderStartPhase(std::uint64_t seed) {
  std::mt19937_64 generator(seed);
  return std::uniform_real_distribution<double>(0.0, 1.0)(generator);
}

inline model::BenchConditions JointNoise(std::uint64_t seed, bool encoder, double scale) {
  model::BenchConditions b;
  b.voltage_noise_sigma_V = 5e-3 * scale;
  b.current_noise_sigma_A = 2e-3 * scale;
  b.speed_noise_sigma_rad_s = encoder ? 0.0 : 0.2 * scale;
  b.encoder_counts_per_rev = encoder ? kJointEncoderCountsPerRev : 0;
  b.encoder_start_phase = EncoderStartPhase(seed);
  b.seed = seed;
  return b;
}

// The levels of tests/step/step_bench.h (StepNoise), scaled per motor.
inline model::BenchConditions StepNoise(const Motor& m, std::uint64_t seed) {
  model::BenchConditions b;
  b.voltage_noise_sigma_V = 2e-3 * m.noise_scale;
  b.current_noise_sigma_A = 5e-3 * m.noise_scale;
  b.speed_noise_sigma_rad_s = m.encoder ? 0.0 : 0.3 * m.noise_scale;
  b.encoder_counts_per_rev = m.encoder ? kStepEncoderCountsPerRev : 0;
  b.supply_resistance_ohm = m.supply_resistance_ohm;
  b.encoder_start_phase = EncoderStartPhase(seed);
  b.seed = seed;
  return b;
}

inline constexpr double kStepSamplesPerElectricalTimeConstant = 20.0;
inline constexpr double kStepRestSamples = 20.0;
inline constexpr double kStepHoldMechanicalTimeConstants = 5.0;

// A step from rest to the top voltage; τe = L/(R + R_s), τm = J·R/(Ke·Kt).
inline model::FreeShaftStepPlan StepFromRest(const Motor& m) {
  const model::MotorParameters& p = m.p;
  model::FreeShaftStepPlan plan;
  plan.final_supply_V = m.top_V;
  plan.sample_period_s =
      p.inductance_H / (p.resistance_ohm + m.supply_resistance_ohm) / kStepSamplesPerElectricalTimeConstant;
  plan.pre_step_s = kStepRestSamples * plan.sample_period_s;
  const double tau_m_s =
      p.inertia_kg_m2 * p.resistance_ohm / (p.back_emf_constant_V_s_per_rad * p.torque_constant_N_m_per_A);
  plan.hold_s = kStepHoldMechanicalTimeConstants * tau_m_s;
  plan.shaft = m.encoder ? model::ShaftChannels::kPosition : model::ShaftChannels::kSpeed;
  return plan;
}

inline std::vector<Motor> JointMotors() {
  return {{"small 12 V, speed", testing::IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0), 12.0, false},
          {"small 12 V, encoder, brushes", testing::IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.7), 12.0, true},
          {"6 V, speed, brushes", testing::IdealMotor(0.8, 0.3e-3, 0.012, 6e-6, 3e-6, 8e-4, 0.5), 6.0, false},
          {"24 V, encoder", testing::IdealMotor(0.6, 2e-3, 0.08, 4e-4, 8e-5, 1.5e-2, 0.0), 24.0, true}};
}

// No brushes: a step alone cannot separate Vb from R (fitters/step/step_fit.h).
// A step log holds 100·τm/τe samples (20 per τe, 5 τm); these motors have
// τm/τe between 6 and 15 so that a profile or bootstrap run stays within
// minutes (a small hobby motor with τm/τe ≈ 85 costs about ten times more per fit).
inline std::vector<Motor> StepMotors() {
  return {{"servo 24 V, speed, Rs 0.1 ohm", testing::IdealMotor(0.8, 2.5e-3, 0.06, 8e-5, 2e-5, 1.2e-2, 0.0), 24.0, false, 1.0, 0.1},
          {"24 V, encoder, noise x2", testing::IdealMotor(0.6, 2e-3, 0.08, 4e-4, 8e-5, 1.5e-2, 0.0), 24.0, true, 2.0, 0.0},
          {"12 V, speed, noise x3, Rs 0.05 ohm", testing::IdealMotor(3.0, 2e-3, 0.025, 2e-6, 2e-6, 1e-3, 0.0), 12.0, false, 3.0, 0.05}};
}

// The bench of one log of a session: the log's index (kPlateauLog … kStepLog) and
// whether its shaft is read by an encoder (never for the locked-rotor logs).
using BenchOfLog = std::function<model::BenchConditions(int log, bool encoder)>;
inline constexpr int kPlateauLog = 0, kCaptureLog = 1, kNoLoadLog = 2, kSpinDownLog = 3, kStepLog = 4;

// Locked-rotor plateau levels, no-load levels (fractions of the top voltage) and holds.
// With `with_steps` false the session has no step of either kind (plateaus and coasts only:
// locked-rotor plateaus, no-load, spin-down).
inline std::vector<joint::TestLog> SessionBench(const Motor& m, const BenchOfLog& bench_of, bool with_steps) {
  using testing::ToBenchLog;
  std::vector<joint::TestLog> logs;
  const auto shaft = m.encoder ? model::ShaftChannels::kPosition : model::ShaftChannels::kSpeed;
  model::PlateauPlan lr;
  for (double f : {0.1, 0.2, 0.3, 0.4, -0.15, -0.3}) lr.supply_levels_V.push_back(f * m.top_V);
  lr.hold_s = 0.3;
  logs.push_back({TestKind::kLockedRotor,
                  ToBenchLog(model::SimulateLockedRotorPlateaus(m.p, lr, bench_of(kPlateauLog, false)), "lr")});
  if (with_steps) {
    model::StepPlan capture;  // 100 samples per L/R, ten L/R either side of the step
    capture.supply_after_V = 0.2 * m.top_V;
    const double tau_s = m.p.inductance_H / m.p.resistance_ohm;
    capture.sample_period_s = tau_s / 100.0;
    capture.before_s = 10 * tau_s;
    capture.after_s = 10 * tau_s;
    logs.push_back({TestKind::kLockedRotor,
                    ToBenchLog(model::SimulateLockedRotorStep(m.p, capture, bench_of(kCaptureLog, false)), "capture")});
  }
  model::NoLoadPlan nl;
  for (double f : {0.25, 0.4, 0.55, 0.7, 0.85, 1.0}) nl.supply_levels_V.push_back(f * m.top_V);
  nl.hold_s = 1.0;
  nl.shaft = shaft;
  logs.push_back(
      {TestKind::kNoLoad, ToBenchLog(model::SimulateNoLoad(m.p, nl, bench_of(kNoLoadLog, m.encoder)), "nl")});
  model::SpinDownPlan sd;
  sd.supply_V = m.top_V;
  sd.run_s = 1.0;
  sd.coast_s = 4.0;
  sd.shaft = shaft;
  logs.push_back(
      {TestKind::kSpinDown, ToBenchLog(model::SimulateSpinDown(m.p, sd, bench_of(kSpinDownLog, m.encoder)), "sd")});
  if (with_steps) {
    logs.push_back({TestKind::kStep,
                    ToBenchLog(model::SimulateStep(m.p, StepFromRest(m), bench_of(kStepLog, m.encoder)), "step")});
  }
  return logs;
}

// The ideal session: white noise, log i seeded seed + i.
inline std::vector<joint::TestLog> JointBench(const Motor& m, std::uint64_t seed, double noise_scale) {
  return SessionBench(
      m, [&](int log, bool encoder) { return JointNoise(seed + static_cast<std::uint64_t>(log), encoder, noise_scale); },
      true);
}

inline std::vector<joint::TestLog> StepBench(const Motor& m, std::uint64_t seed) {
  return {{TestKind::kStep, testing::ToBenchLog(model::SimulateStep(m.p, StepFromRest(m), StepNoise(m, seed)), "step")}};
}

}  // namespace coilspin::bench

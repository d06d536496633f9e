#pragma once
// Forward simulation of the free-shaft voltage step: the shaft turns freely
// (τ_load = 0) and the supply V_s (behind the bench's R_s) jumps from V_0 to
// V_1 at a sample instant t_step.
//
//   From rest (the default, V_0 = 0): the log starts with the motor at rest
//   at t = 0 and logs pre_step_s of it before the step, so
//   t_step = round(pre_step_s/Δ)·Δ.
//   Between two levels (V_0 ≠ 0): the motor is first run at V_0 from rest for
//   settle_s, which is not logged; the log starts there, already turning, and
//   t keeps counting from the unlogged start (the first logged t is
//   round(settle_s/Δ)·Δ), so t_step = (round(settle_s/Δ) + round(pre_step_s/Δ))·Δ.
//   The encoder, zeroed at the unlogged start, keeps its count.
//
// After the step the motor accelerates for hold_s: the current jumps towards
// (V_1 − V_0)/(R + R_s) above its starting value (the stall current V_1/(R + R_s)
// from rest, less Vb/(R + R_s)), then decays with the electrical time constant
// while the speed rises with the mechanical one. Both equations of
// src/model/free_shaft_dynamics.h act at once (the model of docs/methods.md §1),
// which is what lets one step log determine R, L, Ke and the mechanical ratios
// Kt/J, B/J, Tc/J.
//
// Logged: time, terminal voltage, current, and the shaft's speed and/or
// position at the logged shaft; optionally the (constant) winding temperature.
// Model, rules, integrator: src/model/free_shaft_dynamics.h; timing, channels,
// noise: src/model/free_shaft_bench.h. The unlogged settle is integrated at
// the log's sample period like the rest (memory and time grow with
// settle_s/Δ).
//
// Throws std::invalid_argument for a plan that cannot be simulated (a pre-step
// span or hold shorter than one sample, a negative settle time, V_0 ≠ 0 with
// no settle time) and whatever the integrator and the bench reject.

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/model/sampled_log.h"
#include "src/model/shaft_channels.h"

namespace coilspin::model {

// (Not StepPlan: that is the locked-rotor step capture of src/model/simulate_locked_rotor.h.)
struct FreeShaftStepPlan {
  double initial_supply_V = 0.0;  // V_0; 0 = from rest
  double final_supply_V = 12.0;   // V_1
  double settle_s = 0.0;          // unlogged run at V_0 before the log starts (needed when V_0 ≠ 0)
  double pre_step_s = 0.02;       // logged at V_0 before the step
  double hold_s = 0.5;            // logged at V_1 after the step
  double sample_period_s = 1e-4;
  ShaftChannels shaft = ShaftChannels::kSpeed;
  bool log_temperature = false;
};

SampledLog SimulateStep(const MotorParameters& motor, const FreeShaftStepPlan& plan, const BenchConditions& bench);

// t_step, the instant of the first sample logged at V_1 (in the log's time).
double StepTime_s(const FreeShaftStepPlan& plan);

}  // namespace coilspin::model

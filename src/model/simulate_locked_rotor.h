#pragma once
// Forward simulation of the locked-rotor bench (ω = 0):
//   L·di/dt = V_s(t) − (R + R_s)·i − Vb·sgn(i),   logged v = V_s − R_s·i
// solved exactly between samples (V_s is piecewise constant, changing only at
// sample instants), then noise and ADC quantisation are added to the logged
// channels. R follows the winding temperature (copper, docs/methods.md §7).
//
// Timing. Samples are logged at t_k = k·Δ (Δ = sample_period_s). The supply
// level that applies over [t_k, t_k+1) is set at t_k, so sample k already logs
// v_k = V_s,k − R_s·i_k with the new level and the (continuous) current i_k.
// The current is advanced exactly over kSubStepsPerSample sub-intervals of each
// sample period (V_s and R are constant over a period, so the sub-steps agree
// with one exact step to rounding) and the instantaneous v and i are logged at
// the sample instants. With R_s > 0 the terminal voltage sags as i changes
// within a period, so a zero-order-hold fit on the logged v does not match this
// bench by construction: to first order in Δ its L comes out high by
// Δ·R_s/(2L) (relative), its R unbiased.
//
// Brush drop: the diode-like rule of src/model/locked_rotor_circuit.h (with
// |V_s| ≤ Vb no current is driven; a current that is flowing decays to zero).
//
// Plateaus start from rest (i = 0 at t = 0, the supply switched on to the first
// level); plateau j is held at winding temperature θ_0 + j·heating_per_plateau_K.
// The step starts from the current settled at supply_before_V, at θ_0.
// A winding warm-up (BenchConditions::warm_up, src/model/winding_warm_up.h)
// adds ΔT·(1 − e^(−t_k/τ_th)) to the temperature of sample period k, plateau
// heating or not, and R follows it.
//
// Of a real rig's artefacts (src/model/bench_artefacts.h) the sensors' (on v,
// i and τ) and the warm-up apply; commutation ripple does not (θ is constant)
// and neither does the free shaft's mechanical discrepancy.
//
// Torque column (plateaus, on request): the shaft is held by a load cell, which
// reads the torque the armature produces, τ = Kt·i (the rotor does not turn;
// bearing friction between the armature and the load cell is not modelled).
// Logged at the sample instants from the exact current, then noise of
// σ = torque_noise_sigma_N_m is added.
//
// Noise. White Gaussian noise of the given σ, then rounding to the ADC step,
// on the logged v and i (src/model/measurement_noise.h), and noise on τ
// (src/model/bench_noise.h); each channel draws from its own stream of
// BenchConditions::seed. The temperature channel is logged exactly.
//
// Throws std::invalid_argument for a plan or parameter set that cannot be
// simulated (Δ ≤ 0, a hold or span shorter than one sample, no levels,
// R + R_s ≤ 0, L < 0, Vb < 0, negative σ or lsb, a temperature at or below
// the copper line's zero, a torque column with Kt ≤ 0).

#include <vector>

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/model/sampled_log.h"

namespace coilspin::model {

// Exact sub-intervals per sample period (see Timing above).
inline constexpr int kSubStepsPerSample = 8;

// Supply stepped through levels, each held long enough to settle.
struct PlateauPlan {
  std::vector<double> supply_levels_V;  // may include negative levels (reversed polarity)
  double hold_s = 1.0;                  // time at each level
  double sample_period_s = 1e-3;
  bool log_temperature = false;         // add a temperature [degC] channel
  bool log_torque = false;              // add a torque [N·m] channel: τ = Kt·i (load cell)
};

// One fast supply step captured by a scope.
struct StepPlan {
  double supply_before_V = 0.0;
  double supply_after_V = 1.0;
  double before_s = 1e-3;               // time logged before the step
  double after_s = 10e-3;               // time logged after the step
  double sample_period_s = 10e-6;
};

SampledLog SimulateLockedRotorPlateaus(const MotorParameters& motor, const PlateauPlan& plan,
                                       const BenchConditions& bench);
SampledLog SimulateLockedRotorStep(const MotorParameters& motor, const StepPlan& plan,
                                   const BenchConditions& bench);

}  // namespace coilspin::model

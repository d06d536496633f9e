#pragma once
// Durations for a simulated free-shaft test whose user gave none: long enough
// for the transients to settle, from the model's own time constants
// (src/model/free_shaft_time_constants.h) at the given R (before any copper
// correction). The slowest transient decays as e^(−t/τ_slow), so
// kSettlingTimeConstants of them leave e^(−10) ≈ 5e-5 of a step.
//
// The coast after the supply is disconnected:
//   open circuit with Tc > 0: kCoastMargin × the closed-form stop time
//     (src/model/coast_closed_form.h) from the ideal no-load speed
//     (|V_s| − Vb)/Ke, which bounds the speed the run reaches;
//   otherwise (Tc = 0, or a braking resistor): kSettlingTimeConstants × the
//     slowest time constant of the coast.
// Throws std::invalid_argument when the coast never ends (open circuit,
// B = Tc = 0) and for parameters the time constants need (J > 0, L > 0,
// R + R_s > 0, Ke > 0).

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/model/simulate_spin_down.h"

namespace coilspin::model {

inline constexpr double kSettlingTimeConstants = 10.0;
inline constexpr double kCoastMargin = 1.2;  // a fifth beyond the predicted stop, to log the rotor at rest

// Settling time of the free shaft fed through the bench's R_s.
double SettlingTime_s(const MotorParameters& motor, const BenchConditions& bench);

// A coast long enough for `plan` (its supply_V and brake_resistance_ohm) to end at rest or settle.
double CoastTime_s(const MotorParameters& motor, const SpinDownPlan& plan);

}  // namespace coilspin::model

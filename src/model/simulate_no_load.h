#pragma once
// Forward simulation of the no-load bench: the shaft turns freely (τ_load = 0)
// and the supply V_s (behind the bench's R_s) is stepped through levels, each
// held for hold_s, long enough for the speed to settle when hold_s spans many
// of the slowest time constants (src/model/free_shaft_time_constants.h).
// The motor model, its brush and stiction rules and the integrator are those
// of src/model/free_shaft_dynamics.h; timing, channels and noise those of
// src/model/free_shaft_bench.h. The motor starts from rest.
//
// Settled, each level is the no-load point of docs/methods.md §1:
//     V_s − R_s·i = v,   v − R·i − Vb·sgn(i) = Ke·ω,   Kt·i = B·ω + Tc·sgn(ω)
//
// Logged: time, terminal voltage, current, and the shaft's speed and/or
// position at the logged shaft (gear ratio, encoder: src/model/shaft_channels.h);
// optionally the (constant) winding temperature.
//
// Throws std::invalid_argument for a plan or motor that cannot be simulated
// (no levels, a hold shorter than one sample, and whatever
// the integrator and the bench reject).

#include <vector>

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/model/sampled_log.h"
#include "src/model/shaft_channels.h"

namespace coilspin::model {

struct NoLoadPlan {
  std::vector<double> supply_levels_V;  // V_s of each level, in order; may reverse polarity
  double hold_s = 2.0;                  // time at each level
  double sample_period_s = 1e-3;
  ShaftChannels shaft = ShaftChannels::kSpeed;
  bool log_temperature = false;         // add a temperature [degC] channel
};

SampledLog SimulateNoLoad(const MotorParameters& motor, const NoLoadPlan& plan,
                          const BenchConditions& bench);

}  // namespace coilspin::model

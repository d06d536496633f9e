#pragma once
// Forward simulation of the locked-rotor bench (ω = 0):
//   L·di/dt = V_s(t) − (R + R_s)·i − Vb·sgn(i),   logged v = V_s − R_s·i
// solved exactly between samples (V_s is piecewise constant, changing only at
// sample instants), then noise and ADC quantisation are added to the logged
// channels. R follows the winding temperature (copper, docs/methods.md §7).

#include <vector>

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"
#include "src/model/sampled_log.h"

namespace coilspin::model {

// Supply stepped through levels, each held long enough to settle.
struct PlateauPlan {
  std::vector<double> supply_levels_V;  // may include negative levels (reversed polarity)
  double hold_s = 1.0;                  // time at each level
  double sample_period_s = 1e-3;
  bool log_temperature = false;         // add a temperature [degC] channel
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

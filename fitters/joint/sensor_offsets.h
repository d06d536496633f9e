#pragma once
// The current sensor's zero reading i_z in the joint fit (src/model/sensor_offsets.h).
//
// One i_z per session: the logs of one bench come through one current sensor.
// It is estimated when some log shows the current at zero — a coast with open
// terminals and the current logged (spin-down), or a capture or step that rests
// at 0 V before it starts — and from then on every residual that uses a logged
// current subtracts it, so an offset seen where one log rests corrects the logs
// that never rest (no-load plateaus). Where no log shows it, i_z is held at 0 and
// the parameters that rest on logged currents say so in their "assumes".

#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "fitters/core/shared_parameters.h"
#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "fitters/spin_down/spin_down_fit.h"
#include "fitters/step/step_fit.h"

namespace coilspin::joint {

struct CurrentZero {
  bool seen = false;                 // some log shows the current at zero: i_z is estimated
  double start_A = 0.0;              // its starting value (a coast's median reading, else 0)
  double scale_A = 1.0;              // its typical magnitude, for the solver's scaling
  std::vector<std::string> sources;  // where it was seen, in words
  bool one_sensor = true;            // false: the session's logs come through different sensors
};

// What the plans show of the current at zero; `peak_current_A` is the largest |i| logged.
// With `one_sensor` false an offset seen in one log says nothing of another's sensor:
// i_z is held at 0 and every current-dependent parameter says so.
CurrentZero FindCurrentZero(const locked_rotor::LockedRotorPlan& lr, const spin_down::SpinDownPlan& sd,
                            const step::StepTestPlan& st, double peak_current_A, bool one_sensor = true);

// Adds i_z to the problem before any test asks for it (estimated, or held at 0).
void AddCurrentZero(const CurrentZero& zero, core::SharedParameters* parameters);

// After the solve: i_z in the result's sensor offsets, or, when it was held at 0
// and a test's residuals use logged currents, an assumption on the parameters
// those tests inform.
void ReportCurrentZero(const CurrentZero& zero, const core::SharedParameters& parameters,
                       const core::FitResult& fit, MotorEstimate* estimate);

}  // namespace coilspin::joint

#pragma once
// Tuning of the current and speed loops for a fitted motor (cascade_design.h),
// with each gain's interval from the fit's uncertainty and each loop's phase
// margin from the fitted model (loop_margins.h).
//
// Interval of a gain g(θ) by the delta method over the result's full covariance
// C (every parameter, Kt included; src/result/parameter_covariance.h):
//   se(g) = √(∇gᵀ·C·∇g),  ∇g by central differences (step 10⁻⁶ of each
//   parameter's magnitude or standard error, whichever is larger),
//   interval g ± t·se, t the Student-t quantile at the fit's confidence and the
//   smallest degrees of freedom of the parameters g depends on (normal when
//   none is known, as with bootstrap intervals).
// The bandwidths are held fixed: they are design choices, also when they
// default from the fitted τe, and the interval says how far the gains that
// reach them are known.

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/result/model_parameters.h"
#include "src/tune/cascade_design.h"
#include "src/tune/loop_margins.h"

namespace coilspin::tune {

struct GainEstimate {
  double value = 0.0;
  double std_error = 0.0;
  double ci_low = 0.0;
  double ci_high = 0.0;
};

struct LoopTuning {
  GainEstimate kp, ki;
  double bandwidth_rad_s = 0.0;
  bool bandwidth_given = false;    // false: the default rule
  std::optional<Margin> margin;    // empty: no crossover found
};

struct TuningRequest {
  std::optional<double> current_bandwidth_rad_s;
  std::optional<double> speed_bandwidth_rad_s;
};

struct Tuning {
  double confidence = 0.95;
  LoopTuning current, speed;
};

// `parameters` must be complete (ModelParameters::complete()).
Tuning TuneCascade(const MotorEstimate& estimate, const result::ModelParameters& parameters,
                   const TuningRequest& request);

}  // namespace coilspin::tune

#pragma once
// Intervals for derived quantities: by the delta method on the fit's covariance
// (src/result/derived_intervals.h, shared with datasheet verification, which
// starts from a result file), or from bootstrap replicates; and the
// torque–speed line with its pointwise band.

#include <optional>
#include <vector>

#include "fitters/core/bootstrap.h"
#include "fitters/core/motor_estimate.h"
#include "src/model/derived_quantities.h"
#include "src/result/derived_intervals.h"

namespace coilspin::joint {

using result::DeriveWithInterval;  // the delta method (src/result/derived_intervals.h)
using result::ValuesOf;

// Bootstrap replicates of the joint problem, and where each parameter of the
// estimate's covariance (correlation_names, in order) sits in a replicate.
struct Replicates {
  const core::BootstrapResult* result = nullptr;
  std::vector<double> full_fit_values;  // the fit's values of every problem parameter
  std::vector<int> theta_index;         // problem index of correlation_names[k]
  // The covariance terms resampling cannot reproduce (input noise, counted
  // quantisation), in correlation_names order; empty when none. A derived
  // quantity's percentile sides are stretched by √(1 + v_added/v_replicates),
  // v_added = ∇gᵀ·added·∇g, as the parameters' are (interval_methods.h).
  std::vector<std::vector<double>> added_covariance;
};

// The same quantity from bootstrap replicates (core::BootstrapQuantity): value at
// the estimate, std_error the replicates' standard deviation, percentile interval
// at the estimate's confidence.
std::optional<QuantityEstimate> DeriveFromReplicates(const model::DerivedFormula& formula,
                                                     const MotorEstimate& estimate, double voltage_V,
                                                     const Replicates& replicates);

// The torque–speed line at V from stall to no-load speed, `points` points.
std::optional<TorqueSpeedLine> TorqueSpeed(const MotorEstimate& estimate, double voltage_V, int points);

}  // namespace coilspin::joint

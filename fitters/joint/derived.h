#pragma once
// Intervals for derived quantities by the delta method on the fit's covariance,
//     se(g) = √(∇gᵀ·Cov·∇g),
// with ∇g by central differences (step 10⁻⁶ of each parameter's magnitude), and
// the Student-t quantile at the smallest degrees of freedom among the
// parameters g uses (the conservative choice). When Kt was taken equal to Ke,
// both move together in the differences.

#include <optional>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/model/derived_quantities.h"

namespace coilspin::joint {

// The estimate's parameter values by key (Kt included when assumed equal to Ke).
model::ParameterValues ValuesOf(const MotorEstimate& estimate);

// Empty when a parameter the formula uses is not in the estimate's covariance.
std::optional<QuantityEstimate> DeriveWithInterval(const model::DerivedFormula& formula,
                                                   const MotorEstimate& estimate, double voltage_V);

// The same quantity from bootstrap replicates: value at the estimate, std_error the
// replicates' standard deviation, percentile interval at the estimate's confidence.
// theta_replicates: one vector per replicate, in the order of correlation_names.
std::optional<QuantityEstimate> DeriveFromReplicates(const model::DerivedFormula& formula,
                                                     const MotorEstimate& estimate, double voltage_V,
                                                     const std::vector<std::vector<double>>& theta_replicates);

// The torque–speed line at V from stall to no-load speed, `points` points.
std::optional<TorqueSpeedLine> TorqueSpeed(const MotorEstimate& estimate, double voltage_V, int points);

}  // namespace coilspin::joint

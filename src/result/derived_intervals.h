#pragma once
// Derived quantities of a result with intervals by the delta method on the
// result's covariance (docs/methods.md §6):
//     se(g) = √(∇gᵀ·Cov·∇g),
// with ∇g by central differences (step 10⁻⁶ of each parameter's magnitude, or
// of its standard error when that is larger), and the Student-t quantile at
// the smallest degrees of freedom among the parameters g uses (the
// conservative choice; a given value has none). When Kt was taken equal to Ke
// (basis "equal-to-Ke") both move together in the differences.
//
// The fit (fitters/joint) and datasheet verification (src/verify), which
// re-evaluates derived quantities at a datasheet's rated voltage from a result
// file, share this one evaluation.

#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/model/derived_quantities.h"

namespace coilspin::result {

// The estimate's parameter values by key (Kt included when assumed equal to Ke).
model::ParameterValues ValuesOf(const MotorEstimate& estimate);

// The same with the estimated parameters (correlation_names, in order) set to
// `theta`; the others (given values) keep the estimate's.
model::ParameterValues ValuesAt(const MotorEstimate& estimate, const std::vector<double>& theta);

// Value, standard error (delta method) and degrees of freedom of g(θ).
struct Propagated {
  double value = 0.0;
  double std_error = 0.0;
  double degrees_of_freedom = 0.0;
};

// `covariance`: the estimate's covariance, or another matrix in its layout (a part of it).
// `uses`: the parameter keys g reads, for the degrees of freedom.
Propagated Propagate(const MotorEstimate& estimate, const std::function<double(const model::ParameterValues&)>& g,
                     const std::vector<std::string>& uses, const std::vector<std::vector<double>>& covariance);

// Empty when a parameter the formula uses is not in the estimate.
std::optional<QuantityEstimate> DeriveWithInterval(const model::DerivedFormula& formula,
                                                   const MotorEstimate& estimate, double voltage_V);

}  // namespace coilspin::result

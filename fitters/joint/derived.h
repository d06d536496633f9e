#pragma once
// Intervals for derived quantities: the delta method on the fit's covariance,
//     se(g) = √(∇gᵀ·Cov·∇g),
// with the Student-t quantile at the smallest degrees of freedom among the
// parameters g uses (the conservative choice).

#include <optional>

#include "fitters/core/motor_estimate.h"
#include "src/model/derived_quantities.h"

namespace coilspin::joint {

// Empty when a parameter the formula uses is not in the estimate's covariance.
std::optional<QuantityEstimate> DeriveWithInterval(const model::DerivedFormula& formula,
                                                   const MotorEstimate& estimate);

}  // namespace coilspin::joint

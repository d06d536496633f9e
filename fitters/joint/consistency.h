#pragma once
// Kt/Ke consistency of a fit: the ratio and its interval by the delta method on
// the joint covariance, judged by src/check; "not-checked" when Kt was assumed
// equal to Ke or either is missing.

#include "fitters/core/motor_estimate.h"

namespace coilspin::joint {

Consistency CheckConsistency(const MotorEstimate& estimate, bool kt_measured, double tolerance);

}  // namespace coilspin::joint

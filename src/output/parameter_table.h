#pragma once
// The table printed on stdout: every parameter with value, unit, interval and
// the tests that informed it; then what could not be determined and why, the
// per-test residuals, and the warnings. It renders a MotorEstimate and
// computes nothing.

#include <string>

#include "fitters/core/motor_estimate.h"

namespace coilspin::output {

std::string ParameterTable(const MotorEstimate& estimate);

}  // namespace coilspin::output

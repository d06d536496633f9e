#pragma once
// The torque–speed line of a result as CSV: one row per point from stall to
// no-load speed, with the pointwise interval of the torque (the band). The
// header cells follow the bench-log convention "quantity [unit]"; comment lines
// "# key: value" before it give the voltage, whether friction is included and
// the interval level.

#include <string>

#include "fitters/core/motor_estimate.h"
#include "src/output/export_source.h"

namespace coilspin::output {

std::string TorqueSpeedCsv(const TorqueSpeedLine& line, const ExportSource& source);

}  // namespace coilspin::output

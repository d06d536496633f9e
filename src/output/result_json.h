#pragma once
// The result file, format "coilspin.result/1" (docs/file-formats.md): the
// product that simulators, controller tuning and firmware read. Values are SI
// in the units named beside them; keys keep a fixed order so the same fit
// gives byte-identical files.

#include <string>

#include "fitters/core/motor_estimate.h"

namespace coilspin::output {

inline constexpr const char* kResultFormat = "coilspin.result/1";

std::string ResultJson(const MotorEstimate& estimate);

}  // namespace coilspin::output

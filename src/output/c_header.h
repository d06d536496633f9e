#pragma once
// The fitted motor as a C++ header for firmware and simulation code: every
// parameter, ratio and derived figure of the result as a `constexpr double` in
// SI, named key_unit (resistance_ohm, inertia_kg_m2, no_load_speed_rad_per_s),
// with symbol, unit, interval and the tests behind it in a comment; the
// operating voltage of the derived figures as at_voltage_V. Values are written
// in full (they read back as the same doubles as in the result file).
// Everything sits in a namespace named after the motor.

#include <string>

#include "fitters/core/motor_estimate.h"
#include "src/output/export_source.h"

namespace coilspin::output {

// "N*m/A" → "N_m_per_A", "rad/(s*V)" → "rad_per_s_V", "kg*m^2" → "kg_m2", "1" → "".
std::string UnitSuffix(const std::string& unit);

std::string CHeader(const MotorEstimate& estimate, const std::string& name, const ExportSource& source);

}  // namespace coilspin::output

#include "src/verify/spec_keys.h"

namespace coilspin::verify {

const std::vector<SpecKey>& SpecKeys() {
  using units::Dimension;
  constexpr KeySource kParameter = KeySource::kParameter;
  constexpr KeySource kDerived = KeySource::kDerived;
  // Keys and symbols as the result file writes them (fitters/joint, src/model/derived_quantities.cc).
  // The speed constant is compared in SI: the result's "speed_constant" is in rpm/V, its
  // "speed_constant_si" in rad/(s*V), and both datasheet keys are checked against the latter.
  static const std::vector<SpecKey> keys = {
      {"resistance", "R", Dimension::kResistance, kParameter, "resistance"},
      {"inductance", "L", Dimension::kInductance, kParameter, "inductance"},
      {"brush_drop", "Vb", Dimension::kVoltage, kParameter, "brush_drop"},
      {"back_emf_constant", "Ke", Dimension::kBackEmfConstant, kParameter, "back_emf_constant"},
      {"torque_constant", "Kt", Dimension::kTorqueConstant, kParameter, "torque_constant"},
      {"inertia", "J", Dimension::kInertia, kParameter, "inertia"},
      {"viscous_friction", "B", Dimension::kViscousFriction, kParameter, "viscous_friction"},
      {"coulomb_friction", "Tc", Dimension::kTorque, kParameter, "coulomb_friction"},
      {"stall_current", "I_stall", Dimension::kCurrent, kDerived, "stall_current"},
      {"stall_torque", "T_stall", Dimension::kTorque, kDerived, "stall_torque"},
      {"stall_torque_with_friction", "T_stall_f", Dimension::kTorque, kDerived, "stall_torque_with_friction"},
      {"no_load_speed", "w_nl", Dimension::kSpeed, kDerived, "no_load_speed"},
      {"no_load_speed_ideal", "w_nl0", Dimension::kSpeed, kDerived, "no_load_speed_ideal"},
      {"no_load_current", "I_nl", Dimension::kCurrent, kDerived, "no_load_current"},
      {"electrical_time_constant", "tau_e", Dimension::kTime, kDerived, "electrical_time_constant"},
      {"mechanical_time_constant", "tau_m", Dimension::kTime, kDerived, "mechanical_time_constant"},
      {"speed_constant", "Kv", Dimension::kSpeedConstant, kDerived, "speed_constant_si"},
      {"speed_constant_si", "Kv_SI", Dimension::kSpeedConstant, kDerived, "speed_constant_si"},
      {"motor_constant", "Km", Dimension::kMotorConstant, kDerived, "motor_constant"},
      {"speed_torque_slope", "dw/dT", Dimension::kSpeedTorqueSlope, kDerived, "speed_torque_slope"},
      {"max_output_power", "P_max", Dimension::kPower, kDerived, "max_output_power"},
      {"peak_efficiency", "eta_max", Dimension::kRatio, kDerived, "peak_efficiency"},
  };
  return keys;
}

const SpecKey* FindSpecKey(std::string_view key) {
  for (const SpecKey& k : SpecKeys()) {
    if (k.key == key) return &k;
  }
  return nullptr;
}

}  // namespace coilspin::verify

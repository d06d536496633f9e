#pragma once
// Winding resistance at another temperature (docs/methods.md §7).
//
// Copper's resistance is linear in temperature to good accuracy over the range
// a winding sees; with k the temperature at which the straight line reaches
// zero (units::kCopperTemperatureConstant_degC in src/units/constants.h,
// 234.5 °C from IEC 60028),
//     R(θ) = R_ref·(k + θ)/(k + θ_ref).
// The same formula, read the other way, corrects a measured R to θ_ref.
// Below −k the line has no physical meaning: the function rejects it.

namespace coilspin::model {

// R at `temperature_degC`, given R = `resistance_at_reference_ohm` at
// `reference_temperature_degC`. Throws std::invalid_argument when either
// temperature is at or below −k.
double CopperResistanceAt(double resistance_at_reference_ohm, double reference_temperature_degC,
                          double temperature_degC);

}  // namespace coilspin::model

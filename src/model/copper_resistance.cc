#include "src/model/copper_resistance.h"

#include <stdexcept>
#include <string>

#include "src/units/constants.h"

namespace coilspin::model {

double CopperResistanceAt(double resistance_at_reference_ohm, double reference_temperature_degC,
                          double temperature_degC) {
  const double k = units::kCopperTemperatureConstant_degC;
  if (!(k + reference_temperature_degC > 0.0) || !(k + temperature_degC > 0.0)) {
    throw std::invalid_argument("copper resistance: temperatures must be above " +
                                std::to_string(-k) + " degC (got " +
                                std::to_string(reference_temperature_degC) + " and " +
                                std::to_string(temperature_degC) + ")");
  }
  // R(θ) = R_ref·(k + θ)/(k + θ_ref)
  return resistance_at_reference_ohm * (k + temperature_degC) / (k + reference_temperature_degC);
}

}  // namespace coilspin::model

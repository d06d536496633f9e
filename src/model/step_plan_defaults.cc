#include "src/model/step_plan_defaults.h"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "src/model/copper_resistance.h"

namespace coilspin::model {

double StepSamplePeriod_s(const MotorParameters& motor, const BenchConditions& bench) {
  const double warm_ohm = CopperResistanceAt(motor.resistance_ohm, bench.resistance_reference_temperature_degC,
                                             bench.winding_temperature_degC);
  const double loop_ohm = warm_ohm + bench.supply_resistance_ohm;  // R + R_s
  if (!(motor.inductance_H > 0.0) || !(loop_ohm > 0.0) || !std::isfinite(motor.inductance_H / loop_ohm)) {
    throw std::invalid_argument("step plan: L and R + R_s must be > 0");
  }
  const double electrical_s = motor.inductance_H / loop_ohm;  // τe = L/(R + R_s)
  return std::min(kFastLoggerSamplePeriod_s, electrical_s / kSamplesPerElectricalTimeConstant);
}

}  // namespace coilspin::model

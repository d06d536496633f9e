#include "src/model/winding_warm_up.h"

#include <cmath>
#include <stdexcept>

namespace coilspin::model {

bool HasWarmUp(const WindingWarmUp& warm_up) { return warm_up.rise_K != 0.0; }

double WarmUpRise_K(const WindingWarmUp& warm_up, double time_s) {
  if (!HasWarmUp(warm_up)) return 0.0;
  // ΔT·(1 − e^(−t/τ_th)); 1 − e^(−x) = −expm1(−x) keeps digits while t ≪ τ_th
  return -warm_up.rise_K * std::expm1(-time_s / warm_up.time_constant_s);
}

double WindingTemperatureAt_degC(const BenchConditions& bench, double time_s) {
  return bench.winding_temperature_degC + WarmUpRise_K(bench.warm_up, time_s);
}

void ValidateWarmUp(const WindingWarmUp& warm_up) {
  if (!std::isfinite(warm_up.rise_K)) throw std::invalid_argument("winding warm-up: the rise must be finite");
  if (HasWarmUp(warm_up) && !(std::isfinite(warm_up.time_constant_s) && warm_up.time_constant_s > 0.0)) {
    throw std::invalid_argument("winding warm-up: the thermal time constant must be > 0");
  }
}

}  // namespace coilspin::model

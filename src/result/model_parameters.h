#pragma once
// The model's parameter set (src/model/motor_parameters.h) from a result, for
// the commands that simulate or design with the fitted motor. R, L, Ke, Kt and
// J are needed; the friction terms B, Tc and the brush drop Vb are taken as 0
// when the result does not determine them, and that is said.

#include <string>
#include <utility>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "src/model/motor_parameters.h"

namespace coilspin::result {

struct ModelParameters {
  model::MotorParameters values;  // SI; absent optional terms 0
  // A needed parameter the result does not determine: key, and the reason the result gives.
  std::vector<std::pair<std::string, std::string>> missing;
  std::vector<std::string> taken_as_zero;  // keys of optional terms not in the result
  bool complete() const { return missing.empty(); }
};

ModelParameters ModelParametersOf(const MotorEstimate& estimate);

}  // namespace coilspin::result

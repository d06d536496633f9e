// Names and tuning constants of the robust losses (robust_loss.h).

#include "fitters/core/robust_loss.h"

namespace coilspin::core {

std::string RobustLossToString(RobustLoss loss) {
  switch (loss) {
    case RobustLoss::kSquared:
      return "squared";
    case RobustLoss::kHuber:
      return "huber";
    case RobustLoss::kCauchy:
      return "cauchy";
  }
  return "squared";
}

std::optional<RobustLoss> RobustLossFromString(const std::string& name) {
  for (RobustLoss loss : {RobustLoss::kSquared, RobustLoss::kHuber, RobustLoss::kCauchy}) {
    if (RobustLossToString(loss) == name) return loss;
  }
  return std::nullopt;
}

double RobustTuning(RobustLoss loss) {
  switch (loss) {
    case RobustLoss::kHuber:
      return kHuberTuning;
    case RobustLoss::kCauchy:
      return kCauchyTuning;
    case RobustLoss::kSquared:
      break;
  }
  return 1.0;
}

}  // namespace coilspin::core

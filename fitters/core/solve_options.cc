// SolveOptions::IsValid: the checks run before any solve (see least_squares.h).

#include <cmath>
#include <string>

#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

bool Fail(std::string* error, const std::string& why) {
  if (error != nullptr) *error = why;
  return false;
}

bool PositiveFinite(double value) { return std::isfinite(value) && value > 0.0; }

}  // namespace

bool SolveOptions::IsValid(std::string* error) const {
  if (!(confidence > 0.0 && confidence < 1.0)) {
    return Fail(error, "confidence must lie strictly between 0 and 1, got " + std::to_string(confidence));
  }
  if (max_iterations <= 0) {
    return Fail(error, "max_iterations must be positive, got " + std::to_string(max_iterations));
  }
  if (!PositiveFinite(function_tolerance)) return Fail(error, "function_tolerance must be positive and finite");
  if (!PositiveFinite(gradient_tolerance)) return Fail(error, "gradient_tolerance must be positive and finite");
  if (!PositiveFinite(parameter_tolerance)) return Fail(error, "parameter_tolerance must be positive and finite");
  if (!(rank_tolerance > 0.0 && rank_tolerance < 1.0)) {
    return Fail(error, "rank_tolerance must lie strictly between 0 and 1");
  }
  if (estimate_group_sigmas && group_sigma_rounds <= 0) {
    return Fail(error, "group_sigma_rounds must be positive when estimate_group_sigmas is set, got " +
                           std::to_string(group_sigma_rounds));
  }
  if (estimate_group_sigmas && !residual_variance_from_data) {
    return Fail(error,
                "estimate_group_sigmas takes the noise levels from the residuals, so they are not known "
                "exactly: residual_variance_from_data must stay true");
  }
  if (loss != RobustLoss::kSquared && residual_variance_from_data && !estimate_group_sigmas) {
    return Fail(error, "the " + RobustLossToString(loss) +
                           " loss measures residuals in units of sigma_g, so the noise must be known "
                           "(residual_variance_from_data = false) or estimated robustly (estimate_group_sigmas)");
  }
  return true;
}

}  // namespace coilspin::core

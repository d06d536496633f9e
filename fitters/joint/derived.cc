#include "fitters/joint/derived.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "fitters/core/least_squares.h"

namespace coilspin::joint {

std::optional<QuantityEstimate> DeriveWithInterval(const model::DerivedFormula& formula,
                                                   const MotorEstimate& estimate) {
  std::vector<std::size_t> index;
  double dof = std::numeric_limits<double>::infinity();
  std::vector<std::string> tests;
  for (const auto& key : formula.uses) {
    const auto it = std::find(estimate.correlation_names.begin(), estimate.correlation_names.end(), key);
    const QuantityEstimate* parameter = estimate.Find(key);
    if (it == estimate.correlation_names.end() || parameter == nullptr) return std::nullopt;
    index.push_back(static_cast<std::size_t>(it - estimate.correlation_names.begin()));
    dof = std::min(dof, parameter->degrees_of_freedom);
    for (const auto& t : parameter->tests)
      if (std::find(tests.begin(), tests.end(), t) == tests.end()) tests.push_back(t);
  }
  double variance = 0.0;  // ∇gᵀ·Cov·∇g
  for (std::size_t a = 0; a < index.size(); ++a)
    for (std::size_t b = 0; b < index.size(); ++b)
      variance += formula.gradient[a] * estimate.covariance[index[a]][index[b]] * formula.gradient[b];
  QuantityEstimate q;
  q.key = formula.key;
  q.symbol = formula.symbol;
  q.unit = formula.unit;
  q.value = formula.value;
  q.std_error = std::sqrt(std::max(0.0, variance));
  q.degrees_of_freedom = dof;
  const double t = core::StudentTQuantile(0.5 * (1.0 + estimate.confidence), dof);
  q.ci_low = q.value - t * q.std_error;
  q.ci_high = q.value + t * q.std_error;
  q.tests = tests;
  return q;
}

}  // namespace coilspin::joint

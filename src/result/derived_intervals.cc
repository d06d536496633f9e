#include "src/result/derived_intervals.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "fitters/core/least_squares.h"
#include "src/result/parameter_covariance.h"

namespace coilspin::result {
namespace {

constexpr double kRelativeStep = 1e-6;

bool KtTiedToKe(const MotorEstimate& e) {
  const QuantityEstimate* kt = e.Find("torque_constant");
  return kt && kt->basis == kTiedToKeBasis;
}

std::vector<double> Theta(const MotorEstimate& e) {
  std::vector<double> theta;
  for (const auto& name : e.correlation_names) theta.push_back(e.Find(name)->value);
  return theta;
}

}  // namespace

model::ParameterValues ValuesAt(const MotorEstimate& e, const std::vector<double>& theta) {
  model::ParameterValues values;
  for (const auto& q : e.parameters) values[q.key] = q.value;  // fixed or given ones enter as constants
  for (std::size_t k = 0; k < e.correlation_names.size(); ++k) values[e.correlation_names[k]] = theta[k];
  if (KtTiedToKe(e) && values.count("back_emf_constant")) values["torque_constant"] = values["back_emf_constant"];
  return values;
}

model::ParameterValues ValuesOf(const MotorEstimate& e) { return ValuesAt(e, Theta(e)); }

Propagated Propagate(const MotorEstimate& e, const std::function<double(const model::ParameterValues&)>& g,
                     const std::vector<std::string>& uses, const std::vector<std::vector<double>>& covariance) {
  const std::vector<double> theta = Theta(e);
  const std::size_t n = theta.size();
  std::vector<double> gradient(n, 0.0);
  for (std::size_t j = 0; j < n; ++j) {
    const double h = kRelativeStep * std::max(std::fabs(theta[j]), e.Find(e.correlation_names[j])->std_error);
    if (!(h > 0.0)) continue;
    std::vector<double> up = theta, down = theta;
    up[j] += h;
    down[j] -= h;
    gradient[j] = (g(ValuesAt(e, up)) - g(ValuesAt(e, down))) / (2.0 * h);  // ∂g/∂θ_j
  }
  double variance = 0.0;  // ∇gᵀ·Cov·∇g
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = 0; b < n; ++b) variance += gradient[a] * covariance[a][b] * gradient[b];
  double dof = std::numeric_limits<double>::infinity();
  for (std::string key : uses) {
    if (key == "torque_constant" && KtTiedToKe(e)) key = "back_emf_constant";
    const bool estimated = std::find(e.correlation_names.begin(), e.correlation_names.end(), key) !=
                           e.correlation_names.end();  // given (fixed) values carry no degrees of freedom
    if (const QuantityEstimate* q = e.Find(key); q && estimated) dof = std::min(dof, q->degrees_of_freedom);
  }
  return {g(ValuesAt(e, theta)), std::sqrt(std::max(0.0, variance)), dof};
}

std::optional<QuantityEstimate> DeriveWithInterval(const model::DerivedFormula& formula, const MotorEstimate& e,
                                                   double voltage_V) {
  std::vector<std::string> tests;
  for (std::string key : formula.uses) {
    const QuantityEstimate* parameter = e.Find(key);
    if (parameter == nullptr) return std::nullopt;
    for (const auto& t : parameter->tests)
      if (std::find(tests.begin(), tests.end(), t) == tests.end()) tests.push_back(t);
  }
  const Propagated p = Propagate(e, formula.value, formula.uses, e.covariance);
  QuantityEstimate q;
  q.key = formula.key;
  q.symbol = formula.symbol;
  q.unit = formula.unit;
  q.value = p.value;
  q.std_error = p.std_error;
  q.degrees_of_freedom = p.degrees_of_freedom;
  const double t = core::StudentTQuantile(0.5 * (1.0 + e.confidence), p.degrees_of_freedom);
  q.ci_low = q.value - t * q.std_error;
  q.ci_high = q.value + t * q.std_error;
  // A value or interval the numbers cannot give (an overflow, no degrees of freedom) is no result.
  if (!(std::isfinite(q.value) && std::isfinite(q.ci_low) && std::isfinite(q.ci_high))) return std::nullopt;
  q.tests = tests;
  if (formula.at_voltage) q.at_voltage_V = voltage_V;
  q.note = model::DerivedNote(formula.key);
  if (formula.at_voltage && !e.Find("brush_drop"))
    q.note += (q.note.empty() ? "" : "; ") + std::string("brush drop not determined: taken as 0 V");
  return q;
}

}  // namespace coilspin::result

#include "fitters/joint/derived.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

#include "fitters/core/least_squares.h"

namespace coilspin::joint {
namespace {

constexpr double kRelativeStep = 1e-6;
const char* const kTied = "equal-to-Ke";

bool KtTiedToKe(const MotorEstimate& e) {
  const QuantityEstimate* kt = e.Find("torque_constant");
  return kt && kt->basis == kTied;
}

model::ParameterValues ValuesFrom(const MotorEstimate& e, const std::vector<double>& theta) {
  model::ParameterValues values;
  for (const auto& q : e.parameters) values[q.key] = q.value;  // fixed or given ones enter as constants
  for (std::size_t k = 0; k < e.correlation_names.size(); ++k) values[e.correlation_names[k]] = theta[k];
  if (KtTiedToKe(e) && values.count("back_emf_constant")) values["torque_constant"] = values["back_emf_constant"];
  return values;
}

std::vector<double> Theta(const MotorEstimate& e) {
  std::vector<double> theta;
  for (const auto& name : e.correlation_names) theta.push_back(e.Find(name)->value);
  return theta;
}

// Value, standard error (delta method) and degrees of freedom of g(θ).
struct Propagated {
  double value, std_error, dof;
};

// `covariance`: e.covariance, or another matrix in its layout (a part of it).
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
    gradient[j] = (g(ValuesFrom(e, up)) - g(ValuesFrom(e, down))) / (2.0 * h);  // ∂g/∂θ_j
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
  return {g(ValuesFrom(e, theta)), std::sqrt(std::max(0.0, variance)), dof};
}

}  // namespace

model::ParameterValues ValuesOf(const MotorEstimate& e) { return ValuesFrom(e, Theta(e)); }

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
  q.degrees_of_freedom = p.dof;
  const double t = core::StudentTQuantile(0.5 * (1.0 + e.confidence), p.dof);
  q.ci_low = q.value - t * q.std_error;
  q.ci_high = q.value + t * q.std_error;
  // A value or interval the numbers cannot give (an overflow, no degrees of freedom) is no result.
  if (!(std::isfinite(q.value) && std::isfinite(q.ci_low) && std::isfinite(q.ci_high))) return std::nullopt;
  q.tests = tests;
  if (formula.at_voltage) q.at_voltage_V = voltage_V;
  if (formula.at_voltage && !e.Find("brush_drop")) q.note = "brush drop not determined: taken as 0 V";
  return q;
}

std::optional<QuantityEstimate> DeriveFromReplicates(const model::DerivedFormula& formula, const MotorEstimate& e,
                                                     double voltage_V, const Replicates& replicates) {
  std::optional<QuantityEstimate> q = DeriveWithInterval(formula, e, voltage_V);  // value, tests, notes
  if (!q || !replicates.result) return q;
  const auto quantity = [&](const std::vector<double>& values) {
    std::vector<double> theta;
    for (int index : replicates.theta_index) theta.push_back(values[static_cast<std::size_t>(index)]);
    return formula.value(ValuesFrom(e, theta));
  };
  const core::ParameterEstimate b =
      core::BootstrapQuantity(*replicates.result, formula.key, replicates.full_fit_values, quantity, e.confidence);
  double added = 0.0;  // v_added = ∇gᵀ·added·∇g
  if (!replicates.added_covariance.empty()) {
    const double se = Propagate(e, formula.value, formula.uses, replicates.added_covariance).std_error;
    added = se * se;
  }
  const double replicate_variance = b.std_error * b.std_error;
  const double k = replicate_variance > 0.0 ? std::sqrt(1.0 + added / replicate_variance) : 1.0;
  q->std_error = std::sqrt(replicate_variance + added);
  q->ci_low = b.value - k * (b.value - b.ci_low);
  q->ci_high = b.value + k * (b.ci_high - b.value);
  q->degrees_of_freedom = b.degrees_of_freedom;  // NaN: not a t interval
  if (!(std::isfinite(q->ci_low) && std::isfinite(q->ci_high))) return std::nullopt;
  return q;
}

std::optional<TorqueSpeedLine> TorqueSpeed(const MotorEstimate& e, double voltage_V, int points) {
  const std::vector<std::string> needed = {"resistance", "torque_constant", "back_emf_constant"};
  for (const auto& key : needed)
    if (!e.Find(key)) return std::nullopt;
  TorqueSpeedLine line;
  line.at_voltage_V = voltage_V;
  line.includes_friction = e.Find("viscous_friction") && e.Find("coulomb_friction");
  std::vector<std::string> uses = needed;
  if (line.includes_friction) uses.insert(uses.end(), {"viscous_friction", "coulomb_friction"});
  const double top_speed = model::NoLoadSpeed(ValuesOf(e), voltage_V);
  for (int k = 0; k < points; ++k) {
    const double speed = top_speed * k / (points - 1);
    const Propagated p = Propagate(
        e, [&](const model::ParameterValues& v) { return model::ShaftTorque(v, voltage_V, speed); }, uses,
        e.covariance);
    const double t = core::StudentTQuantile(0.5 * (1.0 + e.confidence), p.dof);
    line.points.push_back({speed, p.value, p.value - t * p.std_error, p.value + t * p.std_error});
    if (!(std::isfinite(p.value) && std::isfinite(t * p.std_error))) return std::nullopt;  // as for a derived value
  }
  return line;
}

}  // namespace coilspin::joint

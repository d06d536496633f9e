#include "fitters/joint/derived.h"

#include <cmath>

#include "fitters/core/least_squares.h"

namespace coilspin::joint {

std::optional<QuantityEstimate> DeriveFromReplicates(const model::DerivedFormula& formula, const MotorEstimate& e,
                                                     double voltage_V, const Replicates& replicates) {
  std::optional<QuantityEstimate> q = DeriveWithInterval(formula, e, voltage_V);  // value, tests, notes
  if (!q || !replicates.result) return q;
  const auto quantity = [&](const std::vector<double>& values) {
    std::vector<double> theta;
    for (int index : replicates.theta_index) theta.push_back(values[static_cast<std::size_t>(index)]);
    return formula.value(result::ValuesAt(e, theta));
  };
  const core::ParameterEstimate b =
      core::BootstrapQuantity(*replicates.result, formula.key, replicates.full_fit_values, quantity, e.confidence);
  double added = 0.0;  // v_added = ∇gᵀ·added·∇g
  if (!replicates.added_covariance.empty()) {
    const double se = result::Propagate(e, formula.value, formula.uses, replicates.added_covariance).std_error;
    added = se * se;
  }
  const double replicate_variance = b.std_error * b.std_error;
  const double k = (replicate_variance > 0.0 ? std::sqrt(1.0 + added / replicate_variance) : 1.0) *
                   core::SmallSampleStretch(q->degrees_of_freedom, e.confidence);  // Wald ν of the quantity
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
    const result::Propagated p = result::Propagate(
        e, [&](const model::ParameterValues& v) { return model::ShaftTorque(v, voltage_V, speed); }, uses,
        e.covariance);
    const double t = core::StudentTQuantile(0.5 * (1.0 + e.confidence), p.degrees_of_freedom);
    line.points.push_back({speed, p.value, p.value - t * p.std_error, p.value + t * p.std_error});
    if (!(std::isfinite(p.value) && std::isfinite(t * p.std_error))) return std::nullopt;  // as for a derived value
  }
  return line;
}

}  // namespace coilspin::joint

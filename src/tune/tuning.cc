#include "src/tune/tuning.h"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

#include "fitters/core/least_squares.h"
#include "src/result/parameter_covariance.h"

namespace coilspin::tune {
namespace {

constexpr double kRelativeStep = 1e-6;

double* Field(model::MotorParameters& p, const std::string& key) {
  if (key == "resistance") return &p.resistance_ohm;
  if (key == "inductance") return &p.inductance_H;
  if (key == "back_emf_constant") return &p.back_emf_constant_V_s_per_rad;
  if (key == "torque_constant") return &p.torque_constant_N_m_per_A;
  if (key == "inertia") return &p.inertia_kg_m2;
  if (key == "viscous_friction") return &p.viscous_friction_N_m_s_per_rad;
  if (key == "coulomb_friction") return &p.coulomb_friction_N_m;
  if (key == "brush_drop") return &p.brush_drop_V;
  return nullptr;
}

using Gain = std::function<double(const model::MotorParameters&)>;

GainEstimate Propagate(const MotorEstimate& e, const result::NamedMatrix& covariance,
                       const model::MotorParameters& at, const Gain& g) {
  const std::size_t n = covariance.names.size();
  std::vector<double> gradient(n, 0.0);
  double dof = std::numeric_limits<double>::infinity();
  for (std::size_t k = 0; k < n; ++k) {
    model::MotorParameters up = at, down = at;
    double* u = Field(up, covariance.names[k]);
    double* d = Field(down, covariance.names[k]);
    const QuantityEstimate* q = e.Find(covariance.names[k]);
    if (!u || !q || !(covariance.matrix[k][k] > 0.0)) continue;
    const double h = kRelativeStep * std::max(std::fabs(*u), q->std_error);
    if (!(h > 0.0)) continue;
    *u += h;
    *d -= h;
    gradient[k] = (g(up) - g(down)) / (2.0 * h);  // ∂g/∂θ_k
    if (gradient[k] != 0.0 && std::isfinite(q->degrees_of_freedom) && q->degrees_of_freedom > 0.0)
      dof = std::min(dof, q->degrees_of_freedom);
  }
  double variance = 0.0;  // ∇gᵀ·C·∇g
  for (std::size_t a = 0; a < n; ++a)
    for (std::size_t b = 0; b < n; ++b) variance += gradient[a] * covariance.matrix[a][b] * gradient[b];
  GainEstimate r;
  r.value = g(at);
  r.std_error = std::sqrt(std::max(0.0, variance));
  const double t = core::StudentTQuantile(0.5 * (1.0 + e.confidence), dof);
  r.ci_low = r.value - t * r.std_error;
  r.ci_high = r.value + t * r.std_error;
  return r;
}

}  // namespace

Tuning TuneCascade(const MotorEstimate& e, const result::ModelParameters& parameters, const TuningRequest& request) {
  const model::MotorParameters& p = parameters.values;
  const result::NamedMatrix covariance = result::FullCovariance(e);
  Tuning t;
  t.confidence = e.confidence;
  const double wc = request.current_bandwidth_rad_s.value_or(DefaultCurrentBandwidth_rad_s(p));
  const double ws = request.speed_bandwidth_rad_s.value_or(DefaultSpeedBandwidth_rad_s(wc));

  t.current.bandwidth_rad_s = wc;
  t.current.bandwidth_given = request.current_bandwidth_rad_s.has_value();
  t.current.kp = Propagate(e, covariance, p, [wc](const model::MotorParameters& m) { return CurrentLoopGains(m, wc).kp; });
  t.current.ki = Propagate(e, covariance, p, [wc](const model::MotorParameters& m) { return CurrentLoopGains(m, wc).ki; });
  const PiGains current = CurrentLoopGains(p, wc);
  t.current.margin = CurrentLoopMargin(p, current, wc);

  t.speed.bandwidth_rad_s = ws;
  t.speed.bandwidth_given = request.speed_bandwidth_rad_s.has_value();
  t.speed.kp =
      Propagate(e, covariance, p, [wc, ws](const model::MotorParameters& m) { return SpeedLoopGains(m, wc, ws).kp; });
  t.speed.ki =
      Propagate(e, covariance, p, [wc, ws](const model::MotorParameters& m) { return SpeedLoopGains(m, wc, ws).ki; });
  t.speed.margin = SpeedLoopMargin(p, current, SpeedLoopGains(p, wc, ws), ws);
  return t;
}

}  // namespace coilspin::tune

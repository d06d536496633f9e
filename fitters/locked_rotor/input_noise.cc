#include "fitters/locked_rotor/input_noise.h"

#include <ceres/jet.h>

#include <Eigen/Dense>
#include <cmath>
#include <string>
#include <vector>

#include "fitters/core/added_covariance.h"
#include "fitters/locked_rotor/step_residual.h"
#include "src/model/sensor_offsets.h"

namespace coilspin::locked_rotor {
namespace {

constexpr int kStepParameters = 5;  // R, L, Vb, i0, i_z (the functor's order)
using Jet = ceres::Jet<double, kStepParameters>;

// ∂r_k/∂(R, L, Vb, i0, i_z) of one step capture at the solution, by automatic differentiation.
Eigen::MatrixXd StepJacobian(const StepCurrentResidual& residual, const double values[kStepParameters]) {
  const std::size_t n = residual.time_s->size();
  Jet p[kStepParameters];
  const Jet* pointers[kStepParameters];
  for (int j = 0; j < kStepParameters; ++j) {
    p[j] = Jet(values[j], j);
    pointers[j] = &p[j];
  }
  std::vector<Jet> r(n);
  residual(pointers, r.data());
  Eigen::MatrixXd jacobian(n, kStepParameters);
  for (std::size_t k = 0; k < n; ++k)
    for (int j = 0; j < kStepParameters; ++j) jacobian(static_cast<Eigen::Index>(k), j) = r[k].v[j];
  return jacobian;
}

}  // namespace

void AddVoltageNoiseCovariance(const LockedRotorPlan& plan, const core::SharedParameters& parameters,
                               core::FitResult* fit) {
  if (!fit->usable) return;
  const Eigen::Index p = fit->covariance.rows();
  Eigen::MatrixXd extra = Eigen::MatrixXd::Zero(p, p);
  for (std::size_t s = 0; s < plan.step_logs.size(); ++s) {
    const StepLog& sl = plan.step_logs[s];
    const int index[kStepParameters] = {parameters.Index("resistance"), parameters.Index("inductance"),
                                        parameters.Index("brush_drop"),
                                        parameters.Index("initial_current_" + std::to_string(s)),
                                        parameters.Index(model::kCurrentOffsetKey)};
    double values[kStepParameters];
    for (int j = 0; j < kStepParameters; ++j) values[j] = fit->parameters[index[j]].value;
    const StepCurrentResidual residual = StepResidualOf(sl);
    const Eigen::MatrixXd jacobian = StepJacobian(residual, values);
    const double sigma_i = fit->groups[sl.group].sigma;
    const double sigma_v = sl.voltage_noise_V;
    if (!(sigma_v > 0.0) || !(sigma_i > 0.0)) continue;
    const double r_ohm = values[0] * sl.factor, l_H = values[1], vb_V = values[2];
    const std::vector<double>& t = sl.log->time_s;
    const std::vector<double>& v = sl.log->voltage_V;
    const std::size_t n = t.size();
    // Backward pass: S_m = J_{m+1} + a_{m+1}·S_{m+1};  U_m = c_m·S_m/σ_i²
    Eigen::MatrixXd u = Eigen::MatrixXd::Zero(kStepParameters, static_cast<Eigen::Index>(n));
    Eigen::Matrix<double, kStepParameters, 1> sum = Eigen::Matrix<double, kStepParameters, 1>::Zero();
    for (std::size_t m = n - 1; m-- > 0;) {
      const double a_next = m + 2 < n ? std::exp(-(t[m + 2] - t[m + 1]) * r_ohm / l_H) : 0.0;
      sum = jacobian.row(static_cast<Eigen::Index>(m + 1)).transpose() + a_next * sum;
      const double a_m = std::exp(-(t[m + 1] - t[m]) * r_ohm / l_H);
      const double c_m = std::fabs(v[m]) > vb_V ? (1.0 - a_m) / r_ohm : 0.0;
      u.col(static_cast<Eigen::Index>(m)) = c_m * sum / (sigma_i * sigma_i);
    }
    Eigen::MatrixXd cov_columns(p, kStepParameters);
    for (int j = 0; j < kStepParameters; ++j) cov_columns.col(j) = fit->inverse_information.col(index[j]);
    // U·Γ·Uᵀ = σ_v²·Σ_m (U_m·U_mᵀ + U_m·Y_mᵀ + Y_m·U_mᵀ),  Y_m = φ_v·(Y_{m−1} + U_{m−1})
    const double phi = sl.voltage_noise_lag1;
    Eigen::Matrix<double, kStepParameters, kStepParameters> moment =
        Eigen::Matrix<double, kStepParameters, kStepParameters>::Zero();
    Eigen::Matrix<double, kStepParameters, 1> filtered = Eigen::Matrix<double, kStepParameters, 1>::Zero();
    for (Eigen::Index m = 0; m < u.cols(); ++m) {
      if (m > 0) filtered = phi * (filtered + u.col(m - 1));
      const Eigen::Matrix<double, kStepParameters, 1> column = u.col(m);
      moment += column * column.transpose() + column * filtered.transpose() + filtered * column.transpose();
    }
    extra += sigma_v * sigma_v * cov_columns * moment * cov_columns.transpose();  // C·U·Γ·Uᵀ·C
  }
  core::AddCovariance(extra, fit);
}

}  // namespace coilspin::locked_rotor

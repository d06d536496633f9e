#include "fitters/step/input_noise.h"

#include <ceres/jet.h>

#include <random>
#include <string>
#include <vector>

#include "fitters/core/added_covariance.h"
#include "fitters/core/ar1_noise.h"

namespace coilspin::step {
namespace {

constexpr int kMaxParameters = 11;  // R, L, Ke, Kt, J, B, Tc, Vb, i0, ω0, θ0
using Jet = ceres::Jet<double, kMaxParameters>;
// The probes' generator seed: fixed, so the result is reproducible (style.md habit 13).
constexpr std::uint64_t kProbeSeed = 20261202;

std::vector<double> Evaluate(const StepResidual& r, const std::vector<double>& values) {
  std::vector<const double*> pointers;
  for (const double& v : values) pointers.push_back(&v);
  std::vector<double> out(r.time_s->size());
  r(pointers.data(), out.data());
  return out;
}

Eigen::MatrixXd Jacobian(const StepResidual& r, const std::vector<double>& values) {
  std::vector<Jet> p(values.size());
  std::vector<const Jet*> pointers;
  for (std::size_t j = 0; j < values.size(); ++j) {
    p[j] = Jet(values[j], static_cast<int>(j));
    pointers.push_back(&p[j]);
  }
  std::vector<Jet> out(r.time_s->size());
  r(pointers.data(), out.data());
  Eigen::MatrixXd jacobian(static_cast<Eigen::Index>(out.size()), static_cast<Eigen::Index>(values.size()));
  for (std::size_t k = 0; k < out.size(); ++k)
    for (std::size_t j = 0; j < values.size(); ++j)
      jacobian(static_cast<Eigen::Index>(k), static_cast<Eigen::Index>(j)) = out[k].v[static_cast<Eigen::Index>(j)];
  return jacobian;
}

struct Channel {
  StepResidual residual;
  std::vector<int> index;  // global parameter indices, in the functor's order
  std::vector<double> values;
  Eigen::MatrixXd jacobian;
  std::vector<double> at_solution;
  double sigma = 1.0;
};

}  // namespace

void AddStepVoltageNoiseCovariance(const StepTestPlan& plan, core::FitResult* fit) {
  if (!fit->usable) return;
  const Eigen::Index p = fit->covariance.rows();
  Eigen::MatrixXd extra = Eigen::MatrixXd::Zero(p, p);
  std::mt19937_64 generator(kProbeSeed);
  for (const StepLog& log : plan.logs) {
    const core::NoiseLevel noise{log.voltage_noise_V, log.voltage_noise_lag1};
    if (!(noise.sigma > 0.0)) continue;
    std::vector<Channel> channels;
    channels.push_back({log.Residual(StepChannel::kCurrent), log.current_parameters, {}, {}, {},
                        fit->groups[log.current_group].sigma});
    channels.push_back({log.Residual(log.MotionChannel()), log.motion_parameters, {}, {}, {},
                        fit->groups[log.motion_group].sigma});
    for (Channel& ch : channels) {
      for (int index : ch.index) ch.values.push_back(fit->parameters[static_cast<std::size_t>(index)].value);
      ch.jacobian = Jacobian(ch.residual, ch.values);
      ch.at_solution = Evaluate(ch.residual, ch.values);
    }
    // E[g·gᵀ] over the probes; g in the global parameter layout.
    const std::vector<double>& voltage = log.log->voltage_V;
    Eigen::MatrixXd moment = Eigen::MatrixXd::Zero(p, p);
    std::vector<double> drawn(voltage.size()), perturbed(voltage.size());
    for (int probe = 0; probe < kInputNoiseProbes; ++probe) {
      core::DrawAr1(generator, noise, &drawn);  // the channel's coloured noise (core/ar1_noise.h)
      for (std::size_t k = 0; k < voltage.size(); ++k) perturbed[k] = voltage[k] + drawn[k];
      Eigen::VectorXd g = Eigen::VectorXd::Zero(p);
      for (Channel& ch : channels) {
        StepResidual moved = ch.residual;
        moved.voltage_V = &perturbed;
        const std::vector<double> r = Evaluate(moved, ch.values);
        Eigen::VectorXd change(static_cast<Eigen::Index>(r.size()));  // δr = −δŷ
        for (std::size_t k = 0; k < r.size(); ++k) change(static_cast<Eigen::Index>(k)) = r[k] - ch.at_solution[k];
        const Eigen::VectorXd local = ch.jacobian.transpose() * change / (ch.sigma * ch.sigma);
        for (std::size_t j = 0; j < ch.index.size(); ++j)
          if (!fit->parameters[static_cast<std::size_t>(ch.index[j])].fixed) g(ch.index[j]) += local(static_cast<Eigen::Index>(j));
      }
      moment += g * g.transpose();
    }
    moment /= static_cast<double>(kInputNoiseProbes);
    extra += fit->inverse_information * moment * fit->inverse_information;  // C·E[g·gᵀ]·C
  }
  core::AddCovariance(extra, fit);
}

}  // namespace coilspin::step

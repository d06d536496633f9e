#include "fitters/core/counted_noise.h"

namespace coilspin::core {

CountedNoise CountedNoiseOf(const GroupSpec& spec, double sigma, const std::vector<double>& values,
                            const Eigen::MatrixXd& jacobian, int max_lag) {
  CountedNoise out;
  const Eigen::Index n = jacobian.rows();
  if (n == 0) return out;
  if (spec.input_noise) {
    out.explained = spec.input_noise(values, max_lag);
    for (double& sum : out.explained) sum /= sigma * sigma;  // a_m/σ_g²
  }
  if (spec.quantisation_step > 0.0 && spec.modelled_reading) {
    std::vector<Eigen::VectorXd> errors = QuantisationErrors(spec.modelled_reading(values), spec.quantisation_step);
    if (errors.empty() || errors.front().size() != n) return out;
    out.moment = Eigen::MatrixXd::Zero(jacobian.cols(), jacobian.cols());
    for (Eigen::VectorXd& e : errors) {
      e /= sigma;                                                  // z = e/σ_g
      const Eigen::VectorXd gradient = jacobian.transpose() * e;  // g = J_gᵀ·z
      out.moment += gradient * gradient.transpose();
    }
    out.moment /= static_cast<double>(errors.size());
    const LaggedSums quantisation = MeanLaggedSums(errors, max_lag);  // b_m/σ_g²
    if (out.explained.size() < quantisation.size()) out.explained.resize(quantisation.size(), 0.0);
    for (std::size_t m = 0; m < quantisation.size(); ++m) out.explained[m] += quantisation[m];
  }
  return out;
}

}  // namespace coilspin::core

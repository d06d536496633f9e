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
    const std::vector<double> modelled = spec.modelled_reading(values);
    if (static_cast<Eigen::Index>(modelled.size()) != n) return out;
    Eigen::MatrixXd moment = Eigen::MatrixXd::Zero(jacobian.cols(), jacobian.cols());
    LaggedSums quantisation;
    const int phases = VisitQuantisationErrors(modelled, spec.quantisation_step, [&](const Eigen::VectorXd& error) {
      const Eigen::VectorXd z = error / sigma;                     // z = e/σ_g
      const Eigen::VectorXd gradient = jacobian.transpose() * z;  // g = J_gᵀ·z
      moment += gradient * gradient.transpose();
      AddLaggedSums(z, max_lag, &quantisation);
    });
    if (phases == 0) return out;
    out.moment = moment / static_cast<double>(phases);
    if (out.explained.size() < quantisation.size()) out.explained.resize(quantisation.size(), 0.0);
    for (std::size_t m = 0; m < quantisation.size(); ++m)
      out.explained[m] += quantisation[m] / static_cast<double>(phases);  // b_m/σ_g²
  }
  return out;
}

}  // namespace coilspin::core

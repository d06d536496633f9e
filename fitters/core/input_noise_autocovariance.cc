#include "fitters/core/input_noise_autocovariance.h"

#include <algorithm>
#include <random>

namespace coilspin::core {

LaggedSums ProbeInputNoise(const ResidualsForInput& residuals, const std::vector<double>& input,
                           const NoiseLevel& noise, int max_lag) {
  if (!(noise.sigma > 0.0) || max_lag < 0) return {};
  std::vector<double> at_input;
  if (!residuals(input, &at_input)) return {};
  const std::size_t n = at_input.size();
  std::mt19937_64 generator(kInputNoiseAutocovarianceSeed);
  std::vector<double> drawn(input.size()), moved(input.size());
  std::vector<double> at_moved;
  Eigen::VectorXd change(static_cast<Eigen::Index>(n));
  LaggedSums sums;
  for (int probe = 0; probe < kInputNoiseAutocovarianceProbes; ++probe) {
    DrawAr1(generator, noise, &drawn);
    for (std::size_t k = 0; k < input.size(); ++k) moved[k] = input[k] + drawn[k];
    if (!residuals(moved, &at_moved) || at_moved.size() != n) return {};
    for (std::size_t k = 0; k < n; ++k) change(static_cast<Eigen::Index>(k)) = at_moved[k] - at_input[k];  // u = r(v + δv) − r(v)
    AddLaggedSums(change, max_lag, &sums);
  }
  for (double& sum : sums) sum /= static_cast<double>(kInputNoiseAutocovarianceProbes);  // a_m, the mean over probes
  return sums;
}

}  // namespace coilspin::core

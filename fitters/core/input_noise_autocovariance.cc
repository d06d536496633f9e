#include "fitters/core/input_noise_autocovariance.h"

#include <algorithm>
#include <random>

namespace coilspin::core {

LaggedSums ProbeInputNoise(const ResidualsForInput& residuals, const std::vector<double>& input,
                           double sigma_input, int max_lag) {
  if (!(sigma_input > 0.0) || max_lag < 0) return {};
  std::vector<double> at_input;
  if (!residuals(input, &at_input)) return {};
  const std::size_t n = at_input.size();
  const std::size_t lags = std::min(static_cast<std::size_t>(max_lag) + 1, n);
  LaggedSums sums(lags, 0.0);
  std::mt19937_64 generator(kInputNoiseAutocovarianceSeed);
  std::normal_distribution<double> normal(0.0, 1.0);
  std::vector<double> moved(input.size());
  std::vector<double> at_moved;
  std::vector<double> change(n);
  for (int probe = 0; probe < kInputNoiseAutocovarianceProbes; ++probe) {
    for (std::size_t k = 0; k < input.size(); ++k) moved[k] = input[k] + sigma_input * normal(generator);
    if (!residuals(moved, &at_moved) || at_moved.size() != n) return {};
    for (std::size_t k = 0; k < n; ++k) change[k] = at_moved[k] - at_input[k];  // u = r(v + δv) − r(v)
    for (std::size_t m = 0; m < lags; ++m) {
      double sum = 0.0;
      for (std::size_t k = 0; k + m < n; ++k) sum += change[k] * change[k + m];  // Σ_k u_k·u_{k+m}
      sums[m] += sum;
    }
  }
  for (double& s : sums) s /= static_cast<double>(kInputNoiseAutocovarianceProbes);
  return sums;
}

}  // namespace coilspin::core

#include "fitters/core/input_noise_autocovariance.h"

#include <algorithm>
#include <random>

namespace coilspin::core {

LaggedSums MeanLaggedSums(const std::vector<Eigen::VectorXd>& realisations, int max_lag) {
  if (realisations.empty() || max_lag < 0) return {};
  const Eigen::Index n = realisations.front().size();
  const Eigen::Index lags = std::min<Eigen::Index>(max_lag + 1, n);
  LaggedSums sums(static_cast<std::size_t>(lags), 0.0);
  for (const Eigen::VectorXd& u : realisations)
    for (Eigen::Index m = 0; m < lags; ++m) sums[static_cast<std::size_t>(m)] += u.head(n - m).dot(u.tail(n - m));  // Σ_k u_k·u_{k+m}
  for (double& s : sums) s /= static_cast<double>(realisations.size());
  return sums;
}

LaggedSums ProbeInputNoise(const ResidualsForInput& residuals, const std::vector<double>& input,
                           double sigma_input, int max_lag) {
  if (!(sigma_input > 0.0) || max_lag < 0) return {};
  std::vector<double> at_input;
  if (!residuals(input, &at_input)) return {};
  const std::size_t n = at_input.size();
  std::mt19937_64 generator(kInputNoiseAutocovarianceSeed);
  std::normal_distribution<double> normal(0.0, 1.0);
  std::vector<double> moved(input.size());
  std::vector<double> at_moved;
  std::vector<Eigen::VectorXd> changes;
  for (int probe = 0; probe < kInputNoiseAutocovarianceProbes; ++probe) {
    for (std::size_t k = 0; k < input.size(); ++k) moved[k] = input[k] + sigma_input * normal(generator);
    if (!residuals(moved, &at_moved) || at_moved.size() != n) return {};
    Eigen::VectorXd change(static_cast<Eigen::Index>(n));
    for (std::size_t k = 0; k < n; ++k) change(static_cast<Eigen::Index>(k)) = at_moved[k] - at_input[k];  // u = r(v + δv) − r(v)
    changes.push_back(std::move(change));
  }
  return MeanLaggedSums(changes, max_lag);
}

}  // namespace coilspin::core

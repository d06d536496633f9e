#include "fitters/core/autocorrelation_widening.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace coilspin::core {

IntegratedTime GeyerIntegratedTime(const LaggedSums& sums, const LaggedSums& explained, double num_samples) {
  IntegratedTime out;
  if (sums.empty()) return out;
  const auto own = [&](std::size_t lag) {  // c_m − a_m
    return sums[lag] - (lag < explained.size() ? explained[lag] : 0.0);
  };
  const double variance = own(0);
  if (!(variance > 0.0) || !(sums[0] > 0.0)) return out;
  const double n = num_samples > 0.0 ? num_samples : static_cast<double>(sums.size());
  // Bartlett's standard error of ρ̂_m of the whole series, scaled to the own part.
  const double scale = sums[0] / variance;
  double bartlett = 1.0;  // 1 + 2·Σ_{k<m} ρ_k² of the whole series
  // Γ_m = ρ_{2m} + ρ_{2m+1}, summed while above its noise, made monotone; τ = −1 + 2·Σ Γ_m.
  double sum = 0.0;
  double previous = std::numeric_limits<double>::infinity();
  std::size_t pairs = 0;
  for (std::size_t m = 0; 2 * m + 1 < sums.size(); ++m) {
    double pair = (own(2 * m) + own(2 * m + 1)) / variance;
    if (m > 0) {
      const double pair_error = kPairStandardErrorsPerLag * scale * std::sqrt(bartlett / n);
      if (!(pair > kGeyerStopStandardErrors * pair_error)) break;
    }
    for (std::size_t lag : {2 * m, 2 * m + 1}) {
      const double rho = sums[lag] / sums[0];
      if (lag > 0) bartlett += 2.0 * rho * rho;
    }
    pair = std::min(pair, previous);
    sum += pair;
    previous = pair;
    ++pairs;
  }
  out.tau = std::max(1.0, -1.0 + 2.0 * sum);
  out.lags = static_cast<int>(2 * pairs - 1);
  return out;
}

double IntegratedAutocorrelationTime(const Eigen::VectorXd& residuals) {
  const Eigen::Index n = residuals.size();
  if (n < 2) return 1.0;
  const Eigen::VectorXd centred = residuals.array() - residuals.mean();
  return GeyerIntegratedTime(LaggedProducts(centred, static_cast<int>(n - 1)), {}, static_cast<double>(n)).tau;
}

AutocorrelationWidening DecideWidening(const Eigen::VectorXd& residuals, const LaggedSums& explained) {
  const Eigen::Index n = residuals.size();
  AutocorrelationWidening out;
  out.effective_num_residuals = static_cast<double>(n);
  if (n < kMinResidualsForWidening) return out;
  const Eigen::VectorXd centred = residuals.array() - residuals.mean();
  const LaggedSums sums = LaggedProducts(centred, static_cast<int>(n - 1));
  IntegratedTime time = GeyerIntegratedTime(sums, explained, static_cast<double>(n));
  // The AR(1) factor of the own lag-1 correlation, ρ_1 = (c_1 − a_1)/(c_0 − a_0): for noise that is
  // close to AR(1) it is the steadier estimate of τ (one lag, not a sum of many noisy ones).
  const auto own = [&](std::size_t lag) { return sums[lag] - (lag < explained.size() ? explained[lag] : 0.0); };
  if (sums.size() > 1 && own(0) > 0.0) {
    const double rho = own(1) / own(0);
    if (rho > 0.0 && rho < 1.0) time.tau = std::max(time.tau, (1.0 + rho) / (1.0 - rho));
  }
  out.integrated_time = time.tau;
  out.lags = time.lags;
  // Twice the standard error of τ̂ for white noise, √(2(2L+1)/n) (Madras & Sokal 1988, from memory).
  const double threshold =
      std::max(kMinimumWidening,
               kWideningStandardErrors * std::sqrt(2.0 * (2.0 * time.lags + 1.0) / static_cast<double>(n)));
  if (!(time.tau - 1.0 > threshold)) return out;
  out.widened = true;
  out.inflation = time.tau;
  out.effective_num_residuals = static_cast<double>(n) / time.tau;
  return out;
}

}  // namespace coilspin::core

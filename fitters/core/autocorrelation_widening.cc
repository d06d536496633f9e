#include "fitters/core/autocorrelation_widening.h"

#include <algorithm>
#include <cmath>
#include <functional>

namespace coilspin::core {
namespace {

// τ_int = 1 + 2·Σ_{k=1}^{M} ρ_k with Sokal's window, for ρ given lag by lag (≥ 1).
double IntegratedTime(const std::function<double(Eigen::Index)>& rho, Eigen::Index n) {
  double tau = 1.0;
  for (Eigen::Index lag = 1; lag < n / 2; ++lag) {
    tau += 2.0 * rho(lag);
    if (static_cast<double>(lag) >= kSokalWindow * tau) break;
  }
  return std::max(tau, 1.0);
}

}  // namespace

AutocorrelationWidening DecideWidening(int num_residuals, double lag1) {
  AutocorrelationWidening out;
  out.effective_num_residuals = num_residuals;
  if (num_residuals < kMinResidualsForWidening || !std::isfinite(lag1)) return out;
  const double threshold =
      std::max(kMinimumWidenedAutocorrelation, kWideningStandardErrors / std::sqrt(static_cast<double>(num_residuals)));
  // The sample autocorrelation is below cos(π/(n+1)) < 1, so f stays finite.
  if (!(lag1 > threshold) || lag1 >= 1.0) return out;
  out.widened = true;
  out.inflation = (1.0 + lag1) / (1.0 - lag1);
  out.effective_num_residuals = num_residuals / out.inflation;
  return out;
}

double IntegratedAutocorrelationTime(const Eigen::VectorXd& residuals) {
  const Eigen::Index n = residuals.size();
  if (n < 2) return 1.0;
  const Eigen::VectorXd centred = residuals.array() - residuals.mean();
  const double variance = centred.squaredNorm();
  if (!(variance > 0.0)) return 1.0;
  return IntegratedTime(
      [&](Eigen::Index lag) { return centred.head(n - lag).dot(centred.tail(n - lag)) / variance; }, n);  // ρ̂_k
}

AutocorrelationWidening DecideWidening(const Eigen::VectorXd& residuals, const LaggedSums& explained,
                                       bool quantised) {
  const Eigen::Index n = residuals.size();
  AutocorrelationWidening out;
  out.effective_num_residuals = static_cast<double>(n);
  if (n < 2) return out;
  const Eigen::VectorXd centred = residuals.array() - residuals.mean();
  const auto explained_at = [&](Eigen::Index lag) {
    return static_cast<std::size_t>(lag) < explained.size() ? explained[static_cast<std::size_t>(lag)] : 0.0;
  };
  const double own_variance = centred.squaredNorm() - explained_at(0);  // c_0 − a_0
  if (!(own_variance > 0.0)) return out;
  // ρ_m = (c_m − a_m)/(c_0 − a_0)
  const auto rho = [&](Eigen::Index lag) {
    return (centred.head(n - lag).dot(centred.tail(n - lag)) - explained_at(lag)) / own_variance;
  };
  out = DecideWidening(static_cast<int>(n), rho(1));
  if (!out.widened || !quantised) return out;
  out.inflation = std::max(out.inflation, IntegratedTime(rho, n));
  out.effective_num_residuals = static_cast<double>(n) / out.inflation;
  return out;
}

}  // namespace coilspin::core

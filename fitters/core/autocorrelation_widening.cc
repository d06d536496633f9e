#include "fitters/core/autocorrelation_widening.h"

#include <algorithm>
#include <cmath>

#include "fitters/core/residual_statistics.h"

namespace coilspin::core {

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
  double tau = 1.0;
  for (Eigen::Index lag = 1; lag < n / 2; ++lag) {
    const double rho = centred.head(n - lag).dot(centred.tail(n - lag)) / variance;  // ρ̂_k
    tau += 2.0 * rho;
    if (static_cast<double>(lag) >= kSokalWindow * tau) break;
  }
  return std::max(tau, 1.0);
}

AutocorrelationWidening DecideWidening(const Eigen::VectorXd& residuals) {
  AutocorrelationWidening out = DecideWidening(static_cast<int>(residuals.size()), Lag1Autocorrelation(residuals));
  if (!out.widened) return out;
  out.inflation = std::max(out.inflation, IntegratedAutocorrelationTime(residuals));
  out.effective_num_residuals = residuals.size() / out.inflation;
  return out;
}

}  // namespace coilspin::core

#include "fitters/core/autocorrelation_widening.h"

#include <algorithm>
#include <cmath>

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

}  // namespace coilspin::core

#include "fitters/core/added_covariance.h"

#include <cmath>
#include <limits>

namespace coilspin::core {

void SetCovariance(const Eigen::MatrixXd& covariance, FitResult* fit) {
  fit->covariance = covariance;
  const Eigen::Index p = covariance.rows();
  for (Eigen::Index a = 0; a < p; ++a)
    for (Eigen::Index b = 0; b < p; ++b) {
      const double scale = std::sqrt(covariance(a, a) * covariance(b, b));
      fit->correlation(a, b) = scale > 0.0 ? covariance(a, b) / scale : 0.0;
    }
}

void AddCovariance(const Eigen::MatrixXd& extra, FitResult* fit) {
  SetCovariance(fit->covariance + extra, fit);
  const Eigen::Index p = fit->covariance.rows();
  for (Eigen::Index j = 0; j < p; ++j) {
    ParameterEstimate& e = fit->parameters[static_cast<std::size_t>(j)];
    if (e.fixed || !std::isfinite(e.std_error)) continue;
    // t at the same degrees of freedom: from the interval, or (an output-noise term of 0,
    // all of the residual explained by the counted noise) from ν itself, normal when none.
    const double quantile = e.std_error > 0.0 ? (e.ci_high - e.value) / e.std_error
                                              : StudentTQuantile(0.5 * (1.0 + fit->confidence),
                                                                 std::isfinite(e.degrees_of_freedom) && e.degrees_of_freedom > 0.0
                                                                     ? e.degrees_of_freedom
                                                                     : std::numeric_limits<double>::infinity());
    e.std_error = std::sqrt(fit->covariance(j, j));
    e.ci_low = e.value - quantile * e.std_error;
    e.ci_high = e.value + quantile * e.std_error;
  }
}

}  // namespace coilspin::core

#include "fitters/core/residual_statistics.h"

#include <algorithm>
#include <cmath>
#include <vector>

namespace coilspin::core {

double RootMeanSquare(const Eigen::VectorXd& residuals) {
  if (residuals.size() == 0) return 0.0;
  return std::sqrt(residuals.squaredNorm() / static_cast<double>(residuals.size()));
}

double Lag1Autocorrelation(const Eigen::VectorXd& residuals) {
  const Eigen::Index n = residuals.size();
  if (n < 2) return 0.0;
  const Eigen::VectorXd centred = residuals.array() - residuals.mean();
  const double spread = centred.squaredNorm();
  if (spread == 0.0) return 0.0;
  const double lagged = centred.head(n - 1).dot(centred.tail(n - 1));
  return lagged / spread;
}

namespace {

// The median of `values` (reordered); the mean of the two middle ones for an even count.
double Median(std::vector<double>& values) {
  const std::size_t middle = values.size() / 2;
  std::nth_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(middle), values.end());
  const double upper = values[middle];
  if (values.size() % 2 == 1) return upper;
  const double lower = *std::max_element(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(middle));
  return 0.5 * (lower + upper);
}

}  // namespace

double MedianAbsoluteDeviationScale(const Eigen::VectorXd& residuals) {
  if (residuals.size() == 0) return 0.0;
  std::vector<double> values(residuals.data(), residuals.data() + residuals.size());
  const double centre = Median(values);
  for (double& value : values) value = std::abs(value - centre);
  return kMadToSigma * Median(values);
}

}  // namespace coilspin::core

#include "fitters/core/residual_statistics.h"

#include <cmath>

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

}  // namespace coilspin::core

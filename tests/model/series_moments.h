#pragma once
// Test helper: the sample mean, standard deviation and lag-1 autocorrelation
// of a series, the statistics the noise tests compare with their definitions.

#include <cmath>
#include <cstddef>
#include <vector>

namespace coilspin::model {

struct Moments {
  double mean = 0.0;
  double std_dev = 0.0;  // with n − 1
  double lag1 = 0.0;     // r1 = Σ(x_k − x̄)(x_(k−1) − x̄)/Σ(x_k − x̄)²
};

inline Moments MomentsOf(const std::vector<double>& x) {
  const double n = static_cast<double>(x.size());
  Moments m;
  for (double v : x) m.mean += v / n;
  double sum_squares = 0.0, sum_lag = 0.0;
  for (std::size_t k = 0; k < x.size(); ++k) {
    sum_squares += (x[k] - m.mean) * (x[k] - m.mean);
    if (k > 0) sum_lag += (x[k] - m.mean) * (x[k - 1] - m.mean);
  }
  m.std_dev = std::sqrt(sum_squares / (n - 1.0));
  m.lag1 = sum_lag / sum_squares;
  return m;
}

}  // namespace coilspin::model

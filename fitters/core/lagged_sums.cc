#include "fitters/core/lagged_sums.h"

#include <algorithm>
#include <complex>
#include <unsupported/Eigen/FFT>

namespace coilspin::core {
namespace {

// The smallest power of two at or above `n`: the transform's fastest size.
Eigen::Index PowerOfTwoAtLeast(Eigen::Index n) {
  Eigen::Index size = 1;
  while (size < n) size *= 2;
  return size;
}

}  // namespace

LaggedSums LaggedProducts(const Eigen::VectorXd& x, int max_lag) {
  const Eigen::Index n = x.size();
  if (n == 0 || max_lag < 0) return {};
  const Eigen::Index lags = std::min<Eigen::Index>(static_cast<Eigen::Index>(max_lag) + 1, n);
  LaggedSums sums(static_cast<std::size_t>(lags), 0.0);
  if (lags <= kDirectLagLimit) {
    for (Eigen::Index m = 0; m < lags; ++m) sums[static_cast<std::size_t>(m)] = x.head(n - m).dot(x.tail(n - m));
    return sums;
  }
  // c = F⁻¹(|F(x̃)|²), x̃ = x padded with zeros to a length of at least 2n.
  const Eigen::Index size = PowerOfTwoAtLeast(2 * n);
  std::vector<double> padded(static_cast<std::size_t>(size), 0.0);
  std::copy(x.data(), x.data() + n, padded.begin());
  Eigen::FFT<double> fft;
  std::vector<std::complex<double>> spectrum;
  fft.fwd(spectrum, padded);
  for (auto& value : spectrum) value = std::norm(value);  // |X|²
  std::vector<double> correlation;
  fft.inv(correlation, spectrum);  // scaled by 1/size: the plain inverse transform
  std::copy(correlation.begin(), correlation.begin() + lags, sums.begin());
  return sums;
}

void AddLaggedSums(const Eigen::VectorXd& x, int max_lag, LaggedSums* sums) {
  const LaggedSums these = LaggedProducts(x, max_lag);
  if (sums->empty()) sums->assign(these.size(), 0.0);
  for (std::size_t m = 0; m < std::min(these.size(), sums->size()); ++m) (*sums)[m] += these[m];
}

}  // namespace coilspin::core

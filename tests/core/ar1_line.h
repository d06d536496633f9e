#pragma once
// Test helpers: a straight line y = a + b·x sampled at x_k = k/(n − 1) with
// first-order autoregressive noise e_k = φ·e_{k−1} + w_k, w_k ~ N(0, σ_w²),
// started from its stationary distribution e_0 ~ N(0, σ_w²/(1 − φ²)) (Box &
// Jenkins §3.2.4), and the exact sampling SD of the least-squares slope under
// that noise, from Var(b̂) = cᵀ·Σ·c with c_k = (x_k − x̄)/Sxx and
// Σ_ij = σ_w²·φ^|i−j|/(1 − φ²) (the definition of the estimator; Draper & Smith §1.2).

#include <cmath>
#include <random>
#include <vector>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core::test_support {

// The line the interval tests simulate: y = 2 + 0.5·x with innovations of σ_w = 0.1
// (invented numbers; any would do).
inline constexpr double kLineIntercept = 2.0;
inline constexpr double kLineSlope = 0.5;
inline constexpr double kInnovationSigma = 0.1;

struct SampledLine {
  std::vector<double> x;
  std::vector<double> y;
};

inline SampledLine MakeAr1Line(int n, double a, double b, double innovation_sigma, double phi, unsigned seed) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> innovation(0.0, innovation_sigma);
  SampledLine line;
  double e = innovation(generator) / std::sqrt(1.0 - phi * phi);
  for (int k = 0; k < n; ++k) {
    if (k > 0) e = phi * e + innovation(generator);
    const double x = static_cast<double>(k) / (n - 1);
    line.x.push_back(x);
    line.y.push_back(a + b * x + e);
  }
  return line;
}

inline double Ar1SlopeStandardDeviation(int n, double innovation_sigma, double phi) {
  double x_mean = 0.0;
  for (int k = 0; k < n; ++k) x_mean += static_cast<double>(k) / (n - 1) / n;
  double sxx = 0.0;
  std::vector<double> c(static_cast<std::size_t>(n));
  for (int k = 0; k < n; ++k) {
    const double dx = static_cast<double>(k) / (n - 1) - x_mean;
    c[static_cast<std::size_t>(k)] = dx;
    sxx += dx * dx;
  }
  const double marginal = innovation_sigma * innovation_sigma / (1.0 - phi * phi);
  double variance = 0.0;
  for (int i = 0; i < n; ++i) {
    for (int j = 0; j < n; ++j) {
      variance += c[static_cast<std::size_t>(i)] * c[static_cast<std::size_t>(j)] * marginal *
                  std::pow(phi, std::abs(i - j));
    }
  }
  return std::sqrt(variance) / sxx;
}

// The whole series as one block, as motor fitters add a time series:
// y_k = a + b·x_k; r_k = y_k − (a + b·x_k)
struct LineSeriesResidual {
  std::vector<double> x;
  std::vector<double> y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    for (std::size_t k = 0; k < x.size(); ++k) r[k] = y[k] - (*p[0] + *p[1] * x[k]);
    return true;
  }
};

// The line as one group "line" (one block), parameters "intercept", "slope".
struct LineFit {
  LeastSquaresProblem problem;
  int intercept = -1, slope = -1, group = -1;
};

inline void BuildLine(LineFit* fit, const SampledLine& line, double sigma = 1.0) {
  fit->intercept = fit->problem.AddParameter(Start("intercept", 1.0));
  fit->slope = fit->problem.AddParameter(Start("slope", 1.0));
  fit->group = fit->problem.AddGroup({"line", sigma});
  fit->problem.AddResiduals(fit->group, {fit->intercept, fit->slope}, static_cast<int>(line.x.size()),
                            LineSeriesResidual{line.x, line.y});
}

}  // namespace coilspin::core::test_support

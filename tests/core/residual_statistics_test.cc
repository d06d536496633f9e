// Lag-1 autocorrelation and RMS of residuals: the sample autocorrelation at lag 1
// (Box & Jenkins, Time Series Analysis, §2.1) of known sequences.

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"
#include "fitters/core/residual_statistics.h"

namespace coilspin::core {
namespace {

using test_support::Start;

// y = c; r = y − c
struct Level {
  double y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    r[0] = y - *p[0];
    return true;
  }
};

TEST(Lag1Autocorrelation, AlternatingSequenceHasTheExactValue) {
  // physics (from the definition): e_k = (−1)^k, n even, has mean 0,
  // Σ e_k·e_{k+1} = −(n − 1) and Σ e_k² = n, so r_1 = −(n − 1)/n.
  constexpr int kCount = 10;
  Eigen::VectorXd e(kCount);
  for (int k = 0; k < kCount; ++k) e(k) = k % 2 == 0 ? 1.0 : -1.0;
  EXPECT_NEAR(Lag1Autocorrelation(e), -(kCount - 1.0) / kCount, 1e-15);
  EXPECT_NEAR(RootMeanSquare(e), 1.0, 1e-15);
}

TEST(Lag1Autocorrelation, DegenerateSequencesGiveZero) {
  EXPECT_EQ(Lag1Autocorrelation(Eigen::VectorXd::Constant(5, 2.0)), 0.0);  // no spread
  EXPECT_EQ(Lag1Autocorrelation(Eigen::VectorXd::Constant(1, 2.0)), 0.0);  // one value
  EXPECT_EQ(RootMeanSquare(Eigen::VectorXd()), 0.0);
}

TEST(Lag1Autocorrelation, FirstOrderAutoregressionIsRecoveredThroughAFit) {
  // e_k = φ·e_{k−1} + w_k has lag-1 autocorrelation φ (Box & Jenkins §3.2.4); the
  // sample value has standard error ≈ sqrt((1 − φ²)/n) = 0.0051 for n = 20000.
  constexpr double kPhi = 0.7;
  constexpr int kCount = 20000;
  constexpr double kTolerance = 0.02;  // about 4 standard errors
  std::mt19937 generator(7);
  std::normal_distribution<double> white(0.0, 1.0);
  LeastSquaresProblem problem;
  const int level = problem.AddParameter(Start("level", 1.0));
  const int group = problem.AddGroup({"drifting signal", 1.0});
  double e = 0.0;
  for (int k = 0; k < kCount; ++k) {
    e = kPhi * e + white(generator);
    problem.AddResiduals(group, {level}, 1, Level{5.0 + e});
  }
  const FitResult fit = problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_NEAR(fit.groups[0].lag1_autocorrelation, kPhi, kTolerance);
}

TEST(GroupStatistics, RmsIsOfTheUnweightedResiduals) {
  // Residuals ±1 around a level of 0 (alternating data 3 ± 1 around 3), weighted by σ = 2:
  // the unweighted RMS is 1 and the weighted residual variance is Σ(1/2)²/(n − 1).
  constexpr int kCount = 8;
  LeastSquaresProblem problem;
  const int level = problem.AddParameter(Start("level", 1.0));
  const int group = problem.AddGroup({"square wave", 2.0});
  for (int k = 0; k < kCount; ++k) problem.AddResiduals(group, {level}, 1, Level{k % 2 == 0 ? 4.0 : 2.0});
  const FitResult fit = problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_NEAR(fit.Get("level").value, 3.0, 1e-12);
  EXPECT_NEAR(fit.groups[0].rms, 1.0, 1e-12);
  EXPECT_NEAR(fit.groups[0].residual_variance, kCount * 0.25 / (kCount - 1.0), 1e-12);
  EXPECT_NEAR(fit.groups[0].lag1_autocorrelation, -(kCount - 1.0) / kCount, 1e-12);
}

}  // namespace
}  // namespace coilspin::core

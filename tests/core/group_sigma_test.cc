// Several groups with different noise levels: σ re-estimation, the per-group
// residual degrees of freedom and the Welch–Satterthwaite degrees of freedom
// of least_squares.h. The data are simulated with fixed seeds from known σ.

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::Start;

using test_support::LineResidual;

// z = c; r = z − c
struct LevelResidual {
  double z;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    r[0] = z - *p[0];
    return true;
  }
};

constexpr double kTrueIntercept = 1.0;
constexpr double kTrueSlope = 2.0;

// Adds n samples of the line on x = 0 … 1 with noise σ to `group`.
void AddSensor(LeastSquaresProblem* problem, int group, int a, int b, int n, double sigma, unsigned seed) {
  std::mt19937 generator(seed);
  std::normal_distribution<double> noise(0.0, sigma);
  for (int k = 0; k < n; ++k) {
    const double x = static_cast<double>(k) / (n - 1);
    problem->AddResiduals(group, {a, b}, 1, LineResidual{x, kTrueIntercept + kTrueSlope * x + noise(generator)});
  }
}

TEST(GroupSigmas, ReestimationRecoversTheTrueNoiseRatio) {
  // Two sensors of one line, σ = 0.05 and 0.5, 3000 samples each on the same x grid,
  // both starting from σ_g = 1. An estimated σ from d degrees of freedom has a relative
  // standard error of about 1/sqrt(2d) = 1.3 % (chi-square, handbook); 4 % is 3 of them.
  constexpr int kSamples = 3000;
  constexpr double kSigmaA = 0.05, kSigmaB = 0.5;
  constexpr double kSigmaTolerance = 0.04, kRatioTolerance = 0.05;
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("intercept", 0.5));
  const int b = problem.AddParameter(Start("slope", 1.0));
  const int precise = problem.AddGroup({"precise sensor", 1.0});
  const int coarse = problem.AddGroup({"coarse sensor", 1.0});
  AddSensor(&problem, precise, a, b, kSamples, kSigmaA, 21);
  AddSensor(&problem, coarse, a, b, kSamples, kSigmaB, 22);
  SolveOptions options;
  options.estimate_group_sigmas = true;
  const FitResult fit = problem.Solve(options);
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_EQ(fit.num_solves, 1 + options.group_sigma_rounds);

  const GroupStatistics& first = fit.groups[static_cast<std::size_t>(precise)];
  const GroupStatistics& second = fit.groups[static_cast<std::size_t>(coarse)];
  EXPECT_NEAR(first.sigma / kSigmaA, 1.0, kSigmaTolerance);
  EXPECT_NEAR(second.sigma / kSigmaB, 1.0, kSigmaTolerance);
  EXPECT_NEAR((second.sigma / first.sigma) / (kSigmaB / kSigmaA), 1.0, kRatioTolerance);
  // After re-estimation each group's residual variance is 1 (to the last round's change).
  EXPECT_NEAR(first.residual_variance, 1.0, 1e-3);
  EXPECT_NEAR(second.residual_variance, 1.0, 1e-3);
  // Σ_g h_g = trace(C·JᵀJ) = p (physics: trace of an identity, least_squares.h)
  EXPECT_NEAR(first.fitted_degrees_of_freedom + second.fitted_degrees_of_freedom, 2.0, 1e-9);

  // With the same design in both groups, J_gᵀJ_g = XᵀX/σ_g², so v_gj ∝ s_g²/σ_g² for
  // every parameter and the shares follow from the reported σ and s² (from the definitions).
  const double weight_a = first.residual_variance / (first.sigma * first.sigma);
  const double weight_b = second.residual_variance / (second.sigma * second.sigma);
  for (int j : {a, b}) {
    EXPECT_NEAR(first.information_share[static_cast<std::size_t>(j)], weight_a / (weight_a + weight_b), 1e-9);
    EXPECT_NEAR(first.information_share[static_cast<std::size_t>(j)] +
                    second.information_share[static_cast<std::size_t>(j)],
                1.0, 1e-12);
  }

  // Generalised least squares with the true σ (Aitken; handbook, e.g. Draper & Smith §9.2):
  // Var(b) = [(XᵀX)⁻¹]_bb / (1/σ_A² + 1/σ_B²). For x = k/(n−1): [(XᵀX)⁻¹]_bb = 1/Sxx.
  double x_mean = 0.0, sxx = 0.0;
  for (int k = 0; k < kSamples; ++k) x_mean += static_cast<double>(k) / (kSamples - 1) / kSamples;
  for (int k = 0; k < kSamples; ++k) {
    const double dx = static_cast<double>(k) / (kSamples - 1) - x_mean;
    sxx += dx * dx;
  }
  const double true_se = std::sqrt(1.0 / sxx / (1.0 / (kSigmaA * kSigmaA) + 1.0 / (kSigmaB * kSigmaB)));
  EXPECT_NEAR(fit.Get("slope").std_error / true_se, 1.0, kSigmaTolerance);
}

TEST(GroupSigmas, AGivenSigmaIsKeptAndCountedAsKnown) {
  // The coarse sensor's σ = 0.5 is given (GiveGroupSigma); the precise one's is
  // estimated. The given σ must survive the re-estimation rounds, and a parameter
  // seen only by the given group has the known-σ standard error of weighted least
  // squares, σ/√Sxx for the slope (Draper & Smith §1.4, §9.2), with no degrees of
  // freedom lost (normal quantile).
  constexpr int kSamples = 400;
  constexpr double kSigmaA = 0.05, kSigmaB = 0.5;
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("intercept", 0.5));
  const int b = problem.AddParameter(Start("slope", 1.0));
  const int c = problem.AddParameter(Start("other intercept", 0.5));
  const int d = problem.AddParameter(Start("other slope", 1.0));
  const int precise = problem.AddGroup({"precise sensor", 1.0});
  const int coarse = problem.AddGroup({"coarse sensor", 1.0});
  AddSensor(&problem, precise, a, b, kSamples, kSigmaA, 41);
  AddSensor(&problem, coarse, c, d, kSamples, kSigmaB, 42);
  problem.GiveGroupSigma(coarse, kSigmaB);
  SolveOptions options;
  options.estimate_group_sigmas = true;
  const FitResult fit = problem.Solve(options);
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_EQ(fit.groups[static_cast<std::size_t>(coarse)].sigma, kSigmaB);
  EXPECT_NEAR(fit.groups[static_cast<std::size_t>(precise)].sigma / kSigmaA, 1.0, 0.15);
  double x_mean = 0.0, sxx = 0.0;
  for (int k = 0; k < kSamples; ++k) x_mean += static_cast<double>(k) / (kSamples - 1) / kSamples;
  for (int k = 0; k < kSamples; ++k) {
    const double dx = static_cast<double>(k) / (kSamples - 1) - x_mean;
    sxx += dx * dx;
  }
  EXPECT_NEAR(fit.Get("other slope").std_error, kSigmaB / std::sqrt(sxx), 1e-9 * kSigmaB / std::sqrt(sxx));
  EXPECT_TRUE(std::isinf(fit.Get("other slope").degrees_of_freedom));
  EXPECT_NEAR(fit.Get("slope").degrees_of_freedom, kSamples - 2.0, 1e-6);
}

TEST(GroupSigmas, SatterthwaiteDegreesOfFreedomLieBetweenTheGroups) {
  // A few precise samples and many coarse ones with about equal information about the
  // line: Satterthwaite's ν lies between the smallest group's d_g and Σ_g d_g
  // (Satterthwaite 1946; follows from Cauchy–Schwarz), here far from both, and equals
  // 1/Σ_g(share_g²/d_g) (the definition in least_squares.h written with the shares).
  constexpr int kFew = 12, kMany = 1200;
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("intercept", 0.5));
  const int b = problem.AddParameter(Start("slope", 1.0));
  const int few = problem.AddGroup({"few precise", 1.0});
  const int many = problem.AddGroup({"many coarse", 1.0});
  AddSensor(&problem, few, a, b, kFew, 0.1, 31);
  AddSensor(&problem, many, a, b, kMany, 1.0, 32);
  SolveOptions options;
  options.estimate_group_sigmas = true;
  const FitResult fit = problem.Solve(options);
  ASSERT_TRUE(fit.usable) << fit.message;
  const GroupStatistics& g1 = fit.groups[static_cast<std::size_t>(few)];
  const GroupStatistics& g2 = fit.groups[static_cast<std::size_t>(many)];
  for (int j : {a, b}) {
    const double nu = fit.parameters[static_cast<std::size_t>(j)].degrees_of_freedom;
    EXPECT_GT(nu, std::min(g1.degrees_of_freedom, g2.degrees_of_freedom) * 1.5);
    EXPECT_LT(nu, (g1.degrees_of_freedom + g2.degrees_of_freedom) / 2.0);
    const double s1 = g1.information_share[static_cast<std::size_t>(j)];
    const double s2 = g2.information_share[static_cast<std::size_t>(j)];
    EXPECT_NEAR(nu, 1.0 / (s1 * s1 / g1.degrees_of_freedom + s2 * s2 / g2.degrees_of_freedom), 1e-9 * nu);
  }
}

TEST(GroupSigmas, ParameterSeenByOneGroupGetsThatGroupsDegreesOfFreedom) {
  // Line (a, b) from 12 samples, level c from 51 others: the groups share no parameter,
  // so ν_a = ν_b = 12 − 2 and ν_c = 51 − 1, and the intervals use those quantiles
  // (statistics table: t_{0.975,10} = 2.228139, t_{0.975,50} = 2.008559).
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("intercept", 0.5));
  const int b = problem.AddParameter(Start("slope", 1.0));
  const int c = problem.AddParameter(Start("level", 1.0));
  const int line = problem.AddGroup({"line", 0.1});
  const int level = problem.AddGroup({"level", 1.0});
  AddSensor(&problem, line, a, b, 12, 0.1, 41);
  std::mt19937 generator(42);
  std::normal_distribution<double> noise(0.0, 1.0);
  for (int k = 0; k < 51; ++k) problem.AddResiduals(level, {c}, 1, LevelResidual{3.0 + noise(generator)});
  const FitResult fit = problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_NEAR(fit.Get("intercept").degrees_of_freedom, 10.0, 1e-9);
  EXPECT_NEAR(fit.Get("slope").degrees_of_freedom, 10.0, 1e-9);
  EXPECT_NEAR(fit.Get("level").degrees_of_freedom, 50.0, 1e-9);
  const ParameterEstimate& slope = fit.Get("slope");
  const ParameterEstimate& c_estimate = fit.Get("level");
  EXPECT_NEAR((slope.ci_high - slope.value) / slope.std_error, 2.228139, 5e-7);
  EXPECT_NEAR((c_estimate.ci_high - c_estimate.value) / c_estimate.std_error, 2.008559, 5e-7);
  EXPECT_NEAR(fit.groups[static_cast<std::size_t>(line)].information_share[static_cast<std::size_t>(c)], 0.0, 1e-15);
  EXPECT_NEAR(fit.groups[static_cast<std::size_t>(level)].information_share[static_cast<std::size_t>(c)], 1.0, 1e-15);
  EXPECT_EQ(fit.covariance(a, c), 0.0);
}

TEST(GroupSigmas, GroupWithoutResidualDegreesOfFreedomIsNotUsable) {
  // One sample of a level that only it determines: n − h = 0, so its noise cannot be
  // estimated from the data (least_squares.h); with σ known it can.
  LeastSquaresProblem problem;
  const int c = problem.AddParameter(Start("level", 1.0));
  const int group = problem.AddGroup({"single reading", 0.2});
  problem.AddResiduals(group, {c}, 1, LevelResidual{3.0});
  const FitResult estimated = problem.Solve(SolveOptions());
  EXPECT_FALSE(estimated.usable);
  EXPECT_NE(estimated.message.find("no residual degrees of freedom"), std::string::npos) << estimated.message;
  SolveOptions known;
  known.residual_variance_from_data = false;
  const FitResult with_sigma = problem.Solve(known);
  ASSERT_TRUE(with_sigma.usable) << with_sigma.message;
  EXPECT_NEAR(with_sigma.Get("level").value, 3.0, 1e-12);
  EXPECT_NEAR(with_sigma.Get("level").std_error, 0.2, 1e-12);  // σ/√1
}

}  // namespace
}  // namespace coilspin::core

// The core on the straight line y = a + b·x, where least squares has a closed
// form. Reference formulas (handbook): Draper & Smith, Applied Regression
// Analysis, 3rd ed., Wiley 1998, §1.2–1.4 —
//     b = Sxy/Sxx,  a = ȳ − b·x̄,  s² = RSS/(n − 2),
//     se(b) = s/√Sxx,  se(a) = s·√(1/n + x̄²/Sxx),  cov(a, b) = −x̄·s²/Sxx,
// and the interval estimate ± t_{0.975, n−2}·se.

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <string>
#include <vector>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::Start;

// Agreement demanded between the core and the closed form (relative).
constexpr double kClosedFormAgreement = 1e-10;

using test_support::LineResidual;

struct LineData {
  std::vector<double> x;
  std::vector<double> y;
};

LineData MakeLine(int n, double a, double b, double sigma, unsigned seed) {
  std::mt19937 generator(seed);
  std::normal_distribution<double> noise(0.0, sigma);
  LineData data;
  for (int k = 0; k < n; ++k) {
    const double x = 0.5 * k;
    data.x.push_back(x);
    data.y.push_back(a + b * x + noise(generator));
  }
  return data;
}

struct ClosedForm {
  double a, b, rss, x_mean, y_mean, sxx;
};

ClosedForm Solve(const LineData& data) {
  const double n = static_cast<double>(data.x.size());
  ClosedForm out{};
  for (std::size_t k = 0; k < data.x.size(); ++k) {
    out.x_mean += data.x[k] / n;
    out.y_mean += data.y[k] / n;
  }
  double sxy = 0.0;
  for (std::size_t k = 0; k < data.x.size(); ++k) {
    out.sxx += (data.x[k] - out.x_mean) * (data.x[k] - out.x_mean);
    sxy += (data.x[k] - out.x_mean) * (data.y[k] - out.y_mean);
  }
  out.b = sxy / out.sxx;
  out.a = out.y_mean - out.b * out.x_mean;
  for (std::size_t k = 0; k < data.x.size(); ++k) {
    const double e = data.y[k] - out.a - out.b * data.x[k];
    out.rss += e * e;
  }
  return out;
}

struct LineProblem {
  LeastSquaresProblem problem;
  int a = -1, b = -1, group = -1;
};

void Build(LineProblem* line, const LineData& data, const ParameterSpec& a, const ParameterSpec& b, double sigma) {
  line->a = line->problem.AddParameter(a);
  line->b = line->problem.AddParameter(b);
  line->group = line->problem.AddGroup({"line", sigma});
  for (std::size_t k = 0; k < data.x.size(); ++k) {
    line->problem.AddResiduals(line->group, {line->a, line->b}, 1, LineResidual{data.x[k], data.y[k]});
  }
}

void ExpectRelative(double actual, double expected, double tolerance) {
  EXPECT_NEAR(actual, expected, tolerance * std::abs(expected)) << "expected " << expected;
}

TEST(StraightLine, EstimatesStandardErrorsAndIntervalsMatchTheNormalEquations) {
  const LineData data = MakeLine(20, 2.0, 0.5, 0.3, 11);
  const ClosedForm exact = Solve(data);
  const double n = static_cast<double>(data.x.size());
  const double s2 = exact.rss / (n - 2.0);
  const double se_b = std::sqrt(s2 / exact.sxx);
  const double se_a = std::sqrt(s2 * (1.0 / n + exact.x_mean * exact.x_mean / exact.sxx));

  LineProblem line;
  Build(&line, data, Start("intercept", 1.0), Start("slope", 1.0), 1.0);
  const FitResult fit = line.problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_EQ(fit.num_estimated, 2);
  EXPECT_EQ(fit.num_residuals, 20);

  const ParameterEstimate& a = fit.Get("intercept");
  const ParameterEstimate& b = fit.Get("slope");
  ExpectRelative(a.value, exact.a, kClosedFormAgreement);
  ExpectRelative(b.value, exact.b, kClosedFormAgreement);
  ExpectRelative(a.std_error, se_a, kClosedFormAgreement);
  ExpectRelative(b.std_error, se_b, kClosedFormAgreement);
  ExpectRelative(fit.covariance(line.a, line.b), -exact.x_mean * s2 / exact.sxx, kClosedFormAgreement);
  ExpectRelative(fit.correlation(line.a, line.b), -exact.x_mean * s2 / exact.sxx / (se_a * se_b),
                 kClosedFormAgreement);
  ExpectRelative(fit.correlation(line.a, line.a), 1.0, kClosedFormAgreement);
  ExpectRelative(2.0 * fit.final_cost, exact.rss, kClosedFormAgreement);

  // Draper & Smith: n − 2 degrees of freedom; statistics table: t_{0.975,18} = 2.100922
  EXPECT_NEAR(b.degrees_of_freedom, 18.0, 1e-9);
  EXPECT_NEAR((b.ci_high - b.value) / b.std_error, 2.100922, 5e-7);
  EXPECT_NEAR((b.value - b.ci_low) / b.std_error, 2.100922, 5e-7);

  ASSERT_EQ(fit.groups.size(), 1u);
  const GroupStatistics& group = fit.groups[0];
  ExpectRelative(group.residual_variance, s2, kClosedFormAgreement);
  EXPECT_NEAR(group.degrees_of_freedom, 18.0, 1e-9);
  EXPECT_NEAR(group.fitted_degrees_of_freedom, 2.0, 1e-9);
  ExpectRelative(group.rms, std::sqrt(exact.rss / n), kClosedFormAgreement);
}

TEST(StraightLine, ScalingDoesNotChangeTheAnswer) {
  // physics: the minimiser and the covariance in physical units do not depend on how
  // Ceres' variables are scaled; only the conditioning does.
  const LineData data = MakeLine(20, 2.0, 0.5, 0.3, 11);
  const ClosedForm exact = Solve(data);
  LineProblem line;
  ParameterSpec a = Start("intercept", 1.0);
  a.scale = 1e-3;
  ParameterSpec b = Start("slope", 1.0);
  b.scale = 1e3;
  Build(&line, data, a, b, 1.0);
  const FitResult fit = line.problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  ExpectRelative(fit.Get("intercept").value, exact.a, kClosedFormAgreement);
  ExpectRelative(fit.Get("slope").value, exact.b, kClosedFormAgreement);
  ExpectRelative(fit.Get("slope").std_error, std::sqrt(exact.rss / 18.0 / exact.sxx), kClosedFormAgreement);
}

TEST(StraightLine, KnownSigmaUsesNormalQuantilesAndNoResidualVariance) {
  // Draper & Smith §1.4 with σ known: se(b) = σ/√Sxx; statistics table: z_{0.975} = 1.959964
  const double sigma = 0.3;
  const LineData data = MakeLine(20, 2.0, 0.5, sigma, 12);
  const ClosedForm exact = Solve(data);
  LineProblem line;
  Build(&line, data, Start("intercept", 1.0), Start("slope", 1.0), sigma);
  SolveOptions options;
  options.residual_variance_from_data = false;
  const FitResult fit = line.problem.Solve(options);
  ASSERT_TRUE(fit.usable) << fit.message;
  const ParameterEstimate& b = fit.Get("slope");
  ExpectRelative(b.std_error, sigma / std::sqrt(exact.sxx), kClosedFormAgreement);
  EXPECT_TRUE(std::isinf(b.degrees_of_freedom));
  EXPECT_NEAR((b.ci_high - b.value) / b.std_error, 1.959964, 5e-7);
  // The measured s² is still reported: RSS/(n − 2) of the residuals weighted by 1/σ.
  ExpectRelative(fit.groups[0].residual_variance, exact.rss / (sigma * sigma) / 18.0, kClosedFormAgreement);
}

TEST(StraightLine, FixedParameterIsHeldAndExcluded) {
  // Draper & Smith: with b held at b0 the intercept is ȳ − b0·x̄, a one-parameter fit
  // with s² = RSS/(n − 1) and se(a) = s/√n.
  const LineData data = MakeLine(20, 2.0, 0.5, 0.3, 13);
  const ClosedForm exact = Solve(data);
  const double held = 0.45;
  const double n = static_cast<double>(data.x.size());
  const double a_expected = exact.y_mean - held * exact.x_mean;
  double rss = 0.0;
  for (std::size_t k = 0; k < data.x.size(); ++k) {
    const double e = data.y[k] - a_expected - held * data.x[k];
    rss += e * e;
  }
  LineProblem line;
  ParameterSpec b = Start("slope", held);
  b.fixed = true;
  Build(&line, data, Start("intercept", 1.0), b, 1.0);
  const FitResult fit = line.problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_EQ(fit.num_estimated, 1);
  const ParameterEstimate& slope = fit.Get("slope");
  EXPECT_TRUE(slope.fixed);
  EXPECT_EQ(slope.value, held);
  EXPECT_EQ(slope.std_error, 0.0);
  EXPECT_EQ(fit.covariance(line.b, line.b), 0.0);
  EXPECT_EQ(fit.covariance(line.a, line.b), 0.0);
  ExpectRelative(fit.Get("intercept").value, a_expected, kClosedFormAgreement);
  ExpectRelative(fit.Get("intercept").std_error, std::sqrt(rss / (n - 1.0) / n), kClosedFormAgreement);
  EXPECT_NEAR(fit.Get("intercept").degrees_of_freedom, n - 1.0, 1e-9);
}

TEST(StraightLine, ActiveBoundIsRespectedAndReported) {
  // With the slope capped below its unconstrained optimum the constrained minimum has
  // b on the cap and a = ȳ − b_cap·x̄ (the one-parameter fit at fixed b; Draper & Smith).
  const LineData data = MakeLine(20, 2.0, 0.5, 0.3, 14);
  const ClosedForm exact = Solve(data);
  const double cap = 0.4;
  ASSERT_GT(exact.b, cap);
  LineProblem line;
  ParameterSpec b = Start("slope", 0.1);
  b.upper = cap;
  b.lower = 0.0;
  Build(&line, data, Start("intercept", 1.0), b, 1.0);
  const FitResult fit = line.problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.converged) << fit.message;
  ExpectRelative(fit.Get("slope").value, cap, 1e-12);
  EXPECT_TRUE(fit.Get("slope").at_bound);
  EXPECT_FALSE(fit.Get("intercept").at_bound);
  ExpectRelative(fit.Get("intercept").value, exact.y_mean - cap * exact.x_mean, kClosedFormAgreement);
}

TEST(StraightLine, InactiveBoundChangesNothing) {
  const LineData data = MakeLine(20, 2.0, 0.5, 0.3, 15);
  const ClosedForm exact = Solve(data);
  LineProblem line;
  ParameterSpec b = Start("slope", 0.1);
  b.lower = 0.0;
  b.upper = 10.0;
  Build(&line, data, Start("intercept", 1.0), b, 1.0);
  const FitResult fit = line.problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_FALSE(fit.Get("slope").at_bound);
  ExpectRelative(fit.Get("slope").value, exact.b, kClosedFormAgreement);
}

TEST(StraightLine, StudentIntervalsCoverAtTheirStatedRate) {
  // With Gaussian noise the interval b ± t_{0.975, n−2}·se covers the true b in 95 % of
  // repeated experiments (Draper & Smith §1.4). With n = 5 (3 degrees of freedom) a
  // normal quantile would cover only about 86 %, so this tells the two apart.
  constexpr int kReplicates = 2000;
  constexpr double kTrueSlope = 0.5;
  // 95 % ± 3 binomial standard deviations, sqrt(0.95·0.05/2000) = 0.0049.
  constexpr double kLowest = 0.935, kHighest = 0.965;
  int covered = 0;
  for (int replicate = 0; replicate < kReplicates; ++replicate) {
    const LineData data = MakeLine(5, 2.0, kTrueSlope, 0.3, 1000 + static_cast<unsigned>(replicate));
    LineProblem line;
    Build(&line, data, Start("intercept", 1.0), Start("slope", 1.0), 1.0);
    const FitResult fit = line.problem.Solve(SolveOptions());
    ASSERT_TRUE(fit.usable) << fit.message;
    const ParameterEstimate& b = fit.Get("slope");
    if (b.ci_low <= kTrueSlope && kTrueSlope <= b.ci_high) ++covered;
  }
  const double rate = static_cast<double>(covered) / kReplicates;
  EXPECT_GE(rate, kLowest);
  EXPECT_LE(rate, kHighest);
}

}  // namespace
}  // namespace coilspin::core

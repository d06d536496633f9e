// SolveOptions validation, refusals that never reach Ceres, and the promise
// that a solve prints nothing (style.md: no printing inside library code).

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::Start;

// y = log(b·x); undefined for b·x ≤ 0, where the functor's value is NaN
struct LogResidual {
  double x;
  double y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    using std::log;
    r[0] = y - log(*p[0] * x);
    return true;
  }
};

TEST(SolveOptions, DefaultsAreValid) {
  std::string error;
  EXPECT_TRUE(SolveOptions().IsValid(&error)) << error;
  EXPECT_TRUE(SolveOptions().IsValid(nullptr));
}

TEST(SolveOptions, EachBadValueIsRejectedWithAReason) {
  const auto rejected = [](SolveOptions options) {
    std::string error;
    const bool valid = options.IsValid(&error);
    return !valid && !error.empty();
  };
  SolveOptions o;
  o.confidence = 1.0;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.confidence = 0.0;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.max_iterations = 0;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.function_tolerance = 0.0;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.gradient_tolerance = -1e-10;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.parameter_tolerance = std::nan("");
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.rank_tolerance = 1.0;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.estimate_group_sigmas = true;
  o.group_sigma_rounds = 0;
  EXPECT_TRUE(rejected(o));
  o = SolveOptions();
  o.estimate_group_sigmas = true;
  o.residual_variance_from_data = false;
  EXPECT_TRUE(rejected(o));
}

TEST(Solve, InvalidOptionsAreRefusedWithoutSolving) {
  LeastSquaresProblem problem;
  const int b = problem.AddParameter(Start("gain", 2.0));
  const int group = problem.AddGroup({"log", 1.0});
  problem.AddResiduals(group, {b}, 1, LogResidual{1.0, 0.0});
  SolveOptions options;
  options.confidence = 2.0;
  const FitResult fit = problem.Solve(options);
  EXPECT_FALSE(fit.usable);
  EXPECT_EQ(fit.termination, "NOT_RUN");
  EXPECT_NE(fit.message.find("confidence"), std::string::npos) << fit.message;
  EXPECT_EQ(fit.Get("gain").value, 2.0);
}

TEST(Solve, StartOutsideTheBoundsIsRefusedByName) {
  LeastSquaresProblem problem;
  ParameterSpec spec = Start("gain", -1.0);
  spec.lower = 0.0;
  const int b = problem.AddParameter(spec);
  const int group = problem.AddGroup({"log", 1.0});
  problem.AddResiduals(group, {b}, 1, LogResidual{1.0, 0.0});
  const FitResult fit = problem.Solve(SolveOptions());
  EXPECT_FALSE(fit.usable);
  EXPECT_NE(fit.message.find("'gain'"), std::string::npos) << fit.message;
}

TEST(Solve, WritesNothingEvenWhenTrialStepsLeaveTheModelsDomain) {
  // y = log(b·x) with data from b = 1, started at b = 100: the first Gauss–Newton step
  // is about b ← b − b·log(b) = −360, where log is NaN. Ceres would print a warning
  // for a non-finite residual; the core turns it into a rejected step and says nothing.
  LeastSquaresProblem problem;
  const int b = problem.AddParameter(Start("gain", 100.0));
  const int group = problem.AddGroup({"log", 1.0});
  for (double x : {1.0, 2.0, 3.0, 4.0}) problem.AddResiduals(group, {b}, 1, LogResidual{x, std::log(x)});
  testing::internal::CaptureStdout();
  testing::internal::CaptureStderr();
  const FitResult fit = problem.Solve(SolveOptions());
  const std::string out = testing::internal::GetCapturedStdout();
  const std::string err = testing::internal::GetCapturedStderr();
  EXPECT_EQ(out, "");
  EXPECT_EQ(err, "");
  ASSERT_TRUE(fit.converged) << fit.message;
  EXPECT_NEAR(fit.Get("gain").value, 1.0, 1e-9);
}

TEST(Solve, NothingToEstimateStillReportsTheResiduals) {
  // All parameters fixed: residual statistics at the given values, no covariance needed.
  LeastSquaresProblem problem;
  ParameterSpec spec = Start("gain", 1.0);
  spec.fixed = true;
  const int b = problem.AddParameter(spec);
  const int group = problem.AddGroup({"log", 1.0});
  for (double x : {1.0, 2.0}) problem.AddResiduals(group, {b}, 1, LogResidual{x, std::log(x) + 0.5});
  const FitResult fit = problem.Solve(SolveOptions());
  EXPECT_EQ(fit.num_estimated, 0);
  EXPECT_NEAR(fit.groups[0].rms, 0.5, 1e-12);  // every residual is +0.5
  EXPECT_NEAR(fit.final_cost, 0.5 * 2 * 0.25, 1e-12);
}

}  // namespace
}  // namespace coilspin::core

// Numbers from data never abort the core (least_squares.h, AddParameter): a
// starting value, bound or noise level that is not a usable number makes Solve
// refuse with a message naming it, and a parameter left without degrees of
// freedom gets no interval and an unusable fit, never an abort. Before, each
// of these was a broken precondition that aborted the program (issue 10).

#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <string>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::LineResidual;
using test_support::Start;

constexpr double kInfinity = std::numeric_limits<double>::infinity();
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// y = 2 + 0.3·x at x = 0, 0.5, …, with a small deterministic wobble.
void AddLine(LeastSquaresProblem* problem, int a, int b, int group, int points) {
  for (int k = 0; k < points; ++k) {
    const double x = 0.5 * k;
    problem->AddResiduals(group, {a, b}, 1, LineResidual{x, 2.0 + 0.3 * x + 0.01 * ((k * 7) % 5 - 2)});
  }
}

FitResult SolveLine(double start_a, double sigma, int points = 20) {
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("a", start_a));
  const int b = problem.AddParameter(Start("b", 1.0));
  const int group = problem.AddGroup(GroupSpec{"line", sigma});
  AddLine(&problem, a, b, group, points);
  return problem.Solve(SolveOptions());
}

TEST(NumericRefusal, ANonFiniteStartingValueIsRefusedByName) {
  // A single -9e307 cell once made a fitter's starting value overflow (issue 10).
  const FitResult fit = SolveLine(-kInfinity, 1.0);
  EXPECT_FALSE(fit.usable);
  EXPECT_EQ(fit.termination, "NOT_RUN");
  EXPECT_EQ(fit.message, "cannot solve: the starting value of 'a' is not a finite number (-inf)");
  EXPECT_TRUE(std::isnan(fit.parameters[0].std_error));
}

TEST(NumericRefusal, ANoiseLevelThatIsNotPositiveAndFiniteIsRefusedByName) {
  for (const double sigma : {0.0, -1.0, kInfinity, kNaN}) {
    const FitResult fit = SolveLine(1.0, sigma);
    EXPECT_FALSE(fit.usable) << sigma;
    EXPECT_EQ(fit.message.rfind("cannot solve: the noise level of 'line' is not a finite number > 0", 0), 0u)
        << fit.message;
  }
}

TEST(NumericRefusal, LaterNumbersFromDataAreRefusedToo) {
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("a", 1.0));
  const int b = problem.AddParameter(Start("b", 1.0));
  const int group = problem.AddGroup(GroupSpec{"line"});
  AddLine(&problem, a, b, group, 20);
  ASSERT_TRUE(problem.Solve(SolveOptions()).usable);
  const auto held = problem.Clone();
  held->HoldAt(b, kNaN);
  EXPECT_EQ(held->Solve(SolveOptions()).message,
            "cannot solve: the value 'b' is held at is not a finite number (nan)");
  const auto rescaled = problem.Clone();
  rescaled->SetGroupSigma(group, kInfinity);
  EXPECT_EQ(rescaled->Solve(SolveOptions()).message,
            "cannot solve: the noise level of 'line' is not a finite number > 0 (inf)");
  EXPECT_TRUE(problem.Solve(SolveOptions()).usable);  // the original is untouched
}

TEST(NumericRefusal, BoundsThatAreNotFiniteNumbersInOrder) {
  LeastSquaresProblem problem;
  ParameterSpec spec = Start("a", 1.0);
  spec.lower = 2.0;
  spec.upper = 1.0;
  const int a = problem.AddParameter(spec);
  const int b = problem.AddParameter(Start("b", 1.0));
  AddLine(&problem, a, b, problem.AddGroup(GroupSpec{"line"}), 20);
  EXPECT_EQ(problem.Solve(SolveOptions()).message,
            "cannot solve: the bounds of 'a' are not finite numbers in order");
}

TEST(NumericRefusal, NoDegreesOfFreedomMeansNoIntervalNotAnAbort) {
  // Two points, two parameters: n − p = 0 (Draper & Smith §1.4: s² = RSS/(n − 2) is undefined).
  const FitResult fit = SolveLine(1.0, 1.0, /*points=*/2);
  EXPECT_FALSE(fit.usable);
  EXPECT_FALSE(fit.message.empty());
  // StudentTQuantile itself: NaN without degrees of freedom, the t quantile otherwise
  // (t_{0.975, 10} = 2.228138851986274, Student-t tables; SciPy stats.t.ppf).
  EXPECT_TRUE(std::isnan(StudentTQuantile(0.975, 0.0)));
  EXPECT_TRUE(std::isnan(StudentTQuantile(0.975, kNaN)));
  EXPECT_NEAR(StudentTQuantile(0.975, 10.0), 2.228138851986274, 1e-12);
}

}  // namespace
}  // namespace coilspin::core

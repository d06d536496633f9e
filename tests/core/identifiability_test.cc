// Rank-deficient problems are reported by name, never as huge numbers
// (docs: methods.md §4). The cases have null directions that follow from the
// model's algebra (physics: the residuals depend on the parameters only
// through the combination named).

#include <gtest/gtest.h>

#include <cmath>
#include <string>
#include <vector>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::Start;

// y = (a + b)·x: only the sum a + b moves a residual; r = y − (a + b)·x
struct SumTimesX {
  double x;
  double y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    r[0] = y - (*p[0] + *p[1]) * x;
    return true;
  }
};

// y = c (a level)
struct Level {
  double y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    r[0] = y - *p[0];
    return true;
  }
};

const std::vector<double> kX = {0.5, 1.0, 1.5, 2.0, 2.5, 3.0};
const std::vector<double> kY = {1.6, 2.9, 4.6, 6.1, 7.4, 9.1};

bool Contains(const std::vector<std::string>& names, const std::string& name) {
  for (const std::string& n : names) {
    if (n == name) return true;
  }
  return false;
}

TEST(Identifiability, SumOfTwoParametersIsReportedNotIdentifiable) {
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("a", 1.0));
  const int b = problem.AddParameter(Start("b", 2.0));
  const int group = problem.AddGroup({"line through the origin", 1.0});
  for (std::size_t k = 0; k < kX.size(); ++k) problem.AddResiduals(group, {a, b}, 1, SumTimesX{kX[k], kY[k]});
  const FitResult fit = problem.Solve(SolveOptions());

  EXPECT_FALSE(fit.usable);
  ASSERT_EQ(fit.not_identifiable.size(), 1u);  // one null direction: (1, −1)/√2
  EXPECT_EQ(fit.not_identifiable[0].size(), 2u);
  EXPECT_TRUE(Contains(fit.not_identifiable[0], "a"));
  EXPECT_TRUE(Contains(fit.not_identifiable[0], "b"));
  EXPECT_NE(fit.message.find("not identifiable"), std::string::npos) << fit.message;
  EXPECT_TRUE(std::isnan(fit.Get("a").std_error));
  EXPECT_TRUE(std::isnan(fit.Get("b").ci_high));
  EXPECT_EQ(fit.covariance(a, a), 0.0);  // no huge number in its place

  // The sum itself is determined: through the origin, a + b = Σxy/Σx² (Draper & Smith §3.1).
  double sxy = 0.0, sxx = 0.0;
  for (std::size_t k = 0; k < kX.size(); ++k) {
    sxy += kX[k] * kY[k];
    sxx += kX[k] * kX[k];
  }
  EXPECT_NEAR(fit.Get("a").value + fit.Get("b").value, sxy / sxx, 1e-10);
}

TEST(Identifiability, ParameterNoResidualUsesIsReported) {
  LeastSquaresProblem problem;
  const int c = problem.AddParameter(Start("level", 1.0));
  problem.AddParameter(Start("unused", 3.0));
  const int group = problem.AddGroup({"level", 1.0});
  for (double y : kY) problem.AddResiduals(group, {c}, 1, Level{y});
  const FitResult fit = problem.Solve(SolveOptions());
  EXPECT_FALSE(fit.usable);
  ASSERT_EQ(fit.not_identifiable.size(), 1u);
  EXPECT_EQ(fit.not_identifiable[0], std::vector<std::string>{"unused"});
  EXPECT_EQ(fit.Get("unused").value, 3.0);  // never moved
}

TEST(Identifiability, FixingOneOfThePairRestoresIdentifiability) {
  // With b held, a + b = Σxy/Σx² determines a alone.
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("a", 1.0));
  ParameterSpec held = Start("b", 2.0);
  held.fixed = true;
  const int b = problem.AddParameter(held);
  const int group = problem.AddGroup({"line through the origin", 1.0});
  for (std::size_t k = 0; k < kX.size(); ++k) problem.AddResiduals(group, {a, b}, 1, SumTimesX{kX[k], kY[k]});
  const FitResult fit = problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  EXPECT_TRUE(fit.not_identifiable.empty());
  double sxy = 0.0, sxx = 0.0;
  for (std::size_t k = 0; k < kX.size(); ++k) {
    sxy += kX[k] * kY[k];
    sxx += kX[k] * kX[k];
  }
  EXPECT_NEAR(fit.Get("a").value, sxy / sxx - 2.0, 1e-10);
}

}  // namespace
}  // namespace coilspin::core

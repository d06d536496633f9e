// Clone() and residual offsets (least_squares.h): a clone is an independent
// problem that solves to the same answer, and offsets act as shifted data,
// checked against the straight-line closed form (Draper & Smith §1.2).

#include <gtest/gtest.h>

#include <vector>

#include "core/ar1_line.h"
#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::LineResidual;
using test_support::MakeAr1Line;
using test_support::SampledLine;
using test_support::Start;

// The line with one block per sample, so that offsets are spread over many blocks.
void BuildPerSample(LeastSquaresProblem* problem, const SampledLine& line) {
  const int a = problem->AddParameter(Start("intercept", 1.0));
  const int b = problem->AddParameter(Start("slope", 1.0));
  const int group = problem->AddGroup({"line", 1.0});
  for (std::size_t k = 0; k < line.x.size(); ++k) problem->AddResiduals(group, {a, b}, 1, LineResidual{line.x[k], line.y[k]});
}

TEST(Clone, SolvesToTheSameAnswerAndLeavesTheOriginalAlone) {
  const SampledLine line = MakeAr1Line(25, 2.0, 0.5, 0.1, 0.0, 81);
  LeastSquaresProblem problem;
  BuildPerSample(&problem, line);
  const FitResult original = problem.Solve(SolveOptions());
  ASSERT_TRUE(original.usable) << original.message;
  const auto clone = problem.Clone();
  EXPECT_EQ(clone->Values(), problem.Values());
  EXPECT_EQ(clone->NumGroups(), 1);
  EXPECT_EQ(clone->NumParameters(), 2);
  clone->SetValues({0.0, 0.0});
  const FitResult cloned = clone->Solve(SolveOptions());
  ASSERT_TRUE(cloned.usable) << cloned.message;
  // Linear model: both end exact to rounding (least_squares.h, "Solving").
  EXPECT_NEAR(cloned.Get("slope").value, original.Get("slope").value, 1e-12);
  EXPECT_NEAR(cloned.Get("slope").std_error, original.Get("slope").std_error, 1e-12);
  clone->HoldAt(1, 0.3);
  const FitResult held = clone->Solve(SolveOptions());
  EXPECT_EQ(held.Get("slope").value, 0.3);
  EXPECT_TRUE(held.Get("slope").fixed);
  EXPECT_FALSE(problem.Spec(1).fixed);  // the original is untouched
  EXPECT_EQ(problem.Values()[1], original.Get("slope").value);
}

TEST(Clone, OffsetsActAsShiftedData) {
  // r + δ with δ_k = c + d·x_k is the line fitted to y_k + c + d·x_k, whose least-squares
  // solution is (a + c, b + d) exactly (the closed form is linear in y; Draper & Smith §1.2).
  // The residuals reported by Residuals() stay those without offsets.
  const SampledLine line = MakeAr1Line(25, 2.0, 0.5, 0.1, 0.0, 82);
  LeastSquaresProblem problem;
  BuildPerSample(&problem, line);
  const FitResult plain = problem.Solve(SolveOptions());
  ASSERT_TRUE(plain.usable) << plain.message;
  constexpr double kShift = 0.25, kTilt = -0.125;
  std::vector<double> offsets;
  for (double x : line.x) offsets.push_back(kShift + kTilt * x);
  const auto clone = problem.Clone();
  clone->SetResidualOffsets(0, offsets);
  const FitResult shifted = clone->Solve(SolveOptions());
  ASSERT_TRUE(shifted.usable) << shifted.message;
  EXPECT_NEAR(shifted.Get("intercept").value, plain.Get("intercept").value + kShift, 1e-12);
  EXPECT_NEAR(shifted.Get("slope").value, plain.Get("slope").value + kTilt, 1e-12);
  // Same residuals as the plain fit (shifted data, shifted line) — so the same SE.
  EXPECT_NEAR(shifted.Get("slope").std_error, plain.Get("slope").std_error, 1e-12);
  const auto residuals = clone->Residuals();
  ASSERT_TRUE(residuals.has_value());
  for (std::size_t k = 0; k < line.x.size(); ++k) {
    const double without = line.y[k] - (shifted.Get("intercept").value + shifted.Get("slope").value * line.x[k]);
    EXPECT_NEAR((*residuals)[0](static_cast<Eigen::Index>(k)), without, 1e-14);
  }
  // A clone of the clone keeps the offsets; clearing them restores the plain fit.
  const auto again = clone->Clone();
  EXPECT_NEAR(again->Solve(SolveOptions()).Get("slope").value, shifted.Get("slope").value, 1e-12);
  again->SetResidualOffsets(0, {});
  EXPECT_NEAR(again->Solve(SolveOptions()).Get("slope").value, plain.Get("slope").value, 1e-12);
}

}  // namespace
}  // namespace coilspin::core

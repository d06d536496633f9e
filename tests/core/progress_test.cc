// Progress from the core (fitters/core/progress.h): Solve reports each solve of
// the noise re-estimation rounds, in order, ending with done == total; a Clone
// (a bootstrap replicate's problem, run on another thread) reports nothing.

#include <gtest/gtest.h>

#include <utility>
#include <vector>

#include "core/parameter_start.h"
#include "fitters/core/least_squares.h"
#include "fitters/core/progress.h"

namespace coilspin::core {
namespace {

using test_support::LineResidual;
using test_support::Start;

void BuildLine(LeastSquaresProblem* problem) {
  const int a = problem->AddParameter(Start("a", 1.0));
  const int b = problem->AddParameter(Start("b", 1.0));
  const int group = problem->AddGroup(GroupSpec{"line"});
  for (int k = 0; k < 20; ++k) {
    const double x = 0.5 * k;
    problem->AddResiduals(group, {a, b}, 1, LineResidual{x, 2.0 + 0.3 * x + 0.01 * ((k * 7) % 5 - 2)});
  }
}

TEST(Progress, SolveReportsEachRoundThenTheEnd) {
  LeastSquaresProblem problem;
  BuildLine(&problem);
  std::vector<std::pair<int, int>> solving;
  problem.SetProgress([&](ProgressStage stage, int done, int total) {
    if (stage == ProgressStage::kSolving) solving.emplace_back(done, total);
  });
  SolveOptions options;
  options.estimate_group_sigmas = true;
  options.group_sigma_rounds = 2;
  ASSERT_TRUE(problem.Solve(options).usable);
  ASSERT_GE(solving.size(), 2u);
  EXPECT_EQ(solving.front(), std::make_pair(0, 3));  // 1 + 2 rounds
  EXPECT_EQ(solving.back(), std::make_pair(3, 3));
  for (std::size_t k = 1; k < solving.size(); ++k) EXPECT_GE(solving[k].first, solving[k - 1].first);
}

TEST(Progress, AClonedProblemIsSilent) {
  LeastSquaresProblem problem;
  BuildLine(&problem);
  int calls = 0;
  problem.SetProgress([&](ProgressStage, int, int) { ++calls; });
  const auto clone = problem.Clone();
  ASSERT_TRUE(clone->Solve(SolveOptions()).usable);
  EXPECT_EQ(calls, 0);
}

}  // namespace
}  // namespace coilspin::core

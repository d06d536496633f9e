// Profile-likelihood intervals (fitters/core/profile.h): equal to Wald for a
// model linear in its parameters, asymmetric for an exponential decay and
// agreeing there with an independent SciPy profile, open sides reported.

#include <gtest/gtest.h>
#include <unistd.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <random>
#include <sstream>
#include <string>
#include <vector>

#include "core/ar1_line.h"
#include "core/parameter_start.h"
#include "reference/python_reference.h"
#include "fitters/core/least_squares.h"
#include "fitters/core/profile.h"

namespace coilspin::core {
namespace {

// These small problems are solved to rounding, so the crossings can be placed far
// tighter than the default (kProfileRootTolerance, set for large joint problems).
constexpr double kTightRootTolerance = 1e-10;

ProfileOptions Tight() {
  ProfileOptions options;
  options.root_tolerance = kTightRootTolerance;
  return options;
}

using test_support::BuildLine;
using test_support::LineFit;
using test_support::MakeAr1Line;
using test_support::Start;
using coilspin::test_support::RunCapture;
using coilspin::test_support::SciPyAvailable;

// Linear model: the profile is an exact parabola, so its ends are the Wald ends up
// to the root tolerance and solver rounding (Bates & Watts 1988 §6.1, from memory).
constexpr double kLinearAgreement = 1e-6;

void ExpectWaldEnds(const ProfileInterval& profile, const ParameterEstimate& wald) {
  ASSERT_TRUE(profile.usable) << profile.message;
  ASSERT_TRUE(profile.low.found) << profile.low.reason;
  ASSERT_TRUE(profile.high.found) << profile.high.reason;
  const double half = wald.ci_high - wald.value;
  EXPECT_NEAR(profile.low.bound, wald.ci_low, kLinearAgreement * half);
  EXPECT_NEAR(profile.high.bound, wald.ci_high, kLinearAgreement * half);
}

TEST(Profile, LinearModelGivesTheWaldInterval) {
  const auto line = MakeAr1Line(30, 2.0, 0.5, 0.1, 0.0, 41);
  LineFit fit;
  BuildLine(&fit, line);
  const FitResult full = fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(full.usable) << full.message;
  for (const std::string name : {"intercept", "slope"}) {
    const ProfileInterval profile = Profile(fit.problem, full, name, Tight());
    ExpectWaldEnds(profile, full.Get(name));
    // statistics table: t_{0.975, 28} = 2.048407
    EXPECT_NEAR(profile.threshold, 2.048407 * 2.048407, 1e-5);
    EXPECT_LT(profile.solves, 12);
  }
}

TEST(Profile, LinearModelWithKnownSigmaOrWideningStillGivesWald) {
  // Known σ: the threshold is z² (normal quantile) and S is not rescaled. AR(1) noise:
  // the widened Wald interval (factor f, n_eff degrees of freedom) is matched by
  // σ'² = σ²·s²·f (profile.h) — both from the definitions, linear model.
  const auto white = MakeAr1Line(30, 2.0, 0.5, 0.1, 0.0, 42);
  LineFit known;
  BuildLine(&known, white, 0.1);
  SolveOptions options;
  options.residual_variance_from_data = false;
  const FitResult known_fit = known.problem.Solve(options);
  ASSERT_TRUE(known_fit.usable) << known_fit.message;
  ExpectWaldEnds(Profile(known.problem, known_fit, "slope", Tight()), known_fit.Get("slope"));

  const auto correlated = MakeAr1Line(200, 2.0, 0.5, 0.1, 0.8, 43);
  LineFit widened;
  BuildLine(&widened, correlated);
  const FitResult widened_fit = widened.problem.Solve(SolveOptions());
  ASSERT_TRUE(widened_fit.usable) << widened_fit.message;
  ASSERT_TRUE(widened_fit.groups[0].widened_for_autocorrelation);
  ExpectWaldEnds(Profile(widened.problem, widened_fit, "slope", Tight()), widened_fit.Get("slope"));
}

// y = a·exp(−k·x); r = y − a·exp(−k·x), the whole series in one block
struct DecayResidual {
  std::vector<double> x;
  std::vector<double> y;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    using std::exp;
    for (std::size_t i = 0; i < x.size(); ++i) r[i] = y[i] - *p[0] * exp(-*p[1] * x[i]);
    return true;
  }
};

struct DecayData {
  std::vector<double> x, y;
};

DecayData MakeDecay() {
  // 16 samples of 2·exp(−0.7·x) on x = 0 … 3.75 with σ = 0.1: noisy enough that the
  // rate's profile is visibly curved.
  constexpr int kCount = 16;
  std::mt19937_64 generator(51);
  std::normal_distribution<double> noise(0.0, 0.1);
  DecayData data;
  for (int i = 0; i < kCount; ++i) {
    data.x.push_back(0.25 * i);
    data.y.push_back(2.0 * std::exp(-0.7 * data.x.back()) + noise(generator));
  }
  return data;
}

TEST(Profile, ExponentialRateIsAsymmetricAndMatchesSciPy) {
  const DecayData data = MakeDecay();
  LeastSquaresProblem problem;
  const int a = problem.AddParameter(Start("amplitude", 1.0));
  const int k = problem.AddParameter(Start("rate", 1.0));
  const int group = problem.AddGroup({"decay", 1.0});
  problem.AddResiduals(group, {a, k}, static_cast<int>(data.x.size()), DecayResidual{data.x, data.y});
  const FitResult fit = problem.Solve(SolveOptions());
  ASSERT_TRUE(fit.usable) << fit.message;
  ASSERT_FALSE(fit.groups[0].widened_for_autocorrelation);  // 16 residuals: never
  const ParameterEstimate& rate = fit.Get("rate");
  const ProfileInterval profile = Profile(problem, fit, "rate", Tight());
  ASSERT_TRUE(profile.usable) << profile.message;
  ASSERT_TRUE(profile.low.found && profile.high.found) << profile.low.reason << profile.high.reason;
  // Direction: the rate's log is the nearly linear parameter of a decay (Bates & Watts
  // ch. 7 on parameter-effects curvature, from memory), so in k itself the upper side is
  // the longer one, and both ends lie above the symmetric Wald ends.
  const double lower_side = rate.value - profile.low.bound;
  const double upper_side = profile.high.bound - rate.value;
  EXPECT_GT(upper_side / lower_side, 1.05);
  EXPECT_GT(profile.low.bound, rate.ci_low);
  EXPECT_GT(profile.high.bound, rate.ci_high);
  std::printf("decay rate %.4f: Wald [%.4f, %.4f], profile [%.4f, %.4f], %d solves\n", rate.value, rate.ci_low,
              rate.ci_high, profile.low.bound, profile.high.bound, profile.solves);

  if (!SciPyAvailable()) {
    GTEST_SKIP() << "SciPy not found for " << COILSPIN_PYTHON
                 << " (install python3-scipy): the independent profile of this check is "
                    "scipy.optimize.least_squares + brentq (tests/core/scipy_profile.py)";
  }
  const auto path = std::filesystem::temp_directory_path() / ("coilspin_profile_" + std::to_string(::getpid()));
  {
    std::ofstream file(path);
    file.precision(17);
    for (std::size_t i = 0; i < data.x.size(); ++i) file << data.x[i] << " " << data.y[i] << "\n";
  }
  const std::string script = std::string(COILSPIN_TEST_SOURCE_DIR) + "/core/scipy_profile.py";
  std::istringstream output(RunCapture(std::string(COILSPIN_PYTHON) + " " + script + " " + path.string() + " 0.95"));
  std::filesystem::remove(path);
  double k_hat = 0.0, se = 0.0, low = 0.0, high = 0.0;
  ASSERT_TRUE(output >> k_hat >> se >> low >> high) << "no output from " << script;
  // Two implementations of one estimator: the estimate to 1e-8, the ends to 1e-6 of
  // the half-width (both root-find to far better; the rest is the solvers' tolerance).
  EXPECT_NEAR(rate.value, k_hat, 1e-8 * k_hat);
  EXPECT_NEAR(rate.std_error, se, 1e-6 * se);
  EXPECT_NEAR(profile.low.bound, low, 1e-6 * lower_side);
  EXPECT_NEAR(profile.high.bound, high, 1e-6 * upper_side);
}

TEST(Profile, OpenSidesAreReportedWithTheirReason) {
  // Linear model, so √ΔS = |θ − θ̂|/se exactly (from the definition): a reach of one
  // standard error never reaches t ≈ 2 and stops at θ̂ ± se; a bound one standard
  // error below θ̂ is met before the crossing.
  const auto line = MakeAr1Line(30, 2.0, 0.5, 0.1, 0.0, 44);
  LineFit fit;
  BuildLine(&fit, line);
  const FitResult full = fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(full.usable) << full.message;
  const ParameterEstimate& slope = full.Get("slope");
  ProfileOptions short_reach;
  short_reach.reach_standard_errors = 1.0;
  const ProfileInterval reach = Profile(fit.problem, full, "slope", short_reach);
  ASSERT_TRUE(reach.usable) << reach.message;
  EXPECT_FALSE(reach.low.found);
  EXPECT_FALSE(reach.high.found);
  EXPECT_NEAR(reach.high.bound, slope.value + slope.std_error, 1e-9);
  EXPECT_NE(reach.high.reason.find("stays below"), std::string::npos) << reach.high.reason;

  LeastSquaresProblem bounded;
  bounded.AddParameter(Start("intercept", 1.0));
  ParameterSpec b = Start("slope", 1.0);
  b.lower = slope.value - slope.std_error;
  bounded.AddParameter(b);
  const int group = bounded.AddGroup({"line", 1.0});
  bounded.AddResiduals(group, {0, 1}, static_cast<int>(line.x.size()),
                       test_support::LineSeriesResidual{line.x, line.y});
  const FitResult bounded_fit = bounded.Solve(SolveOptions());
  ASSERT_TRUE(bounded_fit.usable) << bounded_fit.message;
  const ProfileInterval at_bound = Profile(bounded, bounded_fit, "slope", Tight());
  ASSERT_TRUE(at_bound.usable) << at_bound.message;
  EXPECT_FALSE(at_bound.low.found);
  EXPECT_EQ(at_bound.low.bound, *b.lower);
  EXPECT_NE(at_bound.low.reason.find("bound"), std::string::npos) << at_bound.low.reason;
  EXPECT_TRUE(at_bound.high.found) << at_bound.high.reason;
  EXPECT_NEAR(at_bound.high.bound, slope.ci_high, kLinearAgreement * (slope.ci_high - slope.value));

  // Refusal: an unknown name (a robust fit is refused in robust_loss_test.cc).
  EXPECT_FALSE(Profile(fit.problem, full, "no such", Tight()).usable);
}

}  // namespace
}  // namespace coilspin::core

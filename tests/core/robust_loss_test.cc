// Robust losses (fitters/core/robust_loss.h) and the MAD scale
// (residual_statistics.h): the transform against its closed form, smoothness
// at 0 for automatic differentiation, and a line with gross outliers.

#include <gtest/gtest.h>

#include <ceres/jet.h>

#include <cmath>
#include <random>
#include <vector>

#include "core/ar1_line.h"
#include "fitters/core/least_squares.h"
#include "fitters/core/profile.h"
#include "fitters/core/residual_statistics.h"
#include "fitters/core/robust_loss.h"

namespace coilspin::core {
namespace {

using test_support::BuildLine;
using test_support::LineFit;
using test_support::MakeAr1Line;
using test_support::SampledLine;

TEST(RobustLoss, TransformSquaresToTheLoss) {
  // z̃² = ρ(z²) with Huber's and Cauchy's ρ (robust_loss.h; Huber 1981), sign kept.
  const double kh = kHuberTuning, kc = kCauchyTuning;
  for (double z : {-5.0, -1.0, 0.3, 1.345, 2.0, 40.0}) {
    const double s = z * z;
    const double huber = s <= kh * kh ? s : 2.0 * kh * std::sqrt(s) - kh * kh;
    const double cauchy = kc * kc * std::log1p(s / (kc * kc));
    const double h = RobustResidual(z, RobustLoss::kHuber);
    const double c = RobustResidual(z, RobustLoss::kCauchy);
    EXPECT_NEAR(h * h, huber, 1e-12 * huber) << z;
    EXPECT_NEAR(c * c, cauchy, 1e-12 * cauchy) << z;
    EXPECT_EQ(std::signbit(h), std::signbit(z));
    EXPECT_EQ(std::signbit(c), std::signbit(z));
    EXPECT_EQ(RobustResidual(z, RobustLoss::kSquared), z);
  }
  // The series branch of Cauchy (u < 1e-4) agrees with log1p to rounding.
  const double tiny = 1e-3;
  EXPECT_NEAR(RobustResidual(tiny, RobustLoss::kCauchy), kc * std::sqrt(std::log1p(tiny * tiny / (kc * kc))),
              1e-18);
}

TEST(RobustLoss, DerivativesAreFiniteAndContinuous) {
  // dz̃/dz = 1 at z = 0 (both) and at the Huber knee from both sides (from the
  // definitions: d√(2k|z| − k²)/dz = k/√(2k|z| − k²) = 1 at |z| = k).
  using Jet = ceres::Jet<double, 1>;
  for (RobustLoss loss : {RobustLoss::kHuber, RobustLoss::kCauchy}) {
    const Jet at_zero = RobustResidual(Jet(0.0, 0), loss);
    EXPECT_EQ(at_zero.a, 0.0);
    EXPECT_NEAR(at_zero.v[0], 1.0, 1e-15);
  }
  const Jet inside = RobustResidual(Jet(kHuberTuning - 1e-9, 0), RobustLoss::kHuber);
  const Jet outside = RobustResidual(Jet(kHuberTuning + 1e-9, 0), RobustLoss::kHuber);
  EXPECT_NEAR(inside.v[0], outside.v[0], 1e-8);
  // Cauchy across its series limit u = 1e-4, i.e. z = k·0.01.
  const double edge = kCauchyTuning * std::sqrt(kCauchySeriesLimit);
  const Jet below = RobustResidual(Jet(edge * (1 - 1e-9), 0), RobustLoss::kCauchy);
  const Jet above = RobustResidual(Jet(edge * (1 + 1e-9), 0), RobustLoss::kCauchy);
  EXPECT_NEAR(above.a - below.a, 2e-9 * edge * below.v[0], 1e-16);  // value: first order across
  EXPECT_NEAR(below.v[0], above.v[0], 1e-12);
}

TEST(RobustLoss, NamesRoundTrip) {
  for (RobustLoss loss : {RobustLoss::kSquared, RobustLoss::kHuber, RobustLoss::kCauchy}) {
    EXPECT_EQ(RobustLossFromString(RobustLossToString(loss)), loss);
  }
  EXPECT_FALSE(RobustLossFromString("tukey").has_value());
}

TEST(MedianAbsoluteDeviation, KnownSequences) {
  // [1, 2, 3, 4, 100]: median 3, |e − 3| = [2, 1, 0, 1, 97], median 1 → 1.4826
  // (definition, Hampel 1974); even count: mean of the middle two.
  Eigen::VectorXd odd(5);
  odd << 1, 2, 3, 4, 100;
  EXPECT_NEAR(MedianAbsoluteDeviationScale(odd), kMadToSigma, 1e-15);
  Eigen::VectorXd even(4);
  even << 1, 2, 4, 10;  // median 3; |e − 3| = [2, 1, 1, 7], median 1.5
  EXPECT_NEAR(MedianAbsoluteDeviationScale(even), 1.5 * kMadToSigma, 1e-15);
  EXPECT_EQ(MedianAbsoluteDeviationScale(Eigen::VectorXd()), 0.0);
}

constexpr int kCount = 400;
constexpr double kIntercept = 2.0, kSlope = 0.5, kSigma = 0.1;
// 5 % of the samples get a spike of +3 (30 σ), every 10th sample of the upper half
// of x, so that they tilt the line: a gross, one-sided contamination.
constexpr int kSpikeSpacing = 10;
constexpr double kSpike = 3.0;

SampledLine SpikedLine(bool spikes) {
  SampledLine line = MakeAr1Line(kCount, kIntercept, kSlope, kSigma, 0.0, 61);
  if (spikes) {
    for (int k = kCount / 2 + kSpikeSpacing / 2; k < kCount; k += kSpikeSpacing) line.y[static_cast<std::size_t>(k)] += kSpike;
  }
  return line;
}

FitResult FitLine(const SampledLine& line, RobustLoss loss) {
  LineFit fit;
  BuildLine(&fit, line);
  SolveOptions options;
  options.loss = loss;
  options.estimate_group_sigmas = true;
  return fit.problem.Solve(options);
}

// se(b) = σ/√Sxx of the clean design (Draper & Smith §1.4).
double TrueSlopeError() { return test_support::Ar1SlopeStandardDeviation(kCount, kSigma, 0.0); }

TEST(RobustLoss, LineWithOutliersIsRecoveredByHuberAndCauchy) {
  const SampledLine line = SpikedLine(true);
  const FitResult ordinary = FitLine(line, RobustLoss::kSquared);
  const FitResult huber = FitLine(line, RobustLoss::kHuber);
  const FitResult cauchy = FitLine(line, RobustLoss::kCauchy);
  ASSERT_TRUE(ordinary.usable && huber.usable && cauchy.usable) << huber.message << cauchy.message;
  const double se = TrueSlopeError();
  // Least squares: 20 spikes of 30 σ at large x pull the slope by many standard errors
  // (from the normal equations: Δb = Σ_spikes (x_k − x̄)/Sxx · 3 ≈ 26 se here).
  EXPECT_GT(std::abs(ordinary.Get("slope").value - kSlope) / se, 4.0);
  // An M-estimator bounds each spike's influence (Huber 1981): within 3 se of the truth.
  EXPECT_LT(std::abs(huber.Get("slope").value - kSlope) / se, 3.0);
  EXPECT_LT(std::abs(cauchy.Get("slope").value - kSlope) / se, 3.0);
  // The MAD scale ignores the spikes: σ within 20 %. The MAD estimate of σ has 37 %
  // efficiency at the normal (Huber 1981, from memory), so a relative SE of
  // 1/√(2·0.37·n) = 5.8 % for n = 400; 5 % contamination raises it by about 6 %.
  EXPECT_NEAR(huber.groups[0].sigma / kSigma, 1.0, 0.2);
  EXPECT_NEAR(cauchy.groups[0].sigma / kSigma, 1.0, 0.2);
  EXPECT_EQ(huber.options.loss, RobustLoss::kHuber);  // the result says which loss it used
  std::printf("slope error / se: ordinary %.2f, huber %.2f, cauchy %.2f\n",
              (ordinary.Get("slope").value - kSlope) / se, (huber.Get("slope").value - kSlope) / se,
              (cauchy.Get("slope").value - kSlope) / se);
}

TEST(RobustLoss, WithoutOutliersTheRobustFitAgreesWithLeastSquares) {
  // 95 % efficiency at the normal (the tuning constants' definition) means the robust
  // estimate differs from least squares by about √(1/0.95 − 1) = 0.23 se at most
  // typically; 0.5 se is two of those.
  const SampledLine line = SpikedLine(false);
  const FitResult ordinary = FitLine(line, RobustLoss::kSquared);
  const double se = ordinary.Get("slope").std_error;
  for (RobustLoss loss : {RobustLoss::kHuber, RobustLoss::kCauchy}) {
    const FitResult robust = FitLine(line, loss);
    ASSERT_TRUE(robust.usable) << robust.message;
    EXPECT_LT(std::abs(robust.Get("slope").value - ordinary.Get("slope").value) / se, 0.5);
    EXPECT_NEAR(robust.Get("slope").std_error / se, 1.0, 0.2);
  }
}

TEST(RobustLoss, NeedsANoiseScaleAndIsRefusedByTheProfile) {
  // robust_loss.h: k is in units of σ_g, so σ must be known or estimated (MAD); a
  // profile needs a Gaussian objective (profile.h).
  SolveOptions options;
  options.loss = RobustLoss::kHuber;
  std::string error;
  EXPECT_FALSE(options.IsValid(&error));
  EXPECT_NE(error.find("huber"), std::string::npos) << error;
  options.residual_variance_from_data = false;
  EXPECT_TRUE(options.IsValid(&error)) << error;

  const SampledLine line = SpikedLine(true);
  LineFit fit;
  BuildLine(&fit, line);
  options = SolveOptions();
  options.loss = RobustLoss::kHuber;
  options.estimate_group_sigmas = true;
  const FitResult robust = fit.problem.Solve(options);
  ASSERT_TRUE(robust.usable) << robust.message;
  const ProfileInterval profile = Profile(fit.problem, robust, "slope", ProfileOptions());
  EXPECT_FALSE(profile.usable);
  EXPECT_NE(profile.message.find("squared loss"), std::string::npos) << profile.message;
}

}  // namespace
}  // namespace coilspin::core

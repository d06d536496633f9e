// Autocorrelation widening (fitters/core/autocorrelation_widening.h): the
// decision rule, the factor and degrees of freedom it puts into the result,
// and the coverage of the slope interval of a line with AR(1) noise.

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <random>

#include "core/ar1_line.h"
#include "fitters/core/autocorrelation_widening.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::BuildLine;
using test_support::LineFit;
using test_support::MakeAr1Line;

using test_support::kInnovationSigma;
constexpr double kIntercept = test_support::kLineIntercept;
constexpr double kSlope = test_support::kLineSlope;

// White noise w plus a weak, slowly decaying AR(1) part s (variance share a,
// coefficient φ): ρ_k = a·φ^k, so τ_int = 1 + 2·a·φ/(1 − φ) (sum of a geometric
// series), while the lag-1 AR(1) factor (1 + aφ)/(1 − aφ) sees almost nothing.
Eigen::VectorXd WhitePlusSlowDrift(int n, double share, double phi, unsigned seed) {
  std::mt19937 generator(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  const double drift_innovation = std::sqrt(share * (1.0 - phi * phi));  // Var(s) = share
  const double white = std::sqrt(1.0 - share);
  Eigen::VectorXd x(n);
  double s = std::sqrt(share) * normal(generator);
  for (int k = 0; k < n; ++k) {
    s = phi * s + drift_innovation * normal(generator);
    x(k) = white * normal(generator) + s;
  }
  return x;
}

TEST(AutocorrelationWidening, IntegratedTimeCatchesNoiseThatDecaysSlowerThanAr1) {
  constexpr int kSamples = 200000;
  constexpr double kShare = 0.1, kPhi = 0.95;
  const double tau = 1.0 + 2.0 * kShare * kPhi / (1.0 - kPhi);  // 4.8
  const Eigen::VectorXd x = WhitePlusSlowDrift(kSamples, kShare, kPhi, 17);
  // Geyer's estimate: relative error about √(2(2L+1)/n)·τ (Madras & Sokal, from memory) ≈ 5 % here; 15 % bound.
  EXPECT_NEAR(IntegratedAutocorrelationTime(x) / tau, 1.0, 0.15);
  const AutocorrelationWidening w = DecideWidening(x, {});
  ASSERT_TRUE(w.widened);
  EXPECT_NEAR(w.inflation / tau, 1.0, 0.15);
  const double ar1 = (1.0 + kShare * kPhi) / (1.0 - kShare * kPhi);
  EXPECT_GT(w.inflation, 3.0 * ar1);
  // White noise: τ_int ≈ 1 (the pairs summed are noise of order √(L/n)).
  std::mt19937 generator(18);
  std::normal_distribution<double> normal(0.0, 1.0);
  Eigen::VectorXd white(kSamples);
  for (int k = 0; k < kSamples; ++k) white(k) = normal(generator);
  EXPECT_NEAR(IntegratedAutocorrelationTime(white), 1.0, 0.05);
}

TEST(AutocorrelationWidening, IntegratedTimeFollowsAWeakVerySlowPart) {
  // A tachometer's white noise over a slow misfit of the model: 5 % of the variance
  // decays with φ = 0.999 (a correlation time of 1000 samples), so
  // τ_int = 1 + 2·a·φ/(1 − φ) = 100.9 (geometric series) while ρ₁ ≈ a = 0.05 looks
  // almost white. A window fixed in multiples of the running τ (Sokal's) stops near
  // lag 10 and reports about 2; Geyer's pairs stay positive out to where the slow
  // part fades into the estimate's noise. At n = 2·10⁶ the estimate sums about
  // 3000 lags: relative error √(2(2L+1)/n) ≈ 0.08 (Madras & Sokal, from memory); 35 %
  // allows for that and for the truncation of the tail beyond the last positive pair.
  constexpr int kSamples = 2000000;
  constexpr double kShare = 0.05, kPhi = 0.999;
  const double tau = 1.0 + 2.0 * kShare * kPhi / (1.0 - kPhi);
  const Eigen::VectorXd x = WhitePlusSlowDrift(kSamples, kShare, kPhi, 19);
  const AutocorrelationWidening w = DecideWidening(x, {});
  ASSERT_TRUE(w.widened);
  EXPECT_NEAR(w.inflation / tau, 1.0, 0.35) << "tau " << w.inflation << " over " << w.lags << " lags";
  EXPECT_GT(w.lags, 500);
}

TEST(AutocorrelationWidening, GeyerEstimateOfExactCorrelations) {
  // ρ_k = φ^k exactly (AR(1)): every pair Γ_m = φ^{2m}(1 + φ) is positive and
  // decreasing, so the estimate is the whole sum −1 + 2·Σ_{k=0}^{M} φ^k, which is
  // (1 + φ)/(1 − φ) − 2·φ^{M+1}/(1 − φ) (geometric series).
  constexpr double kPhi = 0.8;
  constexpr int kLags = 401;  // M + 1 sums, an even count: 200 whole pairs
  LaggedSums sums(kLags + 1);
  for (int m = 0; m <= kLags; ++m) sums[static_cast<std::size_t>(m)] = 1000.0 * std::pow(kPhi, m);
  // A series long enough (10¹⁵ samples) that no correlation counts as noise.
  const IntegratedTime exact = GeyerIntegratedTime(sums, {}, 1e15);
  // The sum stops where a pair is below two of its standard errors, Γ_m ≈ 2·10⁻⁷ at this n: the
  // tail left out is 2·φ^{2m}/(1 − φ) ≈ 10⁻⁶.
  EXPECT_NEAR(exact.tau, (1.0 + kPhi) / (1.0 - kPhi), 1e-5);
  // Alternating correlations (ρ_k = (−0.5)^k): Γ_0 = 0.5, Γ_1 = 0.25 − 0.125 … all positive and
  // the sum −1 + 2·(1/(1 + 0.5)) = 1/3 < 1: never below 1, and such a group is never widened.
  LaggedSums alternating(64);
  for (int m = 0; m < 64; ++m) alternating[static_cast<std::size_t>(m)] = std::pow(-0.5, m);
  EXPECT_EQ(GeyerIntegratedTime(alternating).tau, 1.0);
  // Explained lagged sums come off before the estimate: here all of the correlation.
  LaggedSums white_part(kLags + 1, 0.0);
  white_part[0] = 500.0;  // half the variance is white and own; the correlated half is explained
  LaggedSums half(kLags + 1);
  for (int m = 0; m <= kLags; ++m) half[static_cast<std::size_t>(m)] = 500.0 * std::pow(kPhi, m);
  LaggedSums total(kLags + 1);
  for (int m = 0; m <= kLags; ++m) total[static_cast<std::size_t>(m)] = white_part[static_cast<std::size_t>(m)] + half[static_cast<std::size_t>(m)];
  EXPECT_EQ(GeyerIntegratedTime(total, half).tau, 1.0);
}

TEST(AutocorrelationWidening, ShortOrNegativelyCorrelatedGroupsAreNotWidened) {
  // Too few residuals for τ̂ to mean much: never widened, whatever their correlation.
  Eigen::VectorXd ramp(kMinResidualsForWidening - 1);
  for (Eigen::Index k = 0; k < ramp.size(); ++k) ramp(k) = static_cast<double>(k);
  EXPECT_FALSE(DecideWidening(ramp, {}).widened);
  EXPECT_EQ(DecideWidening(ramp, {}).inflation, 1.0);
  // Alternating residuals (negative correlation) would narrow the interval: not widened.
  Eigen::VectorXd alternating(1000);
  for (Eigen::Index k = 0; k < alternating.size(); ++k) alternating(k) = (k % 2 == 0) ? 1.0 : -1.0;
  EXPECT_FALSE(DecideWidening(alternating, {}).widened);
  // More explained than there is: no own noise left, no widening (a slow ramp would be widened).
  Eigen::VectorXd slow(1000);
  for (Eigen::Index k = 0; k < slow.size(); ++k) slow(k) = std::sin(0.003 * static_cast<double>(k));
  ASSERT_TRUE(DecideWidening(slow, {}).widened);
  EXPECT_FALSE(DecideWidening(slow, {2.0 * slow.squaredNorm()}).widened);
}

TEST(AutocorrelationWidening, WidenedFitCarriesTheFactorAndTheEffectiveDegreesOfFreedom) {
  // One group: Cov = f·s²·C and ν = n/f − p (group_covariance.h, from the definitions),
  // so the widened SE is √f times the unwidened one on the same data.
  constexpr int kCount = 200;
  const auto line = MakeAr1Line(kCount, kIntercept, kSlope, kInnovationSigma, 0.8, 7);
  LineFit plain_fit, widened_fit;
  BuildLine(&plain_fit, line);
  BuildLine(&widened_fit, line);
  SolveOptions plain;
  plain.widen_for_autocorrelation = false;
  const FitResult narrow = plain_fit.problem.Solve(plain);
  const FitResult wide = widened_fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(narrow.usable && wide.usable) << narrow.message << wide.message;
  const GroupStatistics& group = wide.groups[0];
  ASSERT_TRUE(group.widened_for_autocorrelation);
  EXPECT_FALSE(narrow.groups[0].widened_for_autocorrelation);
  EXPECT_EQ(narrow.groups[0].variance_inflation, 1.0);
  EXPECT_EQ(group.variance_inflation, group.integrated_autocorrelation_time);
  EXPECT_NEAR(group.effective_num_residuals, kCount / group.variance_inflation, 1e-9);
  EXPECT_NEAR(wide.Get("slope").std_error / narrow.Get("slope").std_error, std::sqrt(group.variance_inflation),
              1e-9);
  EXPECT_NEAR(wide.Get("slope").degrees_of_freedom, group.effective_num_residuals - 2.0, 1e-9);
  EXPECT_NEAR(wide.covariance(0, 1) / narrow.covariance(0, 1), group.variance_inflation, 1e-9);
  EXPECT_EQ(wide.Get("slope").value, narrow.Get("slope").value);  // the estimate itself is untouched
}

struct Coverage {
  double rate = 0.0;
  int widened = 0;
};

Coverage SlopeCoverage(double phi, bool widen, int replicates) {
  Coverage out;
  int covered = 0;
  constexpr int kCount = 200;
  for (int replicate = 0; replicate < replicates; ++replicate) {
    const auto line = MakeAr1Line(kCount, kIntercept, kSlope, kInnovationSigma, phi, 5000 + replicate);
    LineFit fit;
    BuildLine(&fit, line);
    SolveOptions options;
    options.widen_for_autocorrelation = widen;
    const FitResult result = fit.problem.Solve(options);
    if (!result.usable) continue;
    const ParameterEstimate& b = result.Get("slope");
    if (b.ci_low <= kSlope && kSlope <= b.ci_high) ++covered;
    if (result.groups[0].widened_for_autocorrelation) ++out.widened;
  }
  out.rate = static_cast<double>(covered) / replicates;
  return out;
}

constexpr int kReplicates = 200;

TEST(AutocorrelationWidening, RestoresCoverageOfTheSlopeUnderAr1Noise) {
  // AR(1) noise with φ = 0.8 makes the true Var(b̂) about (1+φ)/(1−φ) = 9 times the
  // independent-noise formula (Wilks, from memory), so the plain 95 % interval is a
  // third as wide as it should be and covers about 2Φ(1.97/3) − 1 ≈ 49 %.
  // Bounds: binomial SD of a rate near 0.95 over 200 replicates is 0.015; the
  // widened interval uses an estimated ρ̂ (biased low by ≈ (1+4φ)/n, from memory),
  // so 88–99 % allows for that bias and four binomial SDs.
  const Coverage plain = SlopeCoverage(0.8, false, kReplicates);
  const Coverage widened = SlopeCoverage(0.8, true, kReplicates);
  EXPECT_LT(plain.rate, 0.70) << "plain coverage " << plain.rate;
  EXPECT_GE(widened.rate, 0.88) << "widened coverage " << widened.rate;
  EXPECT_LE(widened.rate, 0.99) << "widened coverage " << widened.rate;
  EXPECT_EQ(widened.widened, kReplicates);  // τ̂ ≈ 9 ≫ threshold (about 1.5 at L ≈ 25) every time
  std::printf("AR(1) phi = 0.8, n = 200: slope coverage %.3f plain, %.3f widened\n", plain.rate, widened.rate);
}

TEST(AutocorrelationWidening, WhiteNoiseIsRarelyWidenedAndStillCovers) {
  // White residuals: τ̂ − 1 is noise of standard error √(2(2L+1)/n) (Madras & Sokal, from
  // memory), so P(above twice that) ≈ 2.3 %: about 5 of 200; 12 is that plus three binomial
  // SDs (√(200·0.023) = 2.1).
  // Coverage stays at its 95 % (Draper & Smith §1.4), ± 3 binomial SDs (0.015).
  const Coverage white = SlopeCoverage(0.0, true, kReplicates);
  EXPECT_LE(white.widened, 12);
  EXPECT_GE(white.rate, 0.905);
  EXPECT_LE(white.rate, 0.995);
  // One seed in full: no group widened, factor exactly 1, n_eff = n.
  const auto line = MakeAr1Line(200, kIntercept, kSlope, kInnovationSigma, 0.0, 77);
  LineFit fit;
  BuildLine(&fit, line);
  const FitResult result = fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(result.usable) << result.message;
  EXPECT_FALSE(result.groups[0].widened_for_autocorrelation) << result.groups[0].lag1_autocorrelation;
  EXPECT_EQ(result.groups[0].variance_inflation, 1.0);
  EXPECT_EQ(result.groups[0].effective_num_residuals, 200.0);
  EXPECT_NEAR(result.Get("slope").degrees_of_freedom, 198.0, 1e-9);  // n − 2, Draper & Smith
}

}  // namespace
}  // namespace coilspin::core

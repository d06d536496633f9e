// The residual moving-block bootstrap (fitters/core/bootstrap.h,
// block_resampling.h): resampling mechanics, percentiles against NumPy's,
// determinism across thread counts, and standard errors against closed forms.

#include <gtest/gtest.h>

#include <chrono>
#include <cmath>
#include <limits>
#include <cstdio>
#include <memory>
#include <random>
#include <vector>

#include "core/ar1_line.h"
#include "fitters/core/block_resampling.h"
#include "fitters/core/bootstrap.h"
#include "fitters/core/least_squares.h"

namespace coilspin::core {
namespace {

using test_support::Ar1SlopeStandardDeviation;
using test_support::BuildLine;
using test_support::LineFit;
using test_support::MakeAr1Line;

using test_support::kInnovationSigma;
constexpr double kIntercept = test_support::kLineIntercept;
constexpr double kSlope = test_support::kLineSlope;

TEST(BlockResampling, BlockLengthFollowsTheRule) {
  // From the rule in block_resampling.h: ℓ = ceil(max(n^{1/3}, 2·τ)), ℓ ≤ n/5.
  EXPECT_EQ(BlockLength(kMinResidualsForBlocks - 1, 9.0), 1);  // a few readings: not by blocks
  EXPECT_EQ(BlockLength(1000, 1.0), 10);                        // white: n^{1/3}
  EXPECT_EQ(BlockLength(1000, 9.0), 18);                        // AR(1) at φ = 0.8: τ = 9, twice it
  EXPECT_EQ(BlockLength(100, 99.0), 100 / kMinBlocksPerGroup);  // capped
}

TEST(BlockResampling, ResampleIsMadeOfContiguousBlocksOfTheOriginal) {
  // Künsch 1989: each block is a run r̂_s … r̂_{s+ℓ−1}. With r̂_k = k every block is a
  // run of consecutive integers starting at some s ≤ n − ℓ.
  constexpr int kCount = 103, kLength = 10;
  Eigen::VectorXd original(kCount);
  for (int k = 0; k < kCount; ++k) original(k) = k;
  std::mt19937_64 generator(ReplicateSeed(kDefaultBootstrapSeed, 3));
  const Eigen::VectorXd drawn = ResampleBlocks(original, kLength, generator);
  ASSERT_EQ(drawn.size(), kCount);
  bool varied = false;
  for (int k = 0; k < kCount; ++k) {
    if (k % kLength == 0) {
      EXPECT_LE(drawn(k), kCount - kLength);
      if (drawn(k) != k) varied = true;
    } else {
      EXPECT_EQ(drawn(k), drawn(k - 1) + 1);
    }
  }
  EXPECT_TRUE(varied);  // not the identity
  // ℓ = n can only return the original series.
  EXPECT_EQ(ResampleBlocks(original, kCount, generator), original);
}

TEST(BlockResampling, UniformIndexIsUniform) {
  // Chi-square goodness of fit over 10 cells, 10⁵ draws: 9 degrees of freedom, the
  // 0.999 quantile is 27.88 (statistics table).
  std::mt19937_64 generator(ReplicateSeed(7, 0));
  constexpr int kCells = 10, kDraws = 100000;
  std::vector<int> counts(kCells, 0);
  for (int k = 0; k < kDraws; ++k) ++counts[UniformIndex(generator, kCells)];
  double chi_square = 0.0;
  const double expected = static_cast<double>(kDraws) / kCells;
  for (int c : counts) chi_square += (c - expected) * (c - expected) / expected;
  EXPECT_LT(chi_square, 27.88);
}

TEST(Bootstrap, PercentilesMatchNumPy) {
  // numpy.percentile (linear, Hyndman & Fan type 7): [1..10] at 10/90 % → 1.9, 9.1;
  // [3,1,4,1,5,9,2] at 2.5/97.5 % → 1.0, 8.4 (computed with NumPy 1.24).
  std::vector<double> ten;
  for (int k = 1; k <= 10; ++k) ten.push_back(k);
  const PercentileBounds a = Percentiles(ten, 0.8);
  EXPECT_NEAR(a.low, 1.9, 1e-12);
  EXPECT_NEAR(a.high, 9.1, 1e-12);
  const PercentileBounds b = Percentiles({3, 1, 4, 1, 5, 9, 2}, 0.95);
  EXPECT_NEAR(b.low, 1.0, 1e-12);
  EXPECT_NEAR(b.high, 8.4, 1e-12);
}

TEST(Bootstrap, WhiteNoiseStandardErrorMatchesTheClosedForm) {
  // Draper & Smith §1.4: se(b) = s/√Sxx. The residual bootstrap estimates it with
  // a factor √((n − 2)/n) (its residuals have RSS/n variance; Efron & Tibshirani
  // 1993 §9.5 — from memory), 0.98 for n = 50, and a Monte-Carlo error of
  // 1/√(2B) = 3.5 % for B = 400; 15 % is about four of those.
  constexpr int kCount = 50;
  const auto line = MakeAr1Line(kCount, kIntercept, kSlope, kInnovationSigma, 0.0, 21);
  LineFit fit;
  BuildLine(&fit, line);
  const FitResult full = fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(full.usable) << full.message;
  ASSERT_FALSE(full.groups[0].widened_for_autocorrelation);
  BootstrapOptions options;
  options.replicates = 400;
  const auto start = std::chrono::steady_clock::now();
  const BootstrapResult boot = Bootstrap(fit.problem, full, options);
  const double seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  ASSERT_TRUE(boot.usable) << boot.message;
  EXPECT_EQ(boot.failed, 0);
  EXPECT_EQ(boot.replicates.size(), 400u);
  const ParameterEstimate& slope = boot.Get("slope");
  EXPECT_EQ(slope.value, full.Get("slope").value);
  EXPECT_NEAR(slope.std_error / full.Get("slope").std_error, 1.0, 0.15);
  // The percentile interval contains the estimate and is about ±1.96 SE wide (normal errors).
  EXPECT_LT(slope.ci_low, slope.value);
  EXPECT_GT(slope.ci_high, slope.value);
  EXPECT_NEAR((slope.ci_high - slope.ci_low) / (2.0 * 1.959964 * slope.std_error), 1.0, 0.15);
  // The caller's problem is untouched: solving it again gives the same answer.
  const FitResult again = fit.problem.Solve(SolveOptions());
  EXPECT_EQ(again.Get("slope").value, full.Get("slope").value);
  std::printf("white noise n = 50: bootstrap/analytic SE %.3f, %.2f ms per replicate\n",
              slope.std_error / full.Get("slope").std_error, 1e3 * seconds / options.replicates);
}

TEST(Bootstrap, SameSeedGivesTheSameReplicatesOnAnyNumberOfThreads) {
  // common practice (determinism, style.md habit 13): each replicate depends on (seed, b) only.
  const auto line = MakeAr1Line(60, kIntercept, kSlope, kInnovationSigma, 0.5, 22);
  LineFit fit;
  BuildLine(&fit, line);
  const FitResult full = fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(full.usable) << full.message;
  BootstrapOptions options;
  options.replicates = 40;
  options.threads = 1;
  const BootstrapResult one = Bootstrap(fit.problem, full, options);
  options.threads = 2;
  const BootstrapResult two = Bootstrap(fit.problem, full, options);
  ASSERT_TRUE(one.usable && two.usable);
  EXPECT_EQ(one.replicates, two.replicates);
  EXPECT_EQ(one.replicate_numbers, two.replicate_numbers);
  options.seed = kDefaultBootstrapSeed + 1;
  const BootstrapResult other = Bootstrap(fit.problem, full, options);
  EXPECT_NE(one.replicates, other.replicates);
}

TEST(Bootstrap, BlocksWidenTheStandardErrorUnderAr1Noise) {
  // AR(1), φ = 0.8, n = 200: the true SD of b̂ is the exact cᵀΣc of ar1_line.h, about
  // 2.9 times the independent-noise Wald SE. The block bootstrap keeps the dependence
  // within ℓ ≈ 19 samples and so recovers most of it; moving-block variance estimates
  // are biased low by O(1/ℓ) (Künsch 1989), and one series of n_eff ≈ 22 gives its SE
  // to about ±20 %. Averaged over 6 series: the bootstrap SE is at least 1.8 times the
  // naive one and within 35 % of the truth, which the naive one misses by about 65 %
  // (measured: naive/true 0.34, bootstrap/true 0.90).
  constexpr int kCount = 200, kSeries = 6;
  const double truth = Ar1SlopeStandardDeviation(kCount, kInnovationSigma, 0.8);
  double naive = 0.0, boot = 0.0;
  for (int s = 0; s < kSeries; ++s) {
    const auto line = MakeAr1Line(kCount, kIntercept, kSlope, kInnovationSigma, 0.8, 300 + s);
    LineFit fit;
    BuildLine(&fit, line);
    SolveOptions plain;
    plain.widen_for_autocorrelation = false;
    const FitResult full = fit.problem.Solve(plain);
    ASSERT_TRUE(full.usable) << full.message;
    BootstrapOptions options;
    options.replicates = 100;
    options.seed = kDefaultBootstrapSeed + s;
    const BootstrapResult result = Bootstrap(fit.problem, full, options);
    ASSERT_TRUE(result.usable) << result.message;
    EXPECT_GT(result.block_lengths[0], 10);
    naive += full.Get("slope").std_error / kSeries;
    boot += result.Get("slope").std_error / kSeries;
  }
  EXPECT_GT(boot / naive, 1.8);
  EXPECT_NEAR(boot / truth, 1.0, 0.35);
  EXPECT_LT(std::abs(boot / truth - 1.0), std::abs(naive / truth - 1.0));
  std::printf("AR(1) phi = 0.8, n = 200: naive/true %.3f, bootstrap/true %.3f\n", naive / truth, boot / truth);
}

TEST(Bootstrap, AFewPlateauMeansKeepTheirSpread) {
  // Six readings of a line, two parameters: resampling the raw residuals with replacement
  // gives a variance of about (n − p)/n = 2/3 of the truth (E r̂² = σ²(1 − h), Davison &
  // Hinkley §6.2.3 — from memory), the percentile interval then covers about 2Φ(1.96·√(2/3)) − 1
  // = 89 % before the t quantile's stretch. The wild bootstrap of r̂/√(1 − h) gives Var(b̂)
  // itself: averaged over 60 such lines the bootstrap variance is within 15 % of the exact
  // σ²/Sxx (Draper & Smith §1.4) — Monte Carlo error of a variance from 200 replicates
  // √(2/200) = 10 % per line, a third of that over 60 lines, plus the spread of s² itself.
  constexpr int kCount = 6, kLines = 60;
  double ratio = 0.0;
  for (int s = 0; s < kLines; ++s) {
    const auto line = MakeAr1Line(kCount, kIntercept, kSlope, kInnovationSigma, 0.0, 700 + s);
    LineFit fit;
    BuildLine(&fit, line);
    const FitResult full = fit.problem.Solve(SolveOptions());
    ASSERT_TRUE(full.usable) << full.message;
    BootstrapOptions options;
    options.replicates = 200;
    options.seed = kDefaultBootstrapSeed + s;
    const BootstrapResult boot = Bootstrap(fit.problem, full, options);
    ASSERT_TRUE(boot.usable) << boot.message;
    EXPECT_EQ(boot.block_lengths[0], 0);  // a wild group
    double sxx = 0.0, mean = 0.0;
    for (double x : line.x) mean += x / kCount;
    for (double x : line.x) sxx += (x - mean) * (x - mean);
    const double exact = kInnovationSigma * kInnovationSigma / sxx;  // Var(b̂) = σ²/Sxx, white noise
    ratio += boot.Get("slope").std_error * boot.Get("slope").std_error / exact / kLines;
  }
  EXPECT_NEAR(ratio, 1.0, 0.15) << "bootstrap variance / exact";
  std::printf("six-point lines: wild bootstrap variance / exact %.3f\n", ratio);
}

TEST(Bootstrap, SmallSampleStretchIsTOverZ) {
  // t_{0.975, 4} = 2.776445 and z_{0.975} = 1.959964 (statistical tables; SciPy t.ppf, norm.ppf).
  EXPECT_NEAR(SmallSampleStretch(4.0, 0.95), 2.776445 / 1.959964, 1e-6);
  EXPECT_EQ(SmallSampleStretch(std::numeric_limits<double>::infinity(), 0.95), 1.0);
  EXPECT_EQ(SmallSampleStretch(std::numeric_limits<double>::quiet_NaN(), 0.95), 1.0);
}

TEST(Bootstrap, DerivedQuantityAndProgress) {
  // A derived quantity's percentile interval is that of g(θ*_b) (Efron & Tibshirani ch. 13):
  // for g = 2·slope it is exactly twice the slope's; progress ends with done == total.
  const auto line = MakeAr1Line(40, kIntercept, kSlope, kInnovationSigma, 0.0, 23);
  LineFit fit;
  BuildLine(&fit, line);
  const FitResult full = fit.problem.Solve(SolveOptions());
  ASSERT_TRUE(full.usable) << full.message;
  BootstrapOptions options;
  options.replicates = 50;
  int calls = 0, last_done = -1, last_total = -1;
  options.progress = [&](ProgressStage stage, int done, int total) {
    EXPECT_EQ(stage, ProgressStage::kBootstrapReplicates);
    EXPECT_GE(done, last_done);
    ++calls;
    last_done = done;
    last_total = total;
  };
  const BootstrapResult result = Bootstrap(fit.problem, full, options);
  ASSERT_TRUE(result.usable);
  EXPECT_GE(calls, 1);
  EXPECT_EQ(last_done, 50);
  EXPECT_EQ(last_total, 50);
  const std::vector<double> values = fit.problem.Values();
  const ParameterEstimate doubled = BootstrapQuantity(
      result, "twice slope", values, [](const std::vector<double>& v) { return 2.0 * v[1]; }, 0.95);
  EXPECT_NEAR(doubled.value, 2.0 * full.Get("slope").value, 1e-15);
  EXPECT_NEAR(doubled.ci_low, 2.0 * result.Get("slope").ci_low, 1e-15);
  EXPECT_NEAR(doubled.ci_high, 2.0 * result.Get("slope").ci_high, 1e-15);
  EXPECT_NEAR(doubled.std_error, 2.0 * result.Get("slope").std_error, 1e-15);
}

TEST(BootstrapOptions, BadValuesAreRejected) {
  BootstrapOptions options;
  std::string error;
  EXPECT_TRUE(options.IsValid(&error)) << error;
  options.replicates = kMinimumBootstrapReplicates - 1;
  EXPECT_FALSE(options.IsValid(&error));
  options = BootstrapOptions();
  options.threads = -1;
  EXPECT_FALSE(options.IsValid(&error));
  options = BootstrapOptions();
  options.confidence = 1.0;
  EXPECT_FALSE(options.IsValid(&error));
}

}  // namespace
}  // namespace coilspin::core

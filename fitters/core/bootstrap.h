#pragma once
// Residual moving-block bootstrap of a fitted LeastSquaresProblem.
//
// What is estimated. The sampling distribution of θ̂, by refitting data that
// could have been measured: for replicate b and each group g, with r̂_g the
// unweighted residuals at the full fit θ̂ (ŷ = y − r̂), draw r*_g by moving
// blocks of length ℓ_g (block_resampling.h) and fit y* = ŷ + r*_g. The
// caller's data are never touched: the replicate is the same problem with
// residual offsets δ_g = r*_g − r̂_g, because y* − f(θ) = (y − f(θ)) + δ_g.
// Each replicate starts from θ̂, keeps the full fit's σ_g (no re-estimation)
// and its loss, and its solution θ*_b is kept when the solver converges.
//
// Intervals. Percentile intervals: the (1−c)/2 and (1+c)/2 quantiles of the
// θ*_b (Efron & Tibshirani, An Introduction to the Bootstrap, 1993, ch. 13),
// with linear interpolation between order statistics (Hyndman & Fan, Amer.
// Statist. 50, 1996, type 7 — the default of R and NumPy). std_error is the
// standard deviation of the θ*_b. Any derived quantity g(θ) gets its interval
// the same way from g(θ*_b) (BootstrapQuantity), with no linearisation.
//
// When it is right. Residuals that are stationary and dependent over a range
// much shorter than the series (blocks keep the dependence within ℓ); it needs
// no normality and no linear model. When it breaks. Few residuals per group
// (a plateau mean of three readings has three values to resample), dependence
// longer than ℓ (under-covers like Wald), noise whose size changes along the
// series (residuals from a quiet part land in a noisy one), an estimate on a
// bound (replicates pile up on it), and a model misfit, which the residuals
// carry into every replicate. Percentile intervals of B = 200 replicates have
// a Monte-Carlo error of roughly 10 % in their width.
//
// Threads and determinism. Replicates run on `threads` threads, each on its
// own Clone() of the problem; replicate b depends only on (seed, b), so the
// result is identical for any thread count. The core never prints: progress
// goes to the optional callback (progress.h), called on the calling thread.

#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "fitters/core/progress.h"

namespace coilspin::core {

// Default seed: any fixed value makes runs reproducible; this one spells the year
// the moving-block bootstrap was published (Künsch 1989; common practice).
inline constexpr std::uint64_t kDefaultBootstrapSeed = 1989;

// Fewer replicates than this cannot place a 90 % percentile interval between
// distinct order statistics (common practice; B ≥ 200 for 95 % intervals,
// Efron & Tibshirani 1993 ch. 13 — from memory).
inline constexpr int kMinimumBootstrapReplicates = 10;

struct BootstrapOptions {
  int replicates = 200;
  std::uint64_t seed = kDefaultBootstrapSeed;
  int threads = 0;            // 0: std::thread::hardware_concurrency()
  double confidence = 0.95;   // two-sided percentile level c
  // ProgressStage::kBootstrapReplicates, on the calling thread while replicates
  // run (a few times a second) and once at the end with done == total; empty: silent.
  Progress progress;

  bool IsValid(std::string* error) const;
};

struct BootstrapResult {
  bool usable = false;        // at least kMinimumBootstrapReplicates replicates converged
  std::string message;        // why not usable, or how many failed
  // θ*_b in physical units, every parameter in the order added; converged
  // replicates only, in order of b (replicate_numbers gives each one's b).
  std::vector<std::vector<double>> replicates;
  std::vector<int> replicate_numbers;
  int failed = 0;
  std::vector<int> block_lengths;  // ℓ_g per group
  // Percentile intervals: value = full-fit estimate, std_error = SD of the
  // replicates, degrees_of_freedom NaN (not a t interval); fixed ones as in FitResult.
  std::vector<ParameterEstimate> parameters;

  const ParameterEstimate& Get(const std::string& name) const;  // asserts the name exists
};

// Bootstraps `fit`, which must be the result of problem.Solve (its values, σ_g
// and options are used). `problem` is only cloned, never changed; offsets
// already set on it are replaced by the replicates' own.
BootstrapResult Bootstrap(const LeastSquaresProblem& problem, const FitResult& fit,
                          const BootstrapOptions& options);

// Percentile interval [low, high] of `samples` at level c (type 7 quantiles).
struct PercentileBounds {
  double low = 0.0;
  double high = 0.0;
};
PercentileBounds Percentiles(std::vector<double> samples, double confidence);

// A derived quantity g(θ): value g(θ̂) at the full fit, std_error and percentile
// interval from g(θ*_b) over the replicates. `full_fit_values` are the fit's
// parameter values in the order added.
// The stretch of a percentile interval whose quantity the Wald fit gives ν
// degrees of freedom: k = t_{(1+c)/2, ν}/z_{(1+c)/2}, 1 when ν is infinite or NaN.
// The percentile interval of a few plateau means has the normal's width around
// the replicates' spread; the estimate's own reference distribution, with the
// noise level estimated from a handful of residuals, is Student's t (the
// "expanded percentile interval", Hesterberg, Amer. Statist. 69, 2015 — from
// memory). Measured on the bootstrap benches of docs/coverage.md.
double SmallSampleStretch(double degrees_of_freedom, double confidence);

ParameterEstimate BootstrapQuantity(const BootstrapResult& result, const std::string& name,
                                    const std::vector<double>& full_fit_values,
                                    const std::function<double(const std::vector<double>&)>& quantity,
                                    double confidence);

}  // namespace coilspin::core

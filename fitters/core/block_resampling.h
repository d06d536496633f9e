#pragma once
// Moving-block resampling of one group's residuals (Künsch, Ann. Statist.
// 17(3):1217–1241, 1989), the random numbers behind it, and the block length.
//
// Resampling. From residuals r̂_1 … r̂_n and a block length ℓ, draw block
// starts s uniformly from 0 … n − ℓ, append r̂_s … r̂_{s+ℓ−1} until n values
// are collected and cut the last block short. Blocks keep the dependence
// within ℓ samples; ℓ = 1 is the ordinary (Efron) bootstrap of independent
// residuals. The ends of the series fall into fewer blocks than the middle
// (the price of the moving-block scheme; the circular scheme of Politis &
// Romano, 1992, avoids it), negligible for n ≫ ℓ.
//
// Block length. For a group of n ≥ kMinResidualsForBlocks residuals whose own
// integrated autocorrelation time is τ (autocorrelation_widening.h, the estimate
// the Wald widening uses),
//     ℓ = ceil( max(n^{1/3}, kBlockLengthPerTau·τ) ),   ℓ ≤ n / kMinBlocksPerGroup.
// A moving-block variance under-counts the dependence beyond a block by about
// τ_c/ℓ of it (τ_c the correlation's decay time, about τ/2 for AR(1) noise; the
// bias of a Bartlett-weighted long-run variance, Künsch 1989 — from memory), while
// long blocks leave few of them to draw from and the variance estimate noisy:
// two τ measured best on a line with AR(1) noise (n = 200, φ = 0.8: bootstrap SE
// 0.90 of the true spread at 2τ, 0.80 at 5τ); n^{1/3} is the rate that minimises the
// variance estimate's error when τ is small (Hall, Horowitz & Jing, Biometrika 82,
// 1995 — from memory). The first version chose ℓ from the lag-1 correlation with
// the AR(1) rule of Politis & White (2004): on a coast whose slow misfit decays over
// thousands of samples it picked blocks of 0.6 s and gained nothing. Groups of
// fewer residuals (plateau means, a few readings) are not resampled by blocks: the
// wild bootstrap (WildResample) draws each residual's sign instead.
//
// Small groups. Resampling a handful of plateau means with replacement shrinks
// their spread twice: the fit has already spent p of their n degrees of freedom
// (E r̂_k² = σ²(1 − h_k), h_k the leverage) and a resample repeats some and drops
// others. The bootstrap resamples the rescaled residuals r̂_k/√(1 − h_k) (Davison &
// Hinkley, Bootstrap Methods and their Application, 1997, §6.2.3 — from memory),
// and in a small group keeps each where it is with a random sign, r*_k = r̃_k·v_k,
// v_k = ±1 with probability ½ (the wild bootstrap; Wu, Ann. Statist. 14, 1986;
// Rademacher weights, Liu 1988 — from memory), so a plateau keeps its own noise.
//
// Random numbers. Each replicate b draws from its own std::mt19937_64 seeded
// with SplitMix64(seed + b·golden ratio) (Steele, Lea & Flood, OOPSLA 2014),
// and indices come from rejection sampling on the raw 64-bit output rather
// than std::uniform_int_distribution, whose algorithm the standard leaves to
// the library: the same seed gives the same replicates on every platform and
// for any number of threads.

#include <Eigen/Dense>
#include <cstdint>
#include <random>
#include <vector>

namespace coilspin::core {

// Below this many residuals a group is resampled one by one (ℓ = 1); the same
// count below which ρ̂₁ is mostly noise (autocorrelation_widening.h, common practice).
inline constexpr int kMinResidualsForBlocks = 30;

// At least this many blocks per group, or resampling can only reshuffle a few
// large pieces and the bootstrap variance collapses (common practice).
inline constexpr int kMinBlocksPerGroup = 5;

// Blocks are at least this many integrated autocorrelation times long (above; measured).
inline constexpr double kBlockLengthPerTau = 2.0;

int BlockLength(int num_residuals, double integrated_autocorrelation_time);

// The 64-bit golden-ratio increment of SplitMix64 (Steele, Lea & Flood 2014).
inline constexpr std::uint64_t kGoldenGamma = 0x9E3779B97F4A7C15ULL;

std::uint64_t SplitMix64(std::uint64_t state);
std::uint64_t ReplicateSeed(std::uint64_t seed, int replicate);

// Uniform integer in [0, bound), bound > 0, the same on every platform.
std::uint64_t UniformIndex(std::mt19937_64& generator, std::uint64_t bound);

// One moving-block resample r* of `residuals` (same length).
Eigen::VectorXd ResampleBlocks(const Eigen::VectorXd& residuals, int block_length, std::mt19937_64& generator);

// One wild resample: each residual times an independent random sign.
Eigen::VectorXd WildResample(const Eigen::VectorXd& residuals, std::mt19937_64& generator);

}  // namespace coilspin::core

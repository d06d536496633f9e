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
// Block length. For a group of n ≥ kMinResidualsForBlocks residuals with
// lag-1 autocorrelation ρ (clipped to [0, kMaxBlockAutocorrelation]),
//     ℓ = ceil( n^{1/3} · max(1, (6ρ²/(1 − ρ²)²)^{1/3}) ),   ℓ ≤ n / kMinBlocksPerGroup,
// the n^{1/3} growth that minimises the mean squared error of a block
// bootstrap variance (Künsch 1989; Hall, Horowitz & Jing, Biometrika 82,
// 1995 — from memory), with the AR(1) constant of the automatic rule of
// Politis & White (Econometric Reviews 23, 2004), b = (2G²/D)^{1/3}·n^{1/3}
// with G = Σ|k|γ_k, D = (4/3)(Σγ_k)², which for γ_k = ρ^|k| is
// (6ρ²/(1 − ρ²)²)^{1/3} (derived here; the rule itself from memory). It is
// never taken below n^{1/3}, so an underestimated ρ still keeps short-range
// dependence. Groups of fewer residuals (plateau means, a few readings) are
// resampled one by one, ℓ = 1: with so few there is no dependence to keep.
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

// ρ is clipped here for the length rule: at ρ → 1 the rule diverges; 0.99 gives a
// factor 25 on n^{1/3}, already more than kMinBlocksPerGroup allows for n < 10⁵ (common practice).
inline constexpr double kMaxBlockAutocorrelation = 0.99;

// At least this many blocks per group, or resampling can only reshuffle a few
// large pieces and the bootstrap variance collapses (common practice).
inline constexpr int kMinBlocksPerGroup = 5;

int BlockLength(int num_residuals, double lag1_autocorrelation);

// The 64-bit golden-ratio increment of SplitMix64 (Steele, Lea & Flood 2014).
inline constexpr std::uint64_t kGoldenGamma = 0x9E3779B97F4A7C15ULL;

std::uint64_t SplitMix64(std::uint64_t state);
std::uint64_t ReplicateSeed(std::uint64_t seed, int replicate);

// Uniform integer in [0, bound), bound > 0, the same on every platform.
std::uint64_t UniformIndex(std::mt19937_64& generator, std::uint64_t bound);

// One moving-block resample r* of `residuals` (same length).
Eigen::VectorXd ResampleBlocks(const Eigen::VectorXd& residuals, int block_length, std::mt19937_64& generator);

}  // namespace coilspin::core

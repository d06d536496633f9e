#include "fitters/core/block_resampling.h"

#include <algorithm>
#include <cmath>

#include "fitters/core/require.h"

namespace coilspin::core {

int BlockLength(int num_residuals, double lag1_autocorrelation) {
  if (num_residuals < kMinResidualsForBlocks) return 1;
  const double n = static_cast<double>(num_residuals);
  const double rho = std::clamp(std::isfinite(lag1_autocorrelation) ? lag1_autocorrelation : 0.0, 0.0,
                                kMaxBlockAutocorrelation);
  const double dependence = std::cbrt(6.0 * rho * rho / ((1.0 - rho * rho) * (1.0 - rho * rho)));
  const int length = static_cast<int>(std::ceil(std::cbrt(n) * std::max(1.0, dependence)));
  return std::clamp(length, 1, std::max(1, num_residuals / kMinBlocksPerGroup));
}

std::uint64_t SplitMix64(std::uint64_t state) {
  // Steele, Lea & Flood 2014, the finaliser of SplitMix64 (constants from the paper).
  std::uint64_t z = state + kGoldenGamma;
  z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ULL;
  z = (z ^ (z >> 27)) * 0x94D049BB133111EBULL;
  return z ^ (z >> 31);
}

std::uint64_t ReplicateSeed(std::uint64_t seed, int replicate) {
  return SplitMix64(seed + kGoldenGamma * static_cast<std::uint64_t>(replicate));
}

std::uint64_t UniformIndex(std::mt19937_64& generator, std::uint64_t bound) {
  Require(bound > 0, "UniformIndex: the bound must be positive");
  // Values below 2⁶⁴ mod bound would make the low residues more likely; reject them.
  const std::uint64_t rejected = (0 - bound) % bound;
  while (true) {
    const std::uint64_t value = generator();
    if (value >= rejected) return value % bound;
  }
}

Eigen::VectorXd ResampleBlocks(const Eigen::VectorXd& residuals, int block_length, std::mt19937_64& generator) {
  const Eigen::Index n = residuals.size();
  Require(block_length >= 1 && block_length <= std::max<Eigen::Index>(n, 1),
          "ResampleBlocks: the block length must lie in 1 … n");
  Eigen::VectorXd out(n);
  const auto starts = static_cast<std::uint64_t>(n - block_length + 1);
  Eigen::Index filled = 0;
  while (filled < n) {
    const auto start = static_cast<Eigen::Index>(UniformIndex(generator, starts));
    const Eigen::Index count = std::min<Eigen::Index>(block_length, n - filled);
    out.segment(filled, count) = residuals.segment(start, count);
    filled += count;
  }
  return out;
}

}  // namespace coilspin::core

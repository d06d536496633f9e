#include "fitters/core/block_resampling.h"

#include <algorithm>
#include <cmath>

#include "fitters/core/require.h"

namespace coilspin::core {

int BlockLength(int num_residuals, double integrated_autocorrelation_time) {
  if (num_residuals < kMinResidualsForBlocks) return 1;
  const double n = static_cast<double>(num_residuals);
  const double tau = std::isfinite(integrated_autocorrelation_time) ? integrated_autocorrelation_time : 1.0;
  const int length = static_cast<int>(std::ceil(std::max(std::cbrt(n), kBlockLengthPerTau * tau)));
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

Eigen::VectorXd WildResample(const Eigen::VectorXd& residuals, std::mt19937_64& generator) {
  Eigen::VectorXd out(residuals.size());
  for (Eigen::Index k = 0; k < residuals.size(); ++k)
    out(k) = (generator() >> 63) != 0 ? residuals(k) : -residuals(k);  // v_k = ±1, the top bit
  return out;
}

}  // namespace coilspin::core

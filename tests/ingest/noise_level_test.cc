// The noise of a logged channel (src/ingest/noise_level.h) on the signals of
// real benches: coloured AR(1) noise on a level, a ramp and an exponential
// coast; a coarse ADC; and its lag-1 correlation.

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "src/ingest/noise_level.h"

namespace coilspin {
namespace {

// x_k = shape(k) + AR(1) noise of marginal σ and lag-1 correlation φ, stationary from the start.
std::vector<double> WithAr1Noise(std::size_t n, double sigma, double phi, unsigned seed, double (*shape)(std::size_t)) {
  std::mt19937_64 generator(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  std::vector<double> x(n);
  double e = sigma * normal(generator);
  for (std::size_t k = 0; k < n; ++k) {
    if (k > 0) e = phi * e + sigma * std::sqrt(1.0 - phi * phi) * normal(generator);
    x[k] = shape(k) + e;
  }
  return x;
}

double Level(std::size_t) { return 300.0; }
double Ramp(std::size_t k) { return 300.0 - 0.01 * static_cast<double>(k); }
double Coast(std::size_t k) { return 300.0 * std::exp(-static_cast<double>(k) / 20000.0); }
double Staircase(std::size_t k) { return 2.0 * static_cast<double>(k / 2000); }

TEST(NoiseLevel, MarginalSigmaOfColouredNoiseOnTheSignalsOfABench) {
  // MAD of 2·10⁴ second differences: relative standard error ≈ 1.1/√n ≈ 1 % (efficiency of the
  // MAD, statistics handbook); the lag where σ_m levels off still holds a little correlation
  // (6 − 8ρ_m + 2ρ_2m at m ≈ 4/(1 − φ)): 10 % covers both.
  for (double phi : {0.0, 0.8, 0.95})
    for (auto shape : {Level, Ramp, Coast}) {
      const ChannelNoise noise = EstimateChannelNoise(WithAr1Noise(20000, 0.2, phi, 7, shape));
      EXPECT_NEAR(noise.sigma / 0.2, 1.0, 0.10) << "phi " << phi;
      // φ from σ_1/σ: its error grows as φ → 1 (σ_1 → 0); 0.05 absolute.
      EXPECT_NEAR(noise.lag1, phi, 0.05) << "phi " << phi;
    }
  // A staircase (levels of 10 σ every 2000 samples): the lags that strongly coloured noise
  // needs take in the edges, 2m of every 2000 second differences, so σ reads high there;
  // never low, and within 50 %.
  for (double phi : {0.0, 0.8, 0.95}) {
    const ChannelNoise noise = EstimateChannelNoise(WithAr1Noise(20000, 0.2, phi, 7, Staircase));
    EXPECT_GT(noise.sigma / 0.2, 0.9) << "phi " << phi;
    EXPECT_LT(noise.sigma / 0.2, 1.5) << "phi " << phi;
  }
  // The first-difference estimate alone is √(1 − φ) of σ: a third at φ = 0.9 (the header).
  const ChannelNoise coloured = EstimateChannelNoise(WithAr1Noise(20000, 0.2, 0.9, 8, Level));
  EXPECT_NEAR(coloured.white_sigma / 0.2, std::sqrt(1.0 - 0.9), 0.05);
}

TEST(NoiseLevel, CoarseAdcGivesItsStep) {
  // 10 mV steps over 5 mV of white noise: most first differences are exactly 0.
  std::vector<double> x = WithAr1Noise(20000, 0.005, 0.0, 9, Level);
  for (double& v : x) v = 0.01 * std::round(v / 0.01);
  const ChannelNoise noise = EstimateChannelNoise(x);
  EXPECT_NEAR(noise.step, 0.01, 1e-9);
  // σ of the logged reading: √(σ² + q²/12) = 5.7 mV (uniform rounding, statistics handbook),
  // but never below q/√12 = 2.9 mV.
  EXPECT_GE(noise.sigma, 0.01 / std::sqrt(12.0));
  EXPECT_NEAR(noise.sigma / std::sqrt(0.005 * 0.005 + 0.01 * 0.01 / 12.0), 1.0, 0.25);
  // A constant, quantised channel: no noise to see, the step's rounding is the floor.
  const ChannelNoise flat = EstimateChannelNoise(std::vector<double>(1000, 0.01));
  EXPECT_EQ(flat.step, 0.0);  // it never changes: no step can be seen
  EXPECT_EQ(flat.sigma, 0.0);
}

}  // namespace
}  // namespace coilspin

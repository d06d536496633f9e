// A real sensor's artefacts (src/model/sensor_chain.h): each checked against its
// definition over a long series, with the sampling error of the statistic named.

#include "src/model/sensor_chain.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <cstdint>
#include <stdexcept>
#include <vector>

#include "src/model/ar1_noise.h"
#include "src/model/bench_noise.h"
#include "src/model/measurement_noise.h"
#include "src/model/noise_streams.h"
#include "src/units/constants.h"
#include "model/series_moments.h"

namespace coilspin::model {
namespace {

// Sampling error bounds at four standard errors (common practice: a fixed seed
// makes the test deterministic; a correct generator fails 4 SE by chance < 1e-4).
constexpr double kStandardErrors = 4.0;
constexpr std::uint64_t kSeed = 20261203;
const SensorStreams kStreams{kCurrentNoiseStream, kCurrentDropoutStream, kCurrentSpikeStream};

std::vector<double> Noise(std::size_t n, double sigma, double phi) {
  std::vector<double> channel(n, 0.0);
  SensorArtefacts sensor;
  sensor.noise_lag1_correlation = phi;
  ApplySensor(channel, sigma, 0.0, sensor, kSeed, kStreams, "current");
  return channel;
}

TEST(SensorChain, Ar1NoiseHasTheRequestedSigmaAndLag1Correlation) {
  constexpr std::size_t kSamples = 200000;
  constexpr double kSigma = 0.01;
  const double n = kSamples;
  for (double phi : {0.5, 0.8, 0.9, 0.95, -0.6}) {
    const Moments m = MomentsOf(Noise(kSamples, kSigma, phi));
    // Bartlett's formula for the sampling variance of autocorrelations (Bartlett 1946; Box,
    // Jenkins & Reinsel, Time Series Analysis, eq. 2.1.13), for an AR(1) process of lag-1
    // correlation φ: Var r1 ≈ (1 − φ²)/n.
    EXPECT_NEAR(m.lag1, phi, kStandardErrors * std::sqrt((1.0 - phi * phi) / n)) << "phi " << phi;
    // The same formula at lag 0 (Var of the sample variance, Gaussian process): Var s² ≈
    // (2σ⁴/n)·Σ_k ρ_k² = (2σ⁴/n)·(1 + φ²)/(1 − φ²), so SE(s)/σ ≈ √((1 + φ²)/(2n(1 − φ²))).
    EXPECT_NEAR(m.std_dev / kSigma, 1.0, kStandardErrors * std::sqrt((1.0 + phi * phi) / (2.0 * n * (1.0 - phi * phi))))
        << "phi " << phi;
    // Variance of the mean of an AR(1) series: (σ²/n)·(1 + φ)/(1 − φ) (Box, Jenkins & Reinsel, §2.1.5).
    EXPECT_NEAR(m.mean, 0.0, kStandardErrors * kSigma * std::sqrt((1.0 + phi) / ((1.0 - phi) * n))) << "phi " << phi;
  }
}

TEST(SensorChain, Ar1NoiseIsStationaryFromTheFirstSample) {
  // Across many independent series (one per seed), e_0, e_1 and e_20 each have variance σ²
  // and corr(e_0, e_1) = φ: no start-up transient. Sampling errors of Gaussian statistics over
  // m draws (common practice): SE(s²/σ²) = √(2/m), SE(correlation) ≈ (1 − φ²)/√m.
  constexpr int kSeries = 20000;
  constexpr double kSigma = 2.0, kPhi = 0.9;
  double sum0 = 0.0, sum1 = 0.0, sum20 = 0.0, sum01 = 0.0;
  for (int s = 0; s < kSeries; ++s) {
    Ar1Noise noise(static_cast<std::uint64_t>(s), kSpeedNoiseStream, kSigma, kPhi);
    const double e0 = noise.Next(), e1 = noise.Next();
    double e20 = e1;
    for (int k = 2; k <= 20; ++k) e20 = noise.Next();
    sum0 += e0 * e0;
    sum1 += e1 * e1;
    sum20 += e20 * e20;
    sum01 += e0 * e1;
  }
  const double m = kSeries, variance = kSigma * kSigma;
  for (double sum : {sum0, sum1, sum20}) EXPECT_NEAR(sum / m / variance, 1.0, kStandardErrors * std::sqrt(2.0 / m));
  EXPECT_NEAR(sum01 / std::sqrt(sum0 * sum1), kPhi, kStandardErrors * (1.0 - kPhi * kPhi) / std::sqrt(m));
}

TEST(SensorChain, WhiteNoiseIsTheOldMeasurementNoiseBitForBit) {
  // src/model/measurement_noise.h: x_logged = q(x + σ·z) from the channel's stream
  std::vector<double> channel(5000);
  for (std::size_t k = 0; k < channel.size(); ++k) channel[k] = std::sin(0.01 * static_cast<double>(k));
  std::vector<double> expected = channel;
  MeasurementNoise deviates(kSeed, kStreams.noise);
  for (double& x : expected) x = Quantise(x + 0.003 * deviates.StandardNormal(), 0.002);
  ApplySensor(channel, 0.003, 0.002, SensorArtefacts{}, kSeed, kStreams, "current");
  EXPECT_EQ(channel, expected);
}

TEST(SensorChain, ZeroOffsetIsAddedToEveryReadingBeforeTheAdc) {
  // definition (src/model/bench_artefacts.h): reading = q(x + o)
  std::vector<double> channel(1000);
  for (std::size_t k = 0; k < channel.size(); ++k) channel[k] = 0.37 * std::cos(0.02 * static_cast<double>(k));
  const std::vector<double> exact = channel;
  SensorArtefacts sensor;
  sensor.zero_offset = 0.0123;
  std::vector<double> offset = channel, quantised = channel;
  ApplySensor(offset, 0.0, 0.0, sensor, kSeed, kStreams, "current");
  ApplySensor(quantised, 0.0, 0.01, sensor, kSeed, kStreams, "current");
  for (std::size_t k = 0; k < exact.size(); ++k) {
    ASSERT_EQ(offset[k], exact[k] + 0.0123) << k;
    ASSERT_EQ(quantised[k], Quantise(exact[k] + 0.0123, 0.01)) << k;
  }
}

TEST(SensorChain, DropoutsReadZeroAtTheRequestedRateAndLeaveTheNoiseAlone) {
  constexpr std::size_t kSamples = 200000;
  constexpr double kRate = 1.0 / 1500.0;
  std::vector<double> clean(kSamples, 5.0);
  std::vector<double> noisy = clean, dropped = clean;
  SensorArtefacts sensor;
  sensor.noise_lag1_correlation = 0.9;
  ApplySensor(noisy, 0.01, 0.0, sensor, kSeed, kStreams, "speed");
  sensor.dropout_rate = kRate;
  ApplySensor(dropped, 0.01, 0.0, sensor, kSeed, kStreams, "speed");
  int dropouts = 0;
  for (std::size_t k = 0; k < kSamples; ++k) {
    if (dropped[k] == 0.0) {
      ++dropouts;
    } else {
      ASSERT_EQ(dropped[k], noisy[k]) << k;  // own stream: the noise is unchanged
    }
  }
  // binomial: mean n·p, SD √(n·p·(1 − p))
  const double n = kSamples;
  EXPECT_NEAR(dropouts, n * kRate, kStandardErrors * std::sqrt(n * kRate * (1.0 - kRate)));
  EXPECT_GT(dropouts, 0);
}

TEST(SensorChain, SpikesAreKFullScalesEitherWayAtTheRequestedRate) {
  constexpr std::size_t kSamples = 100000;
  constexpr double kRate = 2e-3, kFullScales = 0.5, kPeak = 2.0;
  std::vector<double> clean(kSamples);
  for (std::size_t k = 0; k < kSamples; ++k) {
    clean[k] = kPeak * std::cos(units::kRadiansPerRevolution * static_cast<double>(k) / 100.0);  // max |x| = 2 at k = 0
  }
  std::vector<double> spiked = clean;
  SensorArtefacts sensor;
  sensor.spike_rate = kRate;
  sensor.spike_full_scales = kFullScales;
  ApplySensor(spiked, 0.0, 0.0, sensor, kSeed, kStreams, "voltage");
  int spikes = 0, positive = 0;
  const double height = kFullScales * kPeak;  // k·FS
  for (std::size_t k = 0; k < kSamples; ++k) {
    const double jump = spiked[k] - clean[k];
    if (jump == 0.0) continue;
    ++spikes;
    if (jump > 0.0) ++positive;
    ASSERT_NEAR(std::abs(jump), height, 1e-12) << k;  // rounding of (x + h) − x
  }
  const double n = kSamples;
  EXPECT_NEAR(spikes, n * kRate, kStandardErrors * std::sqrt(n * kRate * (1.0 - kRate)));  // binomial
  EXPECT_NEAR(positive, 0.5 * spikes, kStandardErrors * std::sqrt(0.25 * spikes));        // binomial, p = 1/2
}

TEST(SensorChain, SpeedAndTorqueAdcStepsGiveWholeSteps) {
  SampledLog log;
  for (int k = 0; k < 2000; ++k) {
    log.speed_rad_s.push_back(300.0 + 0.37 * k);
    log.torque_N_m.push_back(0.01 + 1e-5 * k);
  }
  BenchConditions bench;
  bench.speed_noise_sigma_rad_s = 0.2;
  bench.speed_lsb_rad_s = 0.5;
  bench.torque_lsb_N_m = 1e-3;
  AddBenchNoise(bench, log);
  // common practice: an ADC code times its step (allowing the rounding of lsb·round(x/lsb))
  for (double w : log.speed_rad_s) ASSERT_NEAR(w / 0.5, std::round(w / 0.5), 1e-9) << w;
  for (double t : log.torque_N_m) ASSERT_NEAR(t / 1e-3, std::round(t / 1e-3), 1e-9) << t;
}

TEST(SensorChain, RejectsArtefactsOutOfRange) {
  std::vector<double> channel(10, 1.0);
  const auto apply = [&channel](SensorArtefacts s) { ApplySensor(channel, 0.1, 0.0, s, kSeed, kStreams, "current"); };
  SensorArtefacts s;
  s.noise_lag1_correlation = 1.0;
  EXPECT_THROW(apply(s), std::invalid_argument);
  s = {};
  s.dropout_rate = 1.5;
  EXPECT_THROW(apply(s), std::invalid_argument);
  s = {};
  s.spike_rate = -0.1;
  EXPECT_THROW(apply(s), std::invalid_argument);
  s = {};
  s.spike_full_scales = -1.0;
  EXPECT_THROW(apply(s), std::invalid_argument);
  s = {};
  s.zero_offset = std::nan("");
  EXPECT_THROW(apply(s), std::invalid_argument);
  try {
    s = {};
    s.noise_lag1_correlation = -1.0;
    apply(s);
    FAIL() << "|phi| = 1 accepted";
  } catch (const std::invalid_argument& e) {
    EXPECT_STREQ(e.what(), "current sensor: the noise's lag-1 correlation must lie in (-1, 1)");
  }
}

}  // namespace
}  // namespace coilspin::model

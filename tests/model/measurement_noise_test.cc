#include "src/model/measurement_noise.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <utility>
#include <vector>

#include "src/model/simulate_locked_rotor.h"
#include "model/series_moments.h"

namespace coilspin::model {
namespace {

// Sampling error bounds are set at four standard errors (common practice: a
// fixed seed makes the test deterministic; 4 SE would fail by chance < 1e-4).
constexpr double kStandardErrors = 4.0;

std::vector<double> Difference(const std::vector<double>& a, const std::vector<double>& b) {
  std::vector<double> d(a.size());
  for (std::size_t k = 0; k < a.size(); ++k) d[k] = a[k] - b[k];
  return d;
}

// A long settled plateau: 20 000 samples.
PlateauPlan LongPlateau() {
  PlateauPlan plan;
  plan.supply_levels_V = {8.0, -8.0};
  plan.sample_period_s = 1e-4;
  plan.hold_s = 1.0;
  return plan;
}

MotorParameters Motor() {
  MotorParameters motor;
  motor.resistance_ohm = 2.0;
  motor.inductance_H = 1e-3;
  motor.brush_drop_V = 0.5;
  return motor;
}

TEST(MeasurementNoise, StandardNormalHasTheMomentsOfNormalDeviates) {
  // handbook (moments of N(0, 1)): E z = 0, E z² = 1, E z⁴ = 3, E z⁸ = 105; the standard
  // error of a sample mean of g(z) is √(Var g/n): Var z = 1, Var z² = 2, Var z⁴ = 96
  constexpr int kDraws = 200000;
  MeasurementNoise noise(7, 0);
  double m1 = 0.0, m2 = 0.0, m4 = 0.0;
  for (int k = 0; k < kDraws; ++k) {
    const double z = noise.StandardNormal();
    m1 += z / kDraws;
    m2 += z * z / kDraws;
    m4 += z * z * z * z / kDraws;
  }
  const double n = kDraws;
  EXPECT_NEAR(m1, 0.0, kStandardErrors * std::sqrt(1.0 / n));
  EXPECT_NEAR(m2, 1.0, kStandardErrors * std::sqrt(2.0 / n));
  EXPECT_NEAR(m4, 3.0, kStandardErrors * std::sqrt(96.0 / n));
}

TEST(MeasurementNoise, LoggedNoiseHasTheRequestedSigma) {
  BenchConditions quiet;
  BenchConditions noisy;
  noisy.voltage_noise_sigma_V = 0.02;
  noisy.current_noise_sigma_A = 0.005;
  noisy.seed = 42;
  const SampledLog exact = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), quiet);
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), noisy);
  const std::vector<double> voltage_noise = Difference(log.voltage_V, exact.voltage_V);
  const std::vector<double> current_noise = Difference(log.current_A, exact.current_A);
  const double n = static_cast<double>(voltage_noise.size());
  ASSERT_EQ(n, 20000.0);
  // common practice (sampling distribution of Gaussian statistics): SE(mean) = σ/√n,
  // SE(s)/σ ≈ 1/√(2(n − 1)), SE(lag-1 autocorrelation of white noise) ≈ 1/√n
  for (const auto& [noise, sigma] : {std::pair{voltage_noise, noisy.voltage_noise_sigma_V},
                                     std::pair{current_noise, noisy.current_noise_sigma_A}}) {
    const Moments m = MomentsOf(noise);
    EXPECT_NEAR(m.mean, 0.0, kStandardErrors * sigma / std::sqrt(n));
    EXPECT_NEAR(m.std_dev / sigma, 1.0, kStandardErrors / std::sqrt(2.0 * (n - 1.0)));
    EXPECT_NEAR(m.lag1, 0.0, kStandardErrors / std::sqrt(n));
  }
  // common practice: independent channels have sample correlation within ~1/√n of 0
  double cross = 0.0;
  for (std::size_t k = 0; k < voltage_noise.size(); ++k) {
    cross += voltage_noise[k] * current_noise[k];
  }
  cross /= n * noisy.voltage_noise_sigma_V * noisy.current_noise_sigma_A;
  EXPECT_NEAR(cross, 0.0, kStandardErrors / std::sqrt(n));
}

TEST(MeasurementNoise, SameSeedSameLogOtherSeedOtherLog) {
  // common practice: reproducible test data from a fixed seed
  BenchConditions bench;
  bench.current_noise_sigma_A = 0.01;
  bench.seed = 3;
  const SampledLog a = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), bench);
  const SampledLog b = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), bench);
  EXPECT_EQ(a.current_A, b.current_A);
  bench.seed = 4;
  const SampledLog c = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), bench);
  EXPECT_NE(a.current_A, c.current_A);
  // the current stream does not depend on the voltage channel's σ (documented streams)
  bench.seed = 3;
  bench.voltage_noise_sigma_V = 0.05;
  const SampledLog d = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), bench);
  EXPECT_EQ(a.current_A, d.current_A);
}

bool IsMultipleOf(double value, double lsb) {
  // common practice: an ADC code times its step; allow the rounding of lsb·round(x/lsb)
  constexpr double kCodeTolerance = 1e-9;
  const double code = value / lsb;
  return std::abs(code - std::round(code)) < kCodeTolerance;
}

TEST(MeasurementNoise, QuantisedChannelsAreWholeStepsWithinHalfAStep) {
  BenchConditions quantised;
  quantised.voltage_lsb_V = 0.01;
  quantised.current_lsb_A = 0.002;
  const SampledLog exact = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), BenchConditions{});
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), quantised);
  double largest_current_error_A = 0.0;
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    ASSERT_TRUE(IsMultipleOf(log.voltage_V[k], quantised.voltage_lsb_V)) << log.voltage_V[k];
    ASSERT_TRUE(IsMultipleOf(log.current_A[k], quantised.current_lsb_A)) << log.current_A[k];
    // common practice (rounding quantiser): |error| ≤ lsb/2
    ASSERT_LE(std::abs(log.voltage_V[k] - exact.voltage_V[k]), 0.5 * quantised.voltage_lsb_V + 1e-12);
    const double current_error_A = std::abs(log.current_A[k] - exact.current_A[k]);
    ASSERT_LE(current_error_A, 0.5 * quantised.current_lsb_A + 1e-12);
    largest_current_error_A = std::max(largest_current_error_A, current_error_A);
  }
  // the transients sweep through many codes, so some error reaches close to lsb/2
  EXPECT_GT(largest_current_error_A, 0.4 * quantised.current_lsb_A);
}

TEST(MeasurementNoise, NoiseThenQuantisationGivesWholeSteps) {
  BenchConditions bench;
  bench.current_noise_sigma_A = 0.003;
  bench.current_lsb_A = 0.001;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), bench);
  for (double i_A : log.current_A) ASSERT_TRUE(IsMultipleOf(i_A, bench.current_lsb_A)) << i_A;
  // handbook (Widrow's quantisation theorem, good for σ ≳ lsb): rounding adds an
  // independent error of variance lsb²/12, so the logged σ² = σ² + lsb²/12
  const SampledLog exact = SimulateLockedRotorPlateaus(Motor(), LongPlateau(), BenchConditions{});
  const Moments m = MomentsOf(Difference(log.current_A, exact.current_A));
  const double expected_sigma = std::sqrt(0.003 * 0.003 + 0.001 * 0.001 / 12.0);
  EXPECT_NEAR(m.std_dev / expected_sigma, 1.0, kStandardErrors / std::sqrt(2.0 * 19999.0));
}

TEST(MeasurementNoise, QuantiseRoundsToTheNearestStep) {
  // common practice: q(y) = lsb·round(y/lsb)
  EXPECT_DOUBLE_EQ(Quantise(0.0149, 0.01), 0.01);
  EXPECT_DOUBLE_EQ(Quantise(-0.0151, 0.01), -0.02);
  EXPECT_DOUBLE_EQ(Quantise(0.123456, 0.0), 0.123456);
}

}  // namespace
}  // namespace coilspin::model

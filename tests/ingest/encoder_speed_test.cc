// Savitzky–Golay speed from position on synthetic records whose derivative is
// known in closed form: quadratics (exact), sinusoids (known attenuation) and
// quantised encoder positions (Monte Carlo noise against the stated σ).

#include "src/ingest/encoder_speed.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <random>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "src/units/constants.h"

namespace coilspin {
namespace {

using units::kPi;

constexpr double kStep_s = 1e-3;

std::vector<double> UniformTimes(std::size_t samples, double step_s) {
  std::vector<double> time_s(samples);
  for (std::size_t k = 0; k < samples; ++k) time_s[k] = static_cast<double>(k) * step_s;
  return time_s;
}

// θ = θ₀ + ω₀·t + ½·α·t², ω = ω₀ + α·t (physics: constant angular acceleration α).
struct Quadratic {
  double angle0_rad;
  double speed0_rad_s;
  double acceleration_rad_s2;
  double Angle(double t) const { return angle0_rad + speed0_rad_s * t + 0.5 * acceleration_rad_s2 * t * t; }
  double Speed(double t) const { return speed0_rad_s + acceleration_rad_s2 * t; }
};

std::vector<double> Sample(const std::vector<double>& time_s, const Quadratic& motion) {
  std::vector<double> angle_rad;
  for (double t : time_s) angle_rad.push_back(motion.Angle(t));
  return angle_rad;
}

// Round to the encoder grid q = 2π/cpr: what an incremental encoder reports.
std::vector<double> Quantise(std::vector<double> angle_rad, double counts_per_rev) {
  const double step_rad = units::kRadiansPerRevolution / counts_per_rev;
  for (double& a : angle_rad) a = step_rad * std::round(a / step_rad);
  return angle_rad;
}

double CentredSumOfSquares(std::size_t m) {
  double sum = 0.0;
  for (std::size_t k = 1; k <= m; ++k) sum += 2.0 * static_cast<double>(k * k);
  return sum;
}

TEST(SpeedFromPosition, QuadraticIsDifferentiatedExactlyEverywhere) {
  // Handbook (Savitzky & Golay, Anal. Chem. 36:1627, 1964): a least-squares
  // polynomial of degree 2 reproduces any quadratic, so its slope is exact —
  // also for the one-sided fits at the ends.
  const Quadratic motion{0.7, 120.0, -35.0};
  const std::vector<double> time_s = UniformTimes(400, kStep_s);
  for (std::size_t m : {1u, 2u, 5u, 25u}) {
    SpeedFromPositionOptions options;
    options.half_width = m;
    const DerivedSpeed derived = SpeedFromPosition(time_s, Sample(time_s, motion), options);
    ASSERT_EQ(derived.speed_rad_s.size(), time_s.size());
    EXPECT_EQ(derived.window_samples, 2 * m + 1);
    for (std::size_t k = 0; k < time_s.size(); ++k)
      EXPECT_NEAR(derived.speed_rad_s[k], motion.Speed(time_s[k]), 1e-9) << "m " << m << " sample " << k;
  }
}

TEST(SpeedFromPosition, NonUniformSamplingIsStillExactOnQuadratics) {
  // Handbook property as above: the polynomial is fitted in t itself, so the
  // spacing does not matter. Times jitter by up to ±40 % of the step.
  std::mt19937_64 random(41);
  std::uniform_real_distribution<double> jitter(-0.4, 0.4);
  std::vector<double> time_s(600);
  for (std::size_t k = 0; k < time_s.size(); ++k) time_s[k] = (static_cast<double>(k) + jitter(random)) * kStep_s;
  const Quadratic motion{-2.0, -80.0, 210.0};
  for (std::size_t m : {2u, 7u}) {
    SpeedFromPositionOptions options;
    options.half_width = m;
    const DerivedSpeed derived = SpeedFromPosition(time_s, Sample(time_s, motion), options);
    for (std::size_t k = 0; k < time_s.size(); ++k)
      EXPECT_NEAR(derived.speed_rad_s[k], motion.Speed(time_s[k]), 1e-8) << "m " << m << " sample " << k;
  }
}

TEST(SpeedFromPosition, CentredWeightsAreTheTabulatedOnes) {
  // Handbook (Savitzky & Golay 1964, first-derivative tables, quadratic; from
  // memory): 5 points (−2, −1, 0, 1, 2)/10, 7 points (−3, …, 3)/28, per Δt.
  // A unit impulse in θ at sample 20 returns ω_n = c_(20−n).
  const std::vector<double> time_s = UniformTimes(41, kStep_s);
  std::vector<double> impulse(41, 0.0);
  impulse[20] = 1.0;
  for (const auto& [m, norm] : {std::pair<std::size_t, double>{2, 10.0}, {3, 28.0}}) {
    SpeedFromPositionOptions options;
    options.half_width = m;
    const DerivedSpeed derived = SpeedFromPosition(time_s, impulse, options);
    for (std::size_t k = 0; k <= 2 * m; ++k) {
      const double offset = static_cast<double>(k) - static_cast<double>(m);  // θ index relative to n
      const std::size_t n = 20 - (k - m);
      EXPECT_NEAR(derived.speed_rad_s[n] * kStep_s, offset / norm, 1e-12) << "m " << m << " k " << k;
    }
  }
}

TEST(SpeedFromPosition, SinusoidIsAttenuatedByTheFilterResponse) {
  // Physics (linear filters): an FIR filter with odd weights c_k = k/(Δt·Σj²)
  // turns θ = A·sin(Ω·k) into A·G·(Ω/Δt)·cos(Ω·k) with zero phase and gain
  // G = 2·Σ_{k=1..m} k·sin(kΩ) / (Ω·Σ_{j=−m..m} j²).
  constexpr double kAmplitude_rad = 0.3;
  constexpr std::size_t kHalfWidth = 10;
  constexpr double kCyclesPerSample = 0.02;  // Ω = 0.126 rad/sample: G ≈ 0.83, visibly below 1
  const double omega = 2.0 * kPi * kCyclesPerSample;
  double gain_sum = 0.0;
  for (std::size_t k = 1; k <= kHalfWidth; ++k)
    gain_sum += 2.0 * static_cast<double>(k) * std::sin(static_cast<double>(k) * omega);
  const double gain = gain_sum / (omega * CentredSumOfSquares(kHalfWidth));
  ASSERT_LT(gain, 0.9);  // the check below must be able to tell G from 1

  const std::vector<double> time_s = UniformTimes(1000, kStep_s);
  std::vector<double> angle_rad;
  for (std::size_t k = 0; k < time_s.size(); ++k)
    angle_rad.push_back(kAmplitude_rad * std::sin(omega * static_cast<double>(k)));
  SpeedFromPositionOptions options;
  options.half_width = kHalfWidth;
  const DerivedSpeed derived = SpeedFromPosition(time_s, angle_rad, options);
  const double peak_rad_s = kAmplitude_rad * omega / kStep_s;
  for (std::size_t k = kHalfWidth; k + kHalfWidth < time_s.size(); ++k) {
    const double expected = gain * peak_rad_s * std::cos(omega * static_cast<double>(k));
    EXPECT_NEAR(derived.speed_rad_s[k], expected, 1e-9 * peak_rad_s) << "sample " << k;
  }
}

TEST(SpeedFromPosition, QuantisationNoiseMatchesTheStatedSigma) {
  // Statistics handbook: uniform quantisation of step q has σ_θ = q/√12; a
  // linear filter then gives σ_ω = σ_θ·‖c‖₂, ‖c‖₂ = 1/(Δt·√Σk²) centred, and
  // lag-1 correlation Σc_k·c_(k+1)/Σc_k² = 1 − 3/(2m+1) for c_k ∝ k.
  // Monte Carlo: the encoder's zero is random per trial (fixed seed), the shaft
  // moves ~16 counts per sample with changing speed, so the errors are independent.
  constexpr double kCountsPerRev = 1024.0;
  constexpr std::size_t kHalfWidth = 4;
  constexpr int kTrials = 200;
  const double step_rad = units::kRadiansPerRevolution / kCountsPerRev;
  const double sigma_theta = step_rad / std::sqrt(12.0);
  const double predicted = sigma_theta / (kStep_s * std::sqrt(CentredSumOfSquares(kHalfWidth)));
  const double predicted_correlation = 1.0 - 3.0 / (2.0 * kHalfWidth + 1.0);

  std::mt19937_64 random(42);
  std::uniform_real_distribution<double> zero(0.0, units::kRadiansPerRevolution);
  const std::vector<double> time_s = UniformTimes(1000, kStep_s);
  SpeedFromPositionOptions options;
  options.counts_per_rev = kCountsPerRev;
  options.half_width = kHalfWidth;
  double centred_squares = 0.0, centred_count = 0.0, lag_products = 0.0;
  double normalised_squares = 0.0, all_count = 0.0;
  DerivedSpeed derived;
  for (int trial = 0; trial < kTrials; ++trial) {
    const Quadratic motion{zero(random), 100.0, -50.0};
    derived = SpeedFromPosition(time_s, Quantise(Sample(time_s, motion), kCountsPerRev), options);
    std::vector<double> error(time_s.size());
    for (std::size_t k = 0; k < time_s.size(); ++k) {
      error[k] = derived.speed_rad_s[k] - motion.Speed(time_s[k]);
      normalised_squares += std::pow(error[k] / derived.speed_sigma_rad_s[k], 2);
      all_count += 1.0;
    }
    for (std::size_t k = kHalfWidth; k + kHalfWidth < time_s.size(); ++k) {
      centred_squares += error[k] * error[k];
      centred_count += 1.0;
      if (k + kHalfWidth + 1 < time_s.size()) lag_products += error[k] * error[k + 1];
    }
  }
  EXPECT_NEAR(derived.position_sigma_rad, sigma_theta, 1e-15);
  EXPECT_NEAR(derived.noise_sigma_rad_s, predicted, 1e-9 * predicted);
  EXPECT_NEAR(derived.lag1_correlation, predicted_correlation, 1e-9);
  const double empirical = std::sqrt(centred_squares / centred_count);
  EXPECT_NEAR(empirical, predicted, 0.10 * predicted);
  // Per-sample σ, one-sided ends included: normalised errors have unit spread.
  EXPECT_NEAR(std::sqrt(normalised_squares / all_count), 1.0, 0.10);
  EXPECT_NEAR(lag_products / centred_squares, predicted_correlation, 0.05);
}

TEST(SpeedFromPosition, DefaultWindowMeetsTheNoiseTargetAndItsCap) {
  // encoder_speed.h: the smallest m ≥ 2 with σ_ω(m) ≤ 1 % of the speed range, at most 25,
  // the range read from secants over 50 samples. A secant of θ = ω₀t + ½αt² is
  // the speed at the span's midpoint (physics), so the secants span
  // |α|·(t_last − 50·Δt).
  const std::vector<double> time_s = UniformTimes(2000, kStep_s);
  const Quadratic motion{0.0, 300.0, -100.0};
  SpeedFromPositionOptions options;
  options.counts_per_rev = 100.0;  // coarse: q = 0.063 rad
  const DerivedSpeed derived = SpeedFromPosition(time_s, Quantise(Sample(time_s, motion), 100.0), options);
  const double allowed = 0.01 * 100.0 * (time_s.back() - 50.0 * kStep_s);
  const double sigma_theta = units::kRadiansPerRevolution / 100.0 / std::sqrt(12.0);
  const auto sigma_of = [&](std::size_t m) {
    return sigma_theta / (kStep_s * std::sqrt(CentredSumOfSquares(m)));
  };
  ASSERT_GT(derived.half_width, 2u);
  EXPECT_LE(sigma_of(derived.half_width), allowed);
  EXPECT_GT(sigma_of(derived.half_width - 1), allowed);
  EXPECT_EQ(derived.method.rfind("Savitzky–Golay first derivative, quadratic, " +
                                     std::to_string(2 * derived.half_width + 1) + "-sample window",
                                 0),
            0u);

  options.counts_per_rev = 8.0;  // very coarse: the noise target cannot be met, the cap applies
  EXPECT_EQ(SpeedFromPosition(time_s, Quantise(Sample(time_s, motion), 8.0), options).half_width, 25u);
  options.counts_per_rev = 1e7;  // fine: the shortest window suffices
  EXPECT_EQ(SpeedFromPosition(time_s, Quantise(Sample(time_s, motion), 1e7), options).half_width, 2u);
}

TEST(EstimatePositionNoise, RecoversGaussianSigma) {
  // Statistics: the MAD estimate of σ from ~2000 residuals is good to ~3 %; allow 10 %.
  constexpr double kSigma_rad = 2e-3;
  std::mt19937_64 random(43);
  std::normal_distribution<double> noise(0.0, kSigma_rad);
  const std::vector<double> time_s = UniformTimes(2000, kStep_s);
  std::vector<double> angle_rad = Sample(time_s, {1.0, 50.0, -20.0});
  for (double& a : angle_rad) a += noise(random);
  const PositionNoise estimate = EstimatePositionNoise(time_s, angle_rad);
  EXPECT_NEAR(estimate.sigma_rad, kSigma_rad, 0.10 * kSigma_rad);
  const DerivedSpeed derived = SpeedFromPosition(time_s, angle_rad);
  EXPECT_DOUBLE_EQ(derived.position_sigma_rad, estimate.sigma_rad);
}

TEST(EstimatePositionNoise, GridFallsBackToTheStep) {
  // A shaft turning exactly one count per sample, then stopping: every moving
  // window but the two at the corner is a straight line, the MAD is 0, and the
  // grid step q gives σ_θ = q/√12 (statistics handbook: uniform quantisation).
  const double step_rad = units::kRadiansPerRevolution / 500.0;
  const std::vector<double> time_s = UniformTimes(300, kStep_s);
  std::vector<double> angle_rad;
  for (std::size_t k = 0; k < time_s.size(); ++k)
    angle_rad.push_back(step_rad * static_cast<double>(std::min<std::size_t>(k, 150)));
  EXPECT_NEAR(EstimatePositionNoise(time_s, angle_rad).sigma_rad, step_rad / std::sqrt(12.0), 1e-12);
}

TEST(EstimatePositionNoise, CreepingShaftIsNotWhiteNoise) {
  // encoder_speed.h, "When it breaks": one count every 7 samples is a sawtooth
  // error, not independent noise; the estimate is then only near q/√12 (within
  // 30 %), which is why an encoder's counts per revolution should be given.
  const double step_rad = units::kRadiansPerRevolution / 500.0;
  const std::vector<double> time_s = UniformTimes(300, kStep_s);
  std::vector<double> angle_rad;
  for (std::size_t k = 0; k < time_s.size(); ++k) angle_rad.push_back(step_rad * static_cast<double>(k / 7));
  const double estimate = EstimatePositionNoise(time_s, angle_rad).sigma_rad;
  EXPECT_NEAR(estimate, step_rad / std::sqrt(12.0), 0.30 * step_rad / std::sqrt(12.0));
  EXPECT_GT(std::abs(estimate - step_rad / std::sqrt(12.0)), 0.05 * step_rad / std::sqrt(12.0));
}

TEST(SpeedFromPosition, RejectsBadArgumentsAndOptions) {
  const std::vector<double> time_s = UniformTimes(10, kStep_s);
  const std::vector<double> angle_rad(10, 0.0);
  EXPECT_THROW(SpeedFromPosition(time_s, std::vector<double>(9, 0.0)), std::invalid_argument);
  EXPECT_THROW(SpeedFromPosition({0.0, 1.0}, {0.0, 1.0}), std::invalid_argument);
  EXPECT_THROW(SpeedFromPosition({0.0, 1.0, 1.0}, {0.0, 1.0, 2.0}), std::invalid_argument);
  SpeedFromPositionOptions options;
  std::string error;
  EXPECT_TRUE(options.IsValid(&error));
  options.counts_per_rev = -5.0;
  EXPECT_FALSE(options.IsValid(&error));
  EXPECT_NE(error.find("counts per revolution"), std::string::npos);
  EXPECT_THROW(SpeedFromPosition(time_s, angle_rad, options), std::invalid_argument);
  options = {};
  options.max_half_width = 1;
  EXPECT_FALSE(options.IsValid(&error));
  options = {};
  options.half_width = 0;
  EXPECT_FALSE(options.IsValid(&error));
  // A record shorter than the window: m shrinks to fit, (n − 1)/2.
  options = {};
  options.half_width = 25;
  EXPECT_EQ(SpeedFromPosition(time_s, angle_rad, options).half_width, 4u);
}

}  // namespace
}  // namespace coilspin

// The interval methods and the robust loss on a step fit (docs/intervals.md).
// References: for a model close to linear in its parameters the profile-
// likelihood interval equals the Wald interval (Bates & Watts, Nonlinear
// Regression Analysis and its Applications, 1988, ch. 6 — from memory), and
// the bootstrap standard error of a smooth estimate approaches the analytic
// one (Efron & Tibshirani, An Introduction to the Bootstrap, 1993, ch. 6 —
// from memory), up to its Monte-Carlo error √(1/(2B)).

#include <gtest/gtest.h>

#include <cmath>
#include <random>

#include "fitters/joint/motor_fit.h"
#include "step/step_bench.h"

namespace coilspin::testing {
namespace {

// A step with no noise on the logged voltage, so the Wald intervals carry no
// input-noise term (which neither the profile nor the bootstrap counts).
BenchLog QuietVoltageStep(std::uint64_t seed) {
  const model::MotorParameters m = ServoMotor();
  model::BenchConditions bench = StepNoise(seed, false);
  bench.voltage_noise_sigma_V = 0.0;
  return ToBenchLog(model::SimulateStep(m, StepFromRest(m, 24.0, false), bench), "step.csv");
}

MotorEstimate Fit(const BenchLog& log, const joint::MotorFitOptions& options) {
  return joint::FitMotor({{TestKind::kStep, log}}, options);
}

TEST(StepIntervals, ProfileMatchesWaldWhereTheModelIsNearlyLinear) {
  const BenchLog log = QuietVoltageStep(31);
  const MotorEstimate wald = Fit(log, {});
  joint::MotorFitOptions options;
  options.intervals.method = joint::IntervalMethod::kProfile;
  const MotorEstimate profile = Fit(log, options);
  EXPECT_EQ(profile.intervals.method, "profile");
  for (const char* key : {"inductance", "inertia", "resistance"}) {
    const QuantityEstimate* w = wald.Find(key);
    const QuantityEstimate* p = profile.Find(key);
    ASSERT_TRUE(w && p) << key;
    const double half_width = 0.5 * (w->ci_high - w->ci_low);
    // 10 % of the half-width: the curvature of this model over ±2 se is slight.
    EXPECT_NEAR(p->ci_low, w->ci_low, 0.1 * half_width) << key;
    EXPECT_NEAR(p->ci_high, w->ci_high, 0.1 * half_width) << key;
  }
}

TEST(StepIntervals, BootstrapStandardErrorsAgreeWithWaldAndRepeat) {
  const BenchLog log = QuietVoltageStep(32);
  const MotorEstimate wald = Fit(log, {});
  joint::MotorFitOptions options;
  options.intervals.method = joint::IntervalMethod::kBootstrap;
  options.intervals.replicates = 60;
  const MotorEstimate a = Fit(log, options);
  const MotorEstimate b = Fit(log, options);
  EXPECT_EQ(a.intervals.replicates + a.intervals.failed_replicates, 60);
  // Monte-Carlo error of an SD from 60 replicates: √(1/120) ≈ 9 %; 35 % is about 4 of them.
  for (const char* key : {"resistance", "inductance", "back_emf_constant", "inertia"}) {
    const double ratio = a.Find(key)->std_error / wald.Find(key)->std_error;
    EXPECT_GT(ratio, 0.65) << key;
    EXPECT_LT(ratio, 1.35) << key;
    // Fixed seed: the same replicates. Two fits in one process agree to the solver's
    // convergence only (measured: 1e-11 relative on R, 2.5e-6 of the half-width on J;
    // the order of Ceres' internal blocks follows memory addresses), so equality is
    // asked to 1e-4 of the half-width. Separate runs of the CLI give identical files.
    const double half_width = 0.5 * (a.Find(key)->ci_high - a.Find(key)->ci_low);
    EXPECT_NEAR(a.Find(key)->ci_low, b.Find(key)->ci_low, 1e-4 * half_width) << key;
    EXPECT_NEAR(a.Find(key)->ci_high, b.Find(key)->ci_high, 1e-4 * half_width) << key;
  }
}

TEST(StepIntervals, ProfileCountsTheLoggedVoltagesNoiseAsWaldDoes) {
  // With noise on the logged voltage, the Wald interval includes its first-order
  // term (fitters/step/input_noise.h); the profile works on the output residuals
  // and adds the same term as an independent variance (interval_methods.h), so on
  // this nearly linear fit the two intervals again agree (10 % of the half-width).
  const model::MotorParameters m = ServoMotor();
  const BenchLog log = ToBenchLog(model::SimulateStep(m, StepFromRest(m, 24.0, false), StepNoise(35, false)), "s");
  const MotorEstimate wald = Fit(log, {});
  joint::MotorFitOptions options;
  options.intervals.method = joint::IntervalMethod::kProfile;
  const MotorEstimate profile = Fit(log, options);
  for (const char* key : {"inductance", "inertia"}) {
    const QuantityEstimate* w = wald.Find(key);
    const QuantityEstimate* p = profile.Find(key);
    const double half_width = 0.5 * (w->ci_high - w->ci_low);
    EXPECT_NEAR(p->ci_low, w->ci_low, 0.1 * half_width) << key;
    EXPECT_NEAR(p->ci_high, w->ci_high, 0.1 * half_width) << key;
  }
}

TEST(StepIntervals, BootstrapCarriesTheTermsResamplingCannotRedraw) {
  // An encoder step with noise on the logged voltage: the encoder's start phase (one
  // per log) and the voltage noise that drives the model are beyond what resampled
  // residuals redraw; the bootstrap adds their terms as independent variances, to the
  // parameters and, through ∇gᵀ·added·∇g, to the derived ratios (derived.h), so its
  // standard errors again agree with Wald's delta method (35 %: 4 Monte-Carlo errors
  // of an SD from 60 replicates). Without the added terms J's was measured at about half.
  const model::MotorParameters m = ServoMotor();
  model::BenchConditions bench = StepNoise(36, true);
  bench.encoder_start_phase = 0.61;  // any; invented
  const BenchLog log = ToBenchLog(model::SimulateStep(m, StepFromRest(m, 24.0, true), bench), "enc.csv");
  const MotorEstimate wald = Fit(log, {});
  joint::MotorFitOptions options;
  options.intervals.method = joint::IntervalMethod::kBootstrap;
  options.intervals.replicates = 60;
  const MotorEstimate boot = Fit(log, options);
  for (const char* key : {"inertia", "viscous_friction", "coulomb_friction"}) {
    const double ratio = boot.Find(key)->std_error / wald.Find(key)->std_error;
    EXPECT_GT(ratio, 0.65) << key;
    EXPECT_LT(ratio, 1.35) << key;
  }
  const auto ratio_of = [](const MotorEstimate& e, const std::string& key) -> const QuantityEstimate* {
    for (const auto& q : e.ratios)
      if (q.key == key) return &q;
    return nullptr;
  };
  for (const char* key : {"torque_constant_over_inertia", "viscous_over_inertia"}) {
    const QuantityEstimate* w = ratio_of(wald, key);
    const QuantityEstimate* b = ratio_of(boot, key);
    ASSERT_TRUE(w && b) << key;
    EXPECT_GT(b->std_error / w->std_error, 0.65) << key;
    EXPECT_LT(b->std_error / w->std_error, 1.35) << key;
    // The stretched percentile sides still hold the estimate.
    EXPECT_LT(b->ci_low, b->value) << key;
    EXPECT_GT(b->ci_high, b->value) << key;
  }
}

TEST(StepIntervals, RobustLossResistsSpikesInTheCurrent) {
  const model::MotorParameters m = ServoMotor();
  BenchLog log = QuietVoltageStep(33);
  // 1 % of the current samples hit by spikes of 40 noise σ (a switching transient
  // coupling into the shunt amplifier, common practice to expect).
  std::mt19937 generator(7);
  std::uniform_int_distribution<std::size_t> where(0, log.size() - 1);
  const double spike_A = 40.0 * StepNoise(0, false).current_noise_sigma_A;
  for (std::size_t k = 0; k < log.size() / 100; ++k) log.current_A[where(generator)] += spike_A;
  const MotorEstimate squared = Fit(log, {});
  joint::MotorFitOptions options;
  options.loss = core::RobustLoss::kHuber;
  const MotorEstimate huber = Fit(log, options);
  EXPECT_EQ(huber.intervals.robust_loss, "huber");
  // The spikes inflate the noise level a squared loss infers from its residuals
  // (their variance is 1 % × 40² = 16 σ² on top of σ²), and so every interval; the
  // Huber fit's scale comes from the median absolute deviation and stays at σ.
  const double sigma_A = StepNoise(0, false).current_noise_sigma_A;
  const auto current_sigma = [](const MotorEstimate& e) {
    for (const auto& r : e.tests.front().residuals)
      if (r.channel == "current") return r.sigma;
    return 0.0;
  };
  EXPECT_GT(current_sigma(squared), 3.0 * sigma_A);
  EXPECT_NEAR(current_sigma(huber), sigma_A, 0.2 * sigma_A);
  for (const auto& [key, truth] : {std::pair<const char*, double>{"resistance", m.resistance_ohm},
                                   {"inductance", m.inductance_H},
                                   {"back_emf_constant", m.back_emf_constant_V_s_per_rad}}) {
    const QuantityEstimate* q = huber.Find(key);
    EXPECT_LT(std::fabs(q->value - truth), 4.0 * q->std_error) << key;
    EXPECT_LT(q->std_error, squared.Find(key)->std_error) << key;  // the spikes no longer widen it
  }
}

TEST(StepIntervals, AGivenNoiseLevelIsUsedInsteadOfTheEstimate) {
  // Given the simulator's true current σ, the fit weights the channel by it and keeps
  // it; since the estimate from the data is close to the truth (the residuals are the
  // simulated noise), the standard errors barely move (within 10 %).
  const BenchLog log = QuietVoltageStep(34);
  const double sigma_A = StepNoise(0, false).current_noise_sigma_A;
  joint::MotorFitOptions options;
  options.noise.push_back({"current", sigma_A});
  const MotorEstimate given = Fit(log, options);
  const MotorEstimate estimated = Fit(log, {});
  bool found = false;
  for (const auto& r : given.tests.front().residuals)
    if (r.channel == "current") {
      EXPECT_EQ(r.sigma, sigma_A);
      found = true;
    }
  EXPECT_TRUE(found);
  EXPECT_NEAR(given.Find("resistance")->std_error / estimated.Find("resistance")->std_error, 1.0, 0.1);
  std::string why;
  options.noise = {{"torque", 1.0}};
  EXPECT_FALSE(options.IsValid(&why));
}

}  // namespace
}  // namespace coilspin::testing

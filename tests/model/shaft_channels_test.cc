#include "src/model/shaft_channels.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <stdexcept>

#include "src/model/simulate_no_load.h"

namespace coilspin::model {
namespace {

constexpr double kTwoPi = 6.283185307179586477;  // physics (definition of the radian)
constexpr double kWholeNumberTolerance = 1e-9;   // counts·2π/cpr·cpr/2π is whole to rounding

// R, L, Ke, Kt, J, B, Tc, Vb
const MotorParameters kMotor{1.5, 1.2e-3, 0.03, 0.028, 5e-6, 2e-6, 2.5e-3, 0.4};

NoLoadPlan Plan(ShaftChannels shaft) {
  NoLoadPlan plan;
  plan.supply_levels_V = {4.0, -3.0};
  plan.hold_s = 0.3;
  plan.sample_period_s = 1e-4;
  plan.shaft = shaft;
  return plan;
}

TEST(ShaftChannels, EncoderCountsAreWholeAndTheFloorOfTheAngle) {
  // physics (an incremental encoder zeroed at θ = 0 counts whole edges): n = floor(θ·cpr/2π)
  constexpr int kCpr = 500;
  const SampledLog exact = SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeedAndPosition), BenchConditions{});
  BenchConditions with_encoder;
  with_encoder.encoder_counts_per_rev = kCpr;
  const SampledLog counted = SimulateNoLoad(kMotor, Plan(ShaftChannels::kPosition), with_encoder);
  EXPECT_TRUE(counted.speed_rad_s.empty()) << "position instead of speed";
  ASSERT_EQ(counted.position_rad.size(), exact.position_rad.size());
  double largest_count = 0.0;
  bool went_backwards = false;
  for (std::size_t k = 0; k < exact.position_rad.size(); ++k) {
    const double count = counted.position_rad[k] * kCpr / kTwoPi;
    EXPECT_NEAR(count, std::round(count), kWholeNumberTolerance) << k;
    EXPECT_EQ(std::llround(count), static_cast<long long>(std::floor(exact.position_rad[k] * kCpr / kTwoPi))) << k;
    EXPECT_EQ(std::llround(count), EncoderCount(exact.position_rad[k], kCpr));
    largest_count = std::max(largest_count, count);
    if (k > 0 && counted.position_rad[k] < counted.position_rad[k - 1]) went_backwards = true;
  }
  EXPECT_GT(largest_count, 3.0 * kCpr) << "the rotor turned several revolutions";
  EXPECT_TRUE(went_backwards) << "the reversed level counts down";
}

TEST(ShaftChannels, NegativeAnglesRoundDownToTheCountBelow) {
  // from the definition n = floor(θ·cpr/2π): a tenth of a count backwards is count −1
  constexpr int kCpr = 1000;
  EXPECT_EQ(EncoderCount(-0.1 * kTwoPi / kCpr, kCpr), -1);
  EXPECT_EQ(EncoderCount(0.0, kCpr), 0);
  EXPECT_EQ(EncoderCount(2.5 * kTwoPi, kCpr), 2500);
}

TEST(ShaftChannels, StartPhaseMovesTheFirstEdgeButNotTheZero) {
  // from the definition n = floor(θ·cpr/2π + φ): zeroed at the start (n = 0 at θ = 0
  // for any φ in [0, 1)), the first edge comes after 1 − φ of a count forwards and
  // the first one backwards after φ
  constexpr int kCpr = 1000;
  constexpr double kPhase = 0.7;
  const double count_rad = kTwoPi / kCpr;
  EXPECT_EQ(EncoderCount(0.0, kCpr, kPhase), 0);
  EXPECT_EQ(EncoderCount(0.29 * count_rad, kCpr, kPhase), 0);
  EXPECT_EQ(EncoderCount(0.31 * count_rad, kCpr, kPhase), 1);
  EXPECT_EQ(EncoderCount(-0.69 * count_rad, kCpr, kPhase), 0);
  EXPECT_EQ(EncoderCount(-0.71 * count_rad, kCpr, kPhase), -1);
  // On a simulated log: every reading is the shifted floor, and a phase outside [0, 1) is refused.
  BenchConditions shifted;
  shifted.encoder_counts_per_rev = kCpr;
  shifted.encoder_start_phase = kPhase;
  const SampledLog exact = SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeedAndPosition), BenchConditions{});
  const SampledLog counted = SimulateNoLoad(kMotor, Plan(ShaftChannels::kPosition), shifted);
  ASSERT_EQ(counted.position_rad.size(), exact.position_rad.size());
  for (std::size_t k = 0; k < exact.position_rad.size(); ++k) {
    EXPECT_EQ(std::llround(counted.position_rad[k] / count_rad),
              static_cast<long long>(std::floor(exact.position_rad[k] / count_rad + kPhase)))
        << k;
  }
  shifted.encoder_start_phase = 1.0;
  EXPECT_THROW(SimulateNoLoad(kMotor, Plan(ShaftChannels::kPosition), shifted), std::invalid_argument);
}

TEST(ShaftChannels, GearboxDividesSpeedAndPositionByTheRatio) {
  // physics (a gearbox of N motor turns per output turn): ω_out = ω/N, θ_out = θ/N; the
  // electrical channels do not see the gearbox (its friction is part of B and Tc)
  constexpr double kRatio = 19.2;
  const SampledLog direct = SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeedAndPosition), BenchConditions{});
  BenchConditions geared;
  geared.gear_ratio = kRatio;
  const SampledLog output = SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeedAndPosition), geared);
  ASSERT_EQ(output.speed_rad_s.size(), direct.speed_rad_s.size());
  for (std::size_t k = 0; k < direct.speed_rad_s.size(); ++k) {
    EXPECT_DOUBLE_EQ(output.speed_rad_s[k], direct.speed_rad_s[k] / kRatio);
    EXPECT_DOUBLE_EQ(output.position_rad[k], direct.position_rad[k] / kRatio);
  }
  EXPECT_EQ(output.current_A, direct.current_A);
  EXPECT_EQ(output.voltage_V, direct.voltage_V);
}

TEST(ShaftChannels, EncoderOnTheGearboxOutputCountsOutputTurns) {
  // physics: n = floor((θ/N)·cpr/2π)
  constexpr double kRatio = 4.0;
  constexpr int kCpr = 64;
  const SampledLog direct = SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeedAndPosition), BenchConditions{});
  BenchConditions geared;
  geared.gear_ratio = kRatio;
  geared.encoder_counts_per_rev = kCpr;
  const SampledLog output = SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeedAndPosition), geared);
  for (std::size_t k = 0; k < direct.position_rad.size(); ++k) {
    const double expected = std::floor(direct.position_rad[k] / kRatio * kCpr / kTwoPi);
    EXPECT_NEAR(output.position_rad[k] * kCpr / kTwoPi, expected, kWholeNumberTolerance) << k;
  }
  EXPECT_EQ(output.speed_rad_s.size(), output.time_s.size()) << "speed beside position";
}

TEST(ShaftChannels, RejectsAReadoutThatCannotExist) {
  // common practice: misuse is reported
  BenchConditions no_gear;
  no_gear.gear_ratio = 0.0;
  EXPECT_THROW(SimulateNoLoad(kMotor, Plan(ShaftChannels::kSpeed), no_gear), std::invalid_argument);
  BenchConditions negative_cpr;
  negative_cpr.encoder_counts_per_rev = -1;
  EXPECT_THROW(ValidateShaftReadout(negative_cpr), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model

// Plateaus, noise level and step onset on synthetic signals whose truth is
// known: staircases and steps generated here with fixed-seed noise.

#include "src/ingest/segmentation.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>
#include <stdexcept>
#include <utility>
#include <vector>

namespace coilspin {
namespace {

constexpr double kResistance_ohm = 2.0;

// A locked-rotor staircase: the supply is switched to each level just before
// the level's first sample and the terminal voltage follows with a first-order
// transient of `tau_samples`, and the current is v/R (physics:
// Ohm's law with the rotor held, back-EMF zero), both with Gaussian noise.
struct Staircase {
  std::vector<double> voltage_V;
  std::vector<double> current_A;
  std::vector<std::pair<std::size_t, std::size_t>> true_levels;  // [begin, end) of each level
};

Staircase MakeStaircase(const std::vector<double>& levels_V, const std::vector<std::size_t>& lengths,
                        double voltage_sigma_V, double current_sigma_A, double tau_samples, unsigned seed) {
  std::mt19937 random(seed);
  std::normal_distribution<double> unit_noise(0.0, 1.0);
  Staircase stairs;
  double previous_V = 0.0;
  for (std::size_t level = 0; level < levels_V.size(); ++level) {
    const std::size_t begin = stairs.voltage_V.size();
    for (std::size_t j = 0; j < lengths[level]; ++j) {
      const double decay = tau_samples > 0.0 ? std::exp(-static_cast<double>(j + 1) / tau_samples) : 0.0;
      const double clean_V = levels_V[level] + (previous_V - levels_V[level]) * decay;
      stairs.voltage_V.push_back(clean_V + voltage_sigma_V * unit_noise(random));
      stairs.current_A.push_back(clean_V / kResistance_ohm + current_sigma_A * unit_noise(random));
    }
    stairs.true_levels.emplace_back(begin, stairs.voltage_V.size());
    previous_V = levels_V[level];
  }
  return stairs;
}

// Checks the plateaus against the true levels: one plateau per level, inside
// it, with means within 5 standard errors (common practice: 5σ/√n).
void ExpectPlateausMatch(const Staircase& stairs, const std::vector<double>& levels_V, double voltage_sigma_V,
                         double current_sigma_A) {
  const std::vector<Plateau> plateaus =
      FindPlateaus(stairs.voltage_V, {&stairs.voltage_V, &stairs.current_A});
  ASSERT_EQ(plateaus.size(), levels_V.size());
  for (std::size_t i = 0; i < plateaus.size(); ++i) {
    const Plateau& plateau = plateaus[i];
    const double samples = static_cast<double>(plateau.size());
    EXPECT_GE(plateau.begin, stairs.true_levels[i].first) << "level " << i;
    EXPECT_LE(plateau.end, stairs.true_levels[i].second) << "level " << i;
    ASSERT_EQ(plateau.channels.size(), 2u);
    EXPECT_NEAR(plateau.channels[0].mean, levels_V[i], 5.0 * voltage_sigma_V / std::sqrt(samples) + 1e-12);
    EXPECT_NEAR(plateau.channels[1].mean, levels_V[i] / kResistance_ohm,
                5.0 * current_sigma_A / std::sqrt(samples) + 1e-12);
  }
}

TEST(FindPlateaus, StaircaseAtBothPolarities) {
  const std::vector<double> levels_V = {1.0, 2.0, 4.0, 8.0, -1.0, -2.0, -4.0, -8.0};
  const Staircase stairs =
      MakeStaircase(levels_V, std::vector<std::size_t>(levels_V.size(), 400), 0.01, 0.002, 5.0, 11);
  ExpectPlateausMatch(stairs, levels_V, 0.01, 0.002);
}

TEST(FindPlateaus, ReturnToZeroBetweenLevels) {
  const std::vector<double> levels_V = {0.0, 3.0, 0.0, -3.0, 0.0, 6.0, 0.0, -6.0};
  const Staircase stairs =
      MakeStaircase(levels_V, std::vector<std::size_t>(levels_V.size(), 300), 0.02, 0.005, 3.0, 12);
  ExpectPlateausMatch(stairs, levels_V, 0.02, 0.005);
}

TEST(FindPlateaus, SlewedStepsBetweenLevels) {
  // The supply slews linearly over 30 samples between 200-sample levels: the
  // ramps are no plateaus, and each plateau lies inside its level.
  const std::vector<double> levels_V = {2.0, 6.0, -2.0, -6.0};
  constexpr std::size_t kRamp = 30;
  constexpr std::size_t kHold = 200;
  constexpr double kSigma_V = 0.01;
  std::mt19937 random(16);
  std::normal_distribution<double> noise(0.0, kSigma_V);
  std::vector<double> voltage_V;
  std::vector<std::pair<std::size_t, std::size_t>> holds;
  double previous_V = 0.0;
  for (double level_V : levels_V) {
    for (std::size_t j = 1; j <= kRamp; ++j) {
      voltage_V.push_back(previous_V + (level_V - previous_V) * static_cast<double>(j) / kRamp +
                          noise(random));
    }
    holds.emplace_back(voltage_V.size(), voltage_V.size() + kHold);
    for (std::size_t j = 0; j < kHold; ++j) voltage_V.push_back(level_V + noise(random));
    previous_V = level_V;
  }
  const std::vector<Plateau> plateaus = FindPlateaus(voltage_V, {&voltage_V});
  ASSERT_EQ(plateaus.size(), levels_V.size());
  for (std::size_t i = 0; i < plateaus.size(); ++i) {
    EXPECT_GE(plateaus[i].begin, holds[i].first);
    EXPECT_LE(plateaus[i].end, holds[i].second);
    EXPECT_NEAR(plateaus[i].channels[0].mean, levels_V[i],
                5.0 * kSigma_V / std::sqrt(static_cast<double>(plateaus[i].size())));
  }
}

TEST(FindPlateaus, NoiseFreeStaircase) {
  const std::vector<double> levels_V = {0.5, 1.0, 1.5, -0.5};
  const Staircase stairs = MakeStaircase(levels_V, {50, 50, 50, 50}, 0.0, 0.0, 0.0, 13);
  ExpectPlateausMatch(stairs, levels_V, 0.0, 0.0);
  const std::vector<Plateau> plateaus = FindPlateaus(stairs.voltage_V, {});
  ASSERT_EQ(plateaus.size(), 4u);
  // segmentation.h: the settle_fraction 0.25 of each 50-sample level is dropped → ⌈12.5⌉ = 13
  EXPECT_EQ(plateaus[1].begin, 50u + 13u);
  EXPECT_EQ(plateaus[1].end, 100u);
}

TEST(FindPlateaus, ShortLevelIsNotAPlateau) {
  // The 10-sample level keeps 10 − ⌈2.5⌉ = 7 settled samples, fewer than min_samples = 8.
  const std::vector<double> levels_V = {2.0, 4.0, 6.0};
  const Staircase stairs = MakeStaircase(levels_V, {100, 10, 100}, 0.01, 0.001, 0.0, 14);
  const std::vector<Plateau> plateaus = FindPlateaus(stairs.voltage_V, {&stairs.voltage_V});
  ASSERT_EQ(plateaus.size(), 2u);
  EXPECT_NEAR(plateaus[0].channels[0].mean, 2.0, 5.0 * 0.01 / std::sqrt(75.0));
  EXPECT_NEAR(plateaus[1].channels[0].mean, 6.0, 5.0 * 0.01 / std::sqrt(75.0));
}

TEST(FindPlateaus, SpreadIsTheNoiseAndALoneSpikeDoesNotSplitALevel) {
  const std::vector<double> levels_V = {5.0, 10.0};
  Staircase stairs = MakeStaircase(levels_V, {2000, 2000}, 0.05, 0.01, 0.0, 15);
  stairs.voltage_V[1000] += 50.0 * 0.05;  // one glitch of 50 σ in the first level
  const std::vector<Plateau> plateaus =
      FindPlateaus(stairs.voltage_V, {&stairs.voltage_V, &stairs.current_A});
  ASSERT_EQ(plateaus.size(), 2u);
  // statistics: the sample std of n = 1500 Gaussian values is within 10 % of σ (4 standard errors)
  EXPECT_NEAR(plateaus[1].channels[0].std_dev, 0.05, 0.005);
  EXPECT_NEAR(plateaus[1].channels[1].std_dev, 0.01, 0.001);
}

TEST(FindPlateaus, CoarseAdcWithNoiseUnderAStepKeepsEveryLevel) {
  // 10 mV readings of 2 mV noise on levels of 1, 2, 3, 4, −2, −3 V, 300 samples each:
  // few readings change, so σ from differences is about 0 and the step is not seen
  // (too few codes, noise_level.h); no level may be trimmed to its first sample
  // (issue 9: half the plateaus were lost). Each plateau's mean is the level to
  // within a reading step (rounding error ≤ q/2; statistics handbook).
  std::mt19937_64 random(17);
  std::normal_distribution<double> noise(0.0, 0.002);
  const double step_V = 0.01;
  std::vector<double> v;
  for (double level : {1.0, 2.0, 3.0, 4.0, -2.0, -3.0})
    for (int k = 0; k < 300; ++k) v.push_back(step_V * std::round((level + noise(random)) / step_V));
  const auto plateaus = FindPlateaus(v, {&v}, {});
  ASSERT_EQ(plateaus.size(), 6u);
  const double levels[] = {1.0, 2.0, 3.0, 4.0, -2.0, -3.0};
  for (std::size_t p = 0; p < plateaus.size(); ++p) {
    EXPECT_GT(plateaus[p].size(), 200u);  // 300 less the settling quarter
    EXPECT_NEAR(plateaus[p].channels[0].mean, levels[p], step_V / 2);
  }
}

TEST(FindPlateaus, ChecksItsArguments) {
  const std::vector<double> level(20, 1.0);
  const std::vector<double> shorter(19, 1.0);
  EXPECT_THROW(FindPlateaus(level, {&shorter}), std::invalid_argument);
  EXPECT_TRUE(FindPlateaus({}, {}).empty());
  const std::vector<Plateau> flat = FindPlateaus(level, {&level});  // one level: all of it
  ASSERT_EQ(flat.size(), 1u);
  EXPECT_EQ(flat[0].begin, 5u);  // segmentation.h: ⌈0.25 · 20⌉ dropped as transient
  EXPECT_EQ(flat[0].end, 20u);
  EXPECT_EQ(flat[0].channels[0].mean, 1.0);
}

TEST(NoiseFromDifferences, RecoversSigmaDespiteSteps) {
  std::mt19937 random(21);
  std::normal_distribution<double> noise(0.0, 0.05);
  std::vector<double> white(20000);
  for (double& x : white) x = noise(random);
  // statistics: the MAD estimate of σ from 20 000 differences is good to ~1 %; allow 5 %
  EXPECT_NEAR(NoiseFromDifferences(white), 0.05, 0.05 * 0.05);

  const Staircase stairs =
      MakeStaircase({1.0, 5.0, -3.0, 0.0, 7.0}, {4000, 4000, 4000, 4000, 4000}, 0.05, 0.0, 0.0, 22);
  EXPECT_NEAR(NoiseFromDifferences(stairs.voltage_V), 0.05, 0.05 * 0.05);
}

TEST(NoiseFromDifferences, ZeroForConstantsAndRamps) {
  EXPECT_EQ(NoiseFromDifferences(std::vector<double>(100, 3.0)), 0.0);  // physics: no variation
  std::vector<double> ramp(100);
  for (std::size_t i = 0; i < ramp.size(); ++i) ramp[i] = 0.25 * static_cast<double>(i);
  EXPECT_EQ(NoiseFromDifferences(ramp), 0.0);  // physics: equal differences have no spread
  EXPECT_EQ(NoiseFromDifferences({1.0}), 0.0);
}

// x = initial + amplitude·(1 − e^(−(k − k0)/τ)) for k ≥ k0 (a first-order rise; τ = 0: a jump at k0).
std::vector<double> MakeStep(std::size_t samples, std::size_t k0, double initial, double amplitude,
                             double tau_samples, double sigma, unsigned seed) {
  std::mt19937 random(seed);
  std::normal_distribution<double> noise(0.0, 1.0);
  std::vector<double> signal(samples);
  for (std::size_t k = 0; k < samples; ++k) {
    double rise = 0.0;
    if (k >= k0) {
      rise = tau_samples > 0.0 ? 1.0 - std::exp(-static_cast<double>(k - k0) / tau_samples) : 1.0;
    }
    signal[k] = initial + amplitude * rise + sigma * noise(random);
  }
  return signal;
}

TEST(FindStepOnset, JumpAndFirstOrderRise) {
  // segmentation.h: the last sample still at the initial level
  EXPECT_EQ(FindStepOnset(MakeStep(2000, 300, 0.0, 5.0, 0.0, 0.01, 31)), std::optional<std::size_t>(299));
  // The rise leaves the initial level after sample k0 = 300, where it still is.
  EXPECT_EQ(FindStepOnset(MakeStep(2000, 300, 0.0, 5.0, 20.0, 0.01, 32)), std::optional<std::size_t>(300));
  EXPECT_EQ(FindStepOnset(MakeStep(1000, 500, 10.0, -8.0, 0.0, 0.02, 33)), std::optional<std::size_t>(499));
  EXPECT_EQ(FindStepOnset(MakeStep(100, 40, 1.0, 2.0, 0.0, 0.0, 34)), std::optional<std::size_t>(39));
}

TEST(FindStepOnset, NoStepInNoiseConstantsOrALoneSpike) {
  EXPECT_FALSE(FindStepOnset(MakeStep(5000, 5000, 1.0, 0.0, 0.0, 0.1, 35)).has_value());
  EXPECT_FALSE(FindStepOnset(std::vector<double>(50, 2.0)).has_value());
  std::vector<double> spike(200, 0.0);
  spike[120] = 9.0;
  EXPECT_FALSE(FindStepOnset(spike).has_value());
  EXPECT_FALSE(FindStepOnset({0.0, 1.0}).has_value());
}

}  // namespace
}  // namespace coilspin

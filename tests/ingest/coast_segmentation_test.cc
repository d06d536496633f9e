// Spin-down segmentation on synthetic bench logs built from the closed-form
// solutions of the motor equations: a run-up at constant supply, a power-off
// at a known instant between samples, a coast to rest, fixed-seed noise.

#include "src/ingest/coast_segmentation.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdlib>
#include <random>
#include <stdexcept>
#include <vector>

#include "src/units/constants.h"

namespace coilspin {
namespace {

// A small brushed motor. Kt = Ke in SI (physics: power balance E·I = T·ω).
constexpr double kInertia_kg_m2 = 2e-5;       // J
constexpr double kViscous_N_m_s = 1e-5;       // B: B/J = 0.5 /s
constexpr double kCoulomb_N_m = 1e-3;         // Tc: Tc/J = 50 rad/s²
constexpr double kBackEmf_V_s = 0.02;         // Ke = Kt
constexpr double kResistance_ohm = 2.0;       // R
constexpr double kSupply_V = 6.4;             // runs at 300 rad/s

// Tolerances of the checks. Power off from current or voltage is a sample
// decision; from the speed, a line through noisy samples meets the run level:
// ±1 sample (the brief's requirement). Rest comes from a line through the last
// samples above a 4 σ band, against a stop where dω/dt = −Tc/J = −0.1 rad/s per
// sample: a few samples (3, common practice for "a few").
constexpr long kPowerOffSamples = 1;
constexpr long kRestSamples = 3;
// The run-up is still settling before power off: ω∞·e^(−t/τ) with t ≈ 1 s and
// τ = 0.095 s leaves about 0.01 rad/s (physics, the run-up solution below).
constexpr double kRunUpSettling_rad_s = 0.01;

struct Bench {
  double step_s = 2e-3;
  double power_off_s = 1.0013;  // between samples 500 and 501
  double end_s = 4.5;
  double braking_loop_ohm = 0.0;  // > 0: the terminals are shorted through this loop during the coast
  double direction = 1.0;
  double speed_sigma_rad_s = 0.05;
  double current_sigma_A = 2e-3;
  double voltage_sigma_V = 5e-3;
  bool log_speed = true;
  bool log_current = false;
  bool log_voltage = false;
  double counts_per_rev = 0.0;  // > 0: log quantised position instead of speed
};

struct SpinDown {
  BenchLog log;
  std::size_t power_off = 0;  // first sample with t ≥ power_off_s
  std::size_t rest = 0;       // first sample with t ≥ the analytic stop
  double speed_at_off_rad_s = 0.0;
};

// Run-up (L neglected, ω > 0): J·dω/dt = Kt·(V − Ke·ω)/R − B·ω − Tc is linear,
// so ω = ω∞·(1 − e^(−t/τ)), ω∞ = (Kt·V/R − Tc)/(Kt·Ke/R + B), τ = J/(Kt·Ke/R + B),
// i = (V − Ke·ω)/R, θ = ω∞·(t − τ·(1 − e^(−t/τ))) (physics: solve the ODE).
// Coast (t' = t − t_off): J·dω/dt = −B'·ω − Tc with B' = B (open circuit, i = 0,
// v = Ke·ω) or B' = B + Kt·Ke/R_loop (shorted: i = −Ke·ω/R_loop), so
// ω = (ω_off + Tc/B')·e^(−t'·B'/J) − Tc/B' until t_s = (J/B')·ln(1 + B'·ω_off/Tc),
// then 0; θ = θ_off + (ω_off + Tc/B')·(1 − e^(−t'·B'/J))·J/B' − (Tc/B')·t'
// (physics: solve the ODE; the references table of the design notes).
SpinDown MakeSpinDown(const Bench& bench, unsigned seed) {
  const double electrical_damping = kBackEmf_V_s * kBackEmf_V_s / kResistance_ohm;
  const double final_speed = (kBackEmf_V_s * kSupply_V / kResistance_ohm - kCoulomb_N_m) /
                             (electrical_damping + kViscous_N_m_s);
  const double tau_s = kInertia_kg_m2 / (electrical_damping + kViscous_N_m_s);
  const double coast_viscous = kViscous_N_m_s + (bench.braking_loop_ohm > 0.0
                                                     ? kBackEmf_V_s * kBackEmf_V_s / bench.braking_loop_ohm
                                                     : 0.0);
  const double b = coast_viscous / kInertia_kg_m2;
  const double c = kCoulomb_N_m / kInertia_kg_m2;
  const double t_off = bench.power_off_s;
  const double speed_off = final_speed * (1.0 - std::exp(-t_off / tau_s));
  const double angle_off = final_speed * (t_off - tau_s * (1.0 - std::exp(-t_off / tau_s)));
  const double stop_s = std::log(1.0 + b * speed_off / c) / b;

  std::mt19937_64 random(seed);
  std::normal_distribution<double> unit(0.0, 1.0);
  std::uniform_real_distribution<double> encoder_zero(0.0, units::kRadiansPerRevolution);
  const double zero_rad = encoder_zero(random);
  SpinDown spin;
  spin.speed_at_off_rad_s = bench.direction * speed_off;
  bool off_found = false;
  bool rest_found = false;
  for (std::size_t k = 0;; ++k) {
    const double t = static_cast<double>(k) * bench.step_s;
    if (t > bench.end_s) break;
    double speed = 0.0, angle = 0.0, current = 0.0, voltage = 0.0;
    if (t < t_off) {
      speed = final_speed * (1.0 - std::exp(-t / tau_s));
      angle = final_speed * (t - tau_s * (1.0 - std::exp(-t / tau_s)));
      current = (kSupply_V - kBackEmf_V_s * speed) / kResistance_ohm;
      voltage = kSupply_V;
    } else {
      if (!off_found) spin.power_off = k;
      off_found = true;
      const double since = std::min(t - t_off, stop_s);
      if (t - t_off >= stop_s && !rest_found) {
        spin.rest = k;
        rest_found = true;
      }
      speed = t - t_off < stop_s ? (speed_off + c / b) * std::exp(-b * since) - c / b : 0.0;
      angle = angle_off + (speed_off + c / b) * (1.0 - std::exp(-b * since)) / b - (c / b) * since;
      current = bench.braking_loop_ohm > 0.0 ? -kBackEmf_V_s * speed / bench.braking_loop_ohm : 0.0;
      voltage = kBackEmf_V_s * speed + kResistance_ohm * current;
    }
    BenchLog& log = spin.log;
    log.time_s.push_back(t);
    if (bench.counts_per_rev > 0.0) {
      const double step_rad = units::kRadiansPerRevolution / bench.counts_per_rev;
      log.position_rad.push_back(step_rad * std::round((zero_rad + bench.direction * angle) / step_rad));
    } else if (bench.log_speed) {
      log.speed_rad_s.push_back(bench.direction * speed + bench.speed_sigma_rad_s * unit(random));
    }
    if (bench.log_current) log.current_A.push_back(bench.direction * current + bench.current_sigma_A * unit(random));
    if (bench.log_voltage) log.voltage_V.push_back(bench.direction * voltage + bench.voltage_sigma_V * unit(random));
  }
  if (!rest_found) spin.rest = spin.log.size();
  return spin;
}

long Difference(std::size_t found, std::size_t truth) {
  return static_cast<long>(found) - static_cast<long>(truth);
}

// Every route, over several noise seeds: power off within ±1 sample of the first
// sample after the true instant, rest within a few samples of the analytic stop
// t_s = (J/B)·ln(1 + B·ω₀/Tc) (physics, design references table).
void ExpectRoute(const Bench& bench, PowerOffEvidence expected, long power_off_samples = kPowerOffSamples) {
  for (unsigned seed = 1; seed <= 20; ++seed) {
    const SpinDown spin = MakeSpinDown(bench, seed);
    const std::optional<CoastSegment> coast = FindCoast(spin.log);
    ASSERT_TRUE(coast.has_value()) << "seed " << seed;
    EXPECT_EQ(coast->evidence, expected) << "seed " << seed;
    EXPECT_EQ(coast->how, PowerOffEvidenceText(expected));
    EXPECT_LE(std::abs(Difference(coast->power_off, spin.power_off)), power_off_samples)
        << "seed " << seed << ": power off at " << coast->power_off << ", truth " << spin.power_off;
    EXPECT_TRUE(coast->reached_rest) << "seed " << seed;
    EXPECT_LE(std::abs(Difference(coast->rest, spin.rest)), kRestSamples)
        << "seed " << seed << ": rest at " << coast->rest << ", truth " << spin.rest;
    EXPECT_EQ(coast->direction, bench.direction);
    // Physics: the run level is ω at power off; the median of 32 samples of noise
    // σ is within 5 standard errors (5·1.25·σ/√32 ≈ 1.1 σ; statistics).
    EXPECT_NEAR(coast->run_speed_rad_s, spin.speed_at_off_rad_s,
                1.1 * bench.speed_sigma_rad_s + kRunUpSettling_rad_s);
  }
}

TEST(FindCoast, CurrentFallsToZero) {
  Bench bench;
  bench.log_current = true;
  bench.log_voltage = true;
  ExpectRoute(bench, PowerOffEvidence::kCurrentFell);
}

TEST(FindCoast, VoltageCollapsesToTheBackEmf) {
  Bench bench;
  bench.log_voltage = true;
  ExpectRoute(bench, PowerOffEvidence::kVoltageCollapsed);
}

TEST(FindCoast, SpeedBeginsToFall) {
  ExpectRoute(Bench{}, PowerOffEvidence::kSpeedFell);
}

TEST(FindCoast, SpeedBeginsToFallThroughNoise) {
  // Speed noise σ = 0.2 rad/s: the fall leaves the 4 σ band only 2 samples
  // after power off (dω/dt = −(B·ω₀ + Tc)/J = −0.4 rad/s per sample, physics),
  // and the rest band is entered 8 samples before the stop; the straight-line
  // fits must move both back. A line through noisy samples places the onset to
  // about σ/|dω/dt| = 0.5 sample (1 s.d.): 4 s.d. is 2 samples (statistics).
  constexpr long kNoisyPowerOffSamples = 2;
  Bench bench;
  bench.speed_sigma_rad_s = 0.2;
  ExpectRoute(bench, PowerOffEvidence::kSpeedFell, kNoisyPowerOffSamples);
}

TEST(FindCoast, ReverseRotation) {
  Bench bench;
  bench.direction = -1.0;
  bench.log_current = true;
  ExpectRoute(bench, PowerOffEvidence::kCurrentFell);
  bench.log_current = false;
  bench.log_voltage = true;
  ExpectRoute(bench, PowerOffEvidence::kVoltageCollapsed);
}

TEST(FindCoast, OpenCircuitCoastCarriesOnlyCurrentNoise) {
  Bench bench;
  bench.log_current = true;
  const SpinDown spin = MakeSpinDown(bench, 7);
  const std::optional<CoastSegment> coast = FindCoast(spin.log);
  ASSERT_TRUE(coast.has_value());
  // Statistics: the RMS of ~1400 samples of white noise σ is σ·(1 ± 0.02); allow 10 %.
  EXPECT_NEAR(coast->off_current_rms_A, bench.current_sigma_A, 0.10 * bench.current_sigma_A);
  // Statistics: the mean of n noise samples is within 5 standard errors σ/√n of 0.
  EXPECT_NEAR(coast->off_current_mean_A, 0.0, 5.0 * bench.current_sigma_A / std::sqrt(coast->size()));
  // coast_segmentation.h: flagged above 3 σ RMS; a full coast to rest is not truncated.
  EXPECT_FALSE(CurrentFlowsDuringCoast(spin.log, *coast));
  EXPECT_FALSE(StopsLongBeforeRest(spin.log.speed_rad_s, *coast));
  EXPECT_TRUE(CheckCoast(spin.log, spin.log.speed_rad_s, *coast).messages.empty());
}

TEST(FindCoast, BrakingThroughTheDriverIsFlagged) {
  // The driver shorts the terminals through a 2 Ω loop: i = −Ke·ω/R_loop, about
  // −3 A at power off (physics). The current "falls to zero" only at rest, where
  // the speed is no longer at its run level, so the speed locates power off.
  Bench bench;
  bench.log_current = true;
  bench.braking_loop_ohm = 2.0;
  for (unsigned seed = 1; seed <= 10; ++seed) {
    const SpinDown spin = MakeSpinDown(bench, seed);
    const std::optional<CoastSegment> coast = FindCoast(spin.log);
    ASSERT_TRUE(coast.has_value());
    EXPECT_EQ(coast->evidence, PowerOffEvidence::kSpeedFell);
    EXPECT_LE(std::abs(Difference(coast->power_off, spin.power_off)), kPowerOffSamples) << "seed " << seed;
    EXPECT_LE(std::abs(Difference(coast->rest, spin.rest)), kRestSamples) << "seed " << seed;
    EXPECT_TRUE(CurrentFlowsDuringCoast(spin.log, *coast));
    EXPECT_LT(coast->off_current_mean_A, -0.1);  // physics: braking current opposes the rotation
    const CoastWarnings warnings = CheckCoast(spin.log, spin.log.speed_rad_s, *coast);
    EXPECT_TRUE(warnings.current_flows);
    ASSERT_EQ(warnings.messages.size(), 1u);
    EXPECT_NE(warnings.messages[0].find("current flows during the coast"), std::string::npos);
  }
}

// The log ends when ω has fallen to `fraction` of ω_off: from the closed form,
// t' = (J/B)·ln((ω_off + Tc/B)/(fraction·ω_off + Tc/B)) (physics).
double EndAtFraction(const Bench& bench, double speed_off, double fraction) {
  const double b = kViscous_N_m_s / kInertia_kg_m2;
  const double c = kCoulomb_N_m / kInertia_kg_m2;
  return bench.power_off_s + std::log((speed_off + c / b) / (fraction * speed_off + c / b)) / b;
}

TEST(FindCoast, TruncatedLogIsFlagged) {
  Bench bench;
  const double speed_off = MakeSpinDown(bench, 1).speed_at_off_rad_s;
  bench.end_s = EndAtFraction(bench, speed_off, 0.5);
  const SpinDown half = MakeSpinDown(bench, 2);
  const std::optional<CoastSegment> coast = FindCoast(half.log);
  ASSERT_TRUE(coast.has_value());
  EXPECT_LE(std::abs(Difference(coast->power_off, half.power_off)), kPowerOffSamples);
  EXPECT_FALSE(coast->reached_rest);
  EXPECT_EQ(coast->rest, half.log.size());
  // coast_segmentation.h: flagged above 20 % of the run speed; this log ends at 50 %.
  EXPECT_TRUE(StopsLongBeforeRest(half.log.speed_rad_s, *coast));
  const CoastWarnings warnings = CheckCoast(half.log, half.log.speed_rad_s, *coast);
  EXPECT_TRUE(warnings.stops_long_before_rest);
  EXPECT_EQ(warnings.messages.size(), 1u);

  bench.end_s = EndAtFraction(bench, speed_off, 0.1);  // ends at 10 %: below the 20 % limit
  const SpinDown most = MakeSpinDown(bench, 3);
  const std::optional<CoastSegment> longer = FindCoast(most.log);
  ASSERT_TRUE(longer.has_value());
  EXPECT_FALSE(longer->reached_rest);
  EXPECT_FALSE(StopsLongBeforeRest(most.log.speed_rad_s, *longer));
  // ... but a stricter fraction, 5 %, flags it.
  EXPECT_TRUE(StopsLongBeforeRest(most.log.speed_rad_s, *longer, 0.05));
}

TEST(FindCoast, EncoderPositionOnly) {
  // A 2048-count encoder: speed is derived by Savitzky–Golay (encoder_speed.h),
  // whose window smooths the power-off corner over ±m samples; power off is
  // still found within the window's half width m = 2 (encoder_speed.h default
  // for this noise), rest within a few samples.
  Bench bench;
  bench.counts_per_rev = 2048.0;
  constexpr long kHalfWidth = 2;
  for (unsigned seed = 1; seed <= 10; ++seed) {
    const SpinDown spin = MakeSpinDown(bench, seed);
    const std::optional<CoastSegment> coast = FindCoast(spin.log);
    ASSERT_TRUE(coast.has_value());
    EXPECT_EQ(coast->evidence, PowerOffEvidence::kSpeedFell);
    EXPECT_LE(std::abs(Difference(coast->power_off, spin.power_off)), kHalfWidth) << "seed " << seed;
    EXPECT_TRUE(coast->reached_rest);
    EXPECT_LE(std::abs(Difference(coast->rest, spin.rest)), kRestSamples) << "seed " << seed;
  }
}

TEST(FindCoast, NoCoastNoMotionAndBadLengths) {
  // coast_segmentation.h: empty without a fall from a run level or without
  // speed or position; std::invalid_argument for channels of other lengths.
  // `why` names the rule that found none, with its numbers (issue 9: the message
  // says which rule rejected the log).
  Bench bench;
  bench.power_off_s = 10.0;  // never switched off within the 4.5 s log
  NoCoast why;
  EXPECT_FALSE(FindCoast(MakeSpinDown(bench, 1).log, &why).has_value());
  EXPECT_EQ(why.rule, NoCoastRule::kNoFall);
  EXPECT_LT(why.count, why.needed);
  EXPECT_NEAR(why.value, 300.0, 1.0);  // the run level, ω∞ ≈ 300 rad/s (the bench's comment)
  EXPECT_NE(NoCoastText(why).find("stays within"), std::string::npos) << NoCoastText(why);
  BenchLog still;
  still.time_s = std::vector<double>(100, 0.0);
  for (std::size_t k = 0; k < 100; ++k) still.time_s[k] = 1e-3 * static_cast<double>(k);
  EXPECT_FALSE(FindCoast(still, &why).has_value());  // neither speed nor position
  EXPECT_EQ(why.rule, NoCoastRule::kNoSpeed);
  still.speed_rad_s = std::vector<double>(100, 0.0);
  EXPECT_FALSE(FindCoast(still, &why).has_value());  // never turns
  EXPECT_EQ(why.rule, NoCoastRule::kNeverTurns);
  EXPECT_EQ(NoCoastText(why), "no coast: the speed is 0 in all 100 samples");
  BenchLog few;
  few.time_s = {0.0, 1e-3, 2e-3};
  few.speed_rad_s = {5.0, 4.0, 3.0};
  EXPECT_FALSE(FindCoast(few, &why).has_value());
  EXPECT_EQ(why.rule, NoCoastRule::kTooFewSamples);
  EXPECT_EQ(why.count, 3u);
  EXPECT_THROW(FindCoast(still, std::vector<double>(99, 0.0)), std::invalid_argument);
  still.current_A = std::vector<double>(50, 0.0);
  EXPECT_THROW(FindCoast(still), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin

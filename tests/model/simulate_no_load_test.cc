#include "src/model/simulate_no_load.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <string>
#include <utility>
#include <vector>

#include "src/model/free_shaft_dynamics.h"
#include "src/model/free_shaft_time_constants.h"

namespace coilspin::model {
namespace {

// RK4 at 20 steps per fastest time constant (src/model/free_shaft_dynamics.h): settled values
// agree with the steady-state equations to well below 1e-8.
constexpr double kSettledRelativeTolerance = 1e-8;
// Holds of this many slowest time constants leave e^(−40) ≈ 4e-18 of a transient.
constexpr double kSettleTimeConstants = 40.0;
constexpr double kSamplePeriod_s = 1e-4;

// R, L, Ke, Kt, J, B, Tc, Vb
const MotorParameters kMotor{1.5, 1.2e-3, 0.03, 0.028, 5e-6, 2e-6, 2.5e-3, 0.4};

NoLoadPlan SettlingPlan(const MotorParameters& motor, const BenchConditions& bench, std::vector<double> levels_V) {
  FreeShaftInput input;
  input.supply_resistance_ohm = bench.supply_resistance_ohm;
  NoLoadPlan plan;
  plan.supply_levels_V = std::move(levels_V);
  plan.sample_period_s = kSamplePeriod_s;
  // whole samples, so that level j starts at sample j·n
  const double hold_s = kSettleTimeConstants * TimeConstantsOf(motor, input).slowest_s;
  plan.hold_s = std::ceil(hold_s / kSamplePeriod_s) * kSamplePeriod_s;
  return plan;
}

std::size_t SamplesPerLevel(const NoLoadPlan& plan) {
  return static_cast<std::size_t>(std::llround(plan.hold_s / plan.sample_period_s));
}

TEST(SimulateNoLoad, EachLevelSettlesAtTheNoLoadPoint) {
  BenchConditions bench;
  bench.supply_resistance_ohm = 0.25;
  const NoLoadPlan plan = SettlingPlan(kMotor, bench, {3.0, 6.0, 9.0, 4.5});
  const SampledLog log = SimulateNoLoad(kMotor, plan, bench);
  const std::size_t per_level = SamplesPerLevel(plan);
  ASSERT_EQ(log.time_s.size(), per_level * plan.supply_levels_V.size());
  ASSERT_EQ(log.speed_rad_s.size(), log.time_s.size());
  EXPECT_TRUE(log.position_rad.empty());
  EXPECT_EQ(log.speed_rad_s.front(), 0.0);  // from rest
  EXPECT_EQ(log.current_A.front(), 0.0);
  for (std::size_t level = 0; level < plan.supply_levels_V.size(); ++level) {
    const std::size_t last = (level + 1) * per_level - 1;
    const double v_s = plan.supply_levels_V[level];
    const double i = log.current_A[last], w = log.speed_rad_s[last], v = log.voltage_V[last];
    // t_k = k·Δ (documented sample instants)
    EXPECT_NEAR(log.time_s[last], static_cast<double>(last) * kSamplePeriod_s, 1e-12);
    // physics (Kirchhoff): v = V_s − R_s·i
    EXPECT_NEAR(v, v_s - bench.supply_resistance_ohm * i, 1e-12 * v_s);
    // physics (steady state of both equations, i > 0, ω > 0):
    //   ω = (v − Vb − R·i)/Ke   and   i = (B·ω + Tc)/Kt
    const double speed_from_voltage = (v - kMotor.brush_drop_V - kMotor.resistance_ohm * i) /
                                      kMotor.back_emf_constant_V_s_per_rad;
    const double current_from_friction =
        (kMotor.viscous_friction_N_m_s_per_rad * w + kMotor.coulomb_friction_N_m) / kMotor.torque_constant_N_m_per_A;
    EXPECT_NEAR(w, speed_from_voltage, kSettledRelativeTolerance * w) << "level " << v_s << " V";
    EXPECT_NEAR(i, current_from_friction, kSettledRelativeTolerance * i) << "level " << v_s << " V";
  }
}

TEST(SimulateNoLoad, FrictionlessMotorSpinsAtTheIdealNoLoadSpeed) {
  // physics (docs/methods.md §1): with B = Tc = 0 and Vb = 0 the settled current is 0 and
  // ω = V/Ke, the ideal no-load speed, whatever R_s is
  MotorParameters motor = kMotor;
  motor.viscous_friction_N_m_s_per_rad = 0.0;
  motor.coulomb_friction_N_m = 0.0;
  motor.brush_drop_V = 0.0;
  BenchConditions bench;
  bench.supply_resistance_ohm = 0.5;
  const NoLoadPlan plan = SettlingPlan(motor, bench, {5.0, 10.0});
  const SampledLog log = SimulateNoLoad(motor, plan, bench);
  const std::size_t per_level = SamplesPerLevel(plan);
  for (std::size_t level = 0; level < plan.supply_levels_V.size(); ++level) {
    const std::size_t last = (level + 1) * per_level - 1;
    const double ideal_rad_s = plan.supply_levels_V[level] / motor.back_emf_constant_V_s_per_rad;
    EXPECT_NEAR(log.speed_rad_s[last], ideal_rad_s, kSettledRelativeTolerance * ideal_rad_s);
    const double stall_A = plan.supply_levels_V[level] / motor.resistance_ohm;
    EXPECT_NEAR(log.current_A[last], 0.0, kSettledRelativeTolerance * stall_A);
  }
}

TEST(SimulateNoLoad, ReversedLevelMirrorsTheForwardOne) {
  // physics: with τ_load = 0 the model is odd in (V, i, ω), so −V settles at the mirror image of +V
  const BenchConditions bench;
  const NoLoadPlan plan = SettlingPlan(kMotor, bench, {7.0, -7.0});
  const SampledLog log = SimulateNoLoad(kMotor, plan, bench);
  const std::size_t per_level = SamplesPerLevel(plan);
  const double forward = log.speed_rad_s[per_level - 1], backward = log.speed_rad_s.back();
  EXPECT_GT(forward, 0.0);
  EXPECT_NEAR(backward, -forward, kSettledRelativeTolerance * forward);
  EXPECT_NEAR(log.current_A.back(), -log.current_A[per_level - 1],
              kSettledRelativeTolerance * std::abs(log.current_A.back()));
}

TEST(SimulateNoLoad, ResistanceFollowsTheWindingTemperature) {
  // IEC 60028 (references.md check value): R(75 °C)/R(20 °C) = 1.2161; the settled no-load point
  // satisfies ω = (v − Vb − R(75 °C)·i)/Ke
  constexpr double kRatio75Over20 = 1.2161, kRatioDecimalsTolerance = 5e-5;
  BenchConditions bench;
  bench.resistance_reference_temperature_degC = 20.0;
  bench.winding_temperature_degC = 75.0;
  MotorParameters warm = kMotor;  // only to choose a hold that settles the warm motor
  warm.resistance_ohm *= kRatio75Over20;
  NoLoadPlan plan = SettlingPlan(warm, bench, {8.0});
  plan.log_temperature = true;
  const SampledLog log = SimulateNoLoad(kMotor, plan, bench);
  ASSERT_EQ(log.temperature_degC.size(), log.time_s.size());
  EXPECT_EQ(log.temperature_degC.back(), bench.winding_temperature_degC);
  const double i = log.current_A.back(), w = log.speed_rad_s.back(), v = log.voltage_V.back();
  const double warm_ohm = (v - kMotor.brush_drop_V - kMotor.back_emf_constant_V_s_per_rad * w) / i;
  EXPECT_NEAR(warm_ohm / kMotor.resistance_ohm, kRatio75Over20, kRatioDecimalsTolerance);
}

TEST(SimulateNoLoad, SpeedNoiseHasTheRequestedSigmaAndLeavesOtherChannelsAlone) {
  // common practice: the sample standard deviation of n white deviates has relative standard
  // error about 1/√(2n); a fixed seed, a 4-SE band
  const BenchConditions exact;
  BenchConditions noisy;
  noisy.speed_noise_sigma_rad_s = 0.5;
  noisy.seed = 7;
  const NoLoadPlan plan = SettlingPlan(kMotor, exact, {6.0, 12.0});
  const SampledLog clean = SimulateNoLoad(kMotor, plan, exact);
  const SampledLog log = SimulateNoLoad(kMotor, plan, noisy);
  double sum_squares = 0.0;
  for (std::size_t k = 0; k < log.speed_rad_s.size(); ++k) {
    const double deviation = log.speed_rad_s[k] - clean.speed_rad_s[k];
    sum_squares += deviation * deviation;
  }
  const double n = static_cast<double>(log.speed_rad_s.size());
  const double sigma_hat = std::sqrt(sum_squares / n);
  EXPECT_NEAR(sigma_hat / noisy.speed_noise_sigma_rad_s, 1.0, 4.0 / std::sqrt(2.0 * n));
  // noise streams per channel (src/model/noise_streams.h): voltage and current are untouched
  EXPECT_EQ(log.current_A, clean.current_A);
  EXPECT_EQ(log.voltage_V, clean.voltage_V);
}

TEST(SimulateNoLoad, RejectsPlansThatCannotBeSimulated) {
  // common practice: misuse is reported, not simulated into nonsense
  const BenchConditions bench;
  NoLoadPlan no_levels;
  EXPECT_THROW(SimulateNoLoad(kMotor, no_levels, bench), std::invalid_argument);
  NoLoadPlan short_hold;
  short_hold.supply_levels_V = {1.0};
  short_hold.hold_s = 0.1 * short_hold.sample_period_s;
  EXPECT_THROW(SimulateNoLoad(kMotor, short_hold, bench), std::invalid_argument);
  NoLoadPlan plan;
  plan.supply_levels_V = {1.0};
  plan.hold_s = 0.01;
  MotorParameters no_back_emf = kMotor;
  no_back_emf.back_emf_constant_V_s_per_rad = 0.0;
  EXPECT_THROW(SimulateNoLoad(no_back_emf, plan, bench), std::invalid_argument);
  MotorParameters no_inertia = kMotor;
  no_inertia.inertia_kg_m2 = 0.0;
  try {
    SimulateNoLoad(no_inertia, plan, bench);
    ADD_FAILURE() << "J = 0 was simulated";
  } catch (const std::invalid_argument& e) {
    EXPECT_NE(std::string(e.what()).find("no-load simulation: "), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace coilspin::model

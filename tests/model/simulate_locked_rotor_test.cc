#include "src/model/simulate_locked_rotor.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>

namespace coilspin::model {
namespace {

constexpr double kAnalyticRelativeTolerance = 1e-9;  // the brief's requirement for exact solutions
constexpr double kRoundingTolerance = 1e-12;
// Holds of this many time constants leave e^(−40) ≈ 4e-18 of a transient: settled.
constexpr double kSettleTimeConstants = 40.0;

MotorParameters Motor(double r_ohm, double l_H, double vb_V) {
  MotorParameters motor;
  motor.resistance_ohm = r_ohm;
  motor.inductance_H = l_H;
  motor.brush_drop_V = vb_V;
  return motor;
}

// Step() logs 0.5 ms before the step at 10 µs: the step is at sample 50.
constexpr std::size_t kStepIndex = 50;

StepPlan Step(double before_V, double after_V) {
  StepPlan plan;
  plan.supply_before_V = before_V;
  plan.supply_after_V = after_V;
  plan.before_s = 0.5e-3;
  plan.after_s = 10e-3;
  plan.sample_period_s = 10e-6;
  return plan;
}

TEST(SimulateLockedRotorStep, MatchesTheAnalyticRiseWithAnIdealSupply) {
  const double r_ohm = 2.2, l_H = 1.5e-3, v_V = 12.0;
  const StepPlan plan = Step(0.0, v_V);
  const SampledLog log = SimulateLockedRotorStep(Motor(r_ohm, l_H, 0.0), plan, BenchConditions{});
  const std::size_t step_index = kStepIndex;
  ASSERT_EQ(log.time_s.size(), step_index + 1000);
  EXPECT_TRUE(log.temperature_degC.empty());
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    // t_k = k·Δ (documented sample instants)
    EXPECT_NEAR(log.time_s[k], static_cast<double>(k) * plan.sample_period_s, kRoundingTolerance);
    if (k < step_index) {
      EXPECT_EQ(log.current_A[k], 0.0);
      EXPECT_EQ(log.voltage_V[k], 0.0);
      continue;
    }
    // physics (first-order ODE from rest): i(t) = (V/R)·(1 − e^(−t·R/L)), t from the step
    const double t_s = log.time_s[k] - log.time_s[step_index];
    const double expected_A = v_V / r_ohm * (1.0 - std::exp(-t_s * r_ohm / l_H));
    EXPECT_NEAR(log.current_A[k], expected_A, kAnalyticRelativeTolerance * expected_A) << k;
    EXPECT_EQ(log.voltage_V[k], v_V);  // ideal supply: v = V_s
  }
}

TEST(SimulateLockedRotorStep, SupplyResistanceSagsTheTerminalVoltage) {
  const double r_ohm = 1.0, l_H = 1e-3, rs_ohm = 0.25, vb_V = 0.6, v_V = 6.0;
  BenchConditions bench;
  bench.supply_resistance_ohm = rs_ohm;
  const SampledLog log = SimulateLockedRotorStep(Motor(r_ohm, l_H, vb_V), Step(0.0, v_V), bench);
  const std::size_t step_index = kStepIndex;
  for (std::size_t k = step_index; k < log.time_s.size(); ++k) {
    // physics (Kirchhoff's voltage law): v = V_s − R_s·i
    EXPECT_NEAR(log.voltage_V[k], v_V - rs_ohm * log.current_A[k], kRoundingTolerance * v_V);
    // physics (first-order ODE, loop resistance R + R_s): i = ((V − Vb)/(R + R_s))·(1 − e^(−t(R + R_s)/L))
    const double t_s = log.time_s[k] - log.time_s[step_index];
    const double expected_A =
        (v_V - vb_V) / (r_ohm + rs_ohm) * (1.0 - std::exp(-t_s * (r_ohm + rs_ohm) / l_H));
    EXPECT_NEAR(log.current_A[k], expected_A, kAnalyticRelativeTolerance * expected_A) << k;
  }
}

TEST(SimulateLockedRotorStep, StartsSettledAtTheLevelBefore) {
  const double r_ohm = 2.0, l_H = 2e-3, vb_V = 0.5, before_V = 4.0, after_V = 10.0;
  const SampledLog log =
      SimulateLockedRotorStep(Motor(r_ohm, l_H, vb_V), Step(before_V, after_V), BenchConditions{});
  // physics (d/dt = 0): i = (V − Vb)/R before the step
  const double before_A = (before_V - vb_V) / r_ohm;
  const double after_A = (after_V - vb_V) / r_ohm;
  EXPECT_NEAR(log.current_A.front(), before_A, kRoundingTolerance);
  const std::size_t step_index = kStepIndex;
  const std::size_t k = step_index + 37;
  // physics: i(t) = i_∞ + (i_0 − i_∞)·e^(−t·R/L)
  const double t_s = log.time_s[k] - log.time_s[step_index];
  const double expected_A = after_A + (before_A - after_A) * std::exp(-t_s * r_ohm / l_H);
  EXPECT_NEAR(log.current_A[k], expected_A, kAnalyticRelativeTolerance * expected_A);
}

TEST(SimulateLockedRotorPlateaus, CurrentsSettleToTheDcValues) {
  const double r_ohm = 3.0, l_H = 3e-3, vb_V = 0.9, rs_ohm = 0.1;
  PlateauPlan plan;
  plan.supply_levels_V = {2.0, 6.0, -4.0, 0.5, 12.0};
  plan.sample_period_s = 1e-4;
  plan.hold_s = kSettleTimeConstants * l_H / r_ohm;  // 40 ms, 400 samples
  BenchConditions bench;
  bench.supply_resistance_ohm = rs_ohm;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(r_ohm, l_H, vb_V), plan, bench);
  const std::size_t per_level = 400;
  ASSERT_EQ(log.time_s.size(), per_level * plan.supply_levels_V.size());
  EXPECT_EQ(log.current_A.front(), 0.0);  // starts from rest
  for (std::size_t level = 0; level < plan.supply_levels_V.size(); ++level) {
    const double v_V = plan.supply_levels_V[level];
    // physics (d/dt = 0): i = (V − Vb·sgn(V))/(R + R_s) for |V| > Vb, else 0 (brush rule)
    const double expected_A =
        std::abs(v_V) > vb_V ? (v_V - std::copysign(vb_V, v_V)) / (r_ohm + rs_ohm) : 0.0;
    const std::size_t last = (level + 1) * per_level - 1;
    EXPECT_NEAR(log.current_A[last], expected_A, kAnalyticRelativeTolerance * std::abs(expected_A))
        << "level " << v_V << " V";
    // physics (Kirchhoff): v = V_s − R_s·i
    EXPECT_NEAR(log.voltage_V[last], v_V - rs_ohm * expected_A, kAnalyticRelativeTolerance * 12.0);
  }
}

TEST(SimulateLockedRotorPlateaus, WindingHeatsFromPlateauToPlateau) {
  const double r_ohm = 2.0, l_H = 1e-3, vb_V = 0.7, v_V = 10.0;
  PlateauPlan plan;
  plan.supply_levels_V = {v_V, v_V, v_V, v_V, v_V};
  plan.sample_period_s = 1e-4;
  plan.hold_s = kSettleTimeConstants * l_H / r_ohm;  // 200 samples
  plan.log_temperature = true;
  BenchConditions bench;
  bench.winding_temperature_degC = 25.0;
  bench.resistance_reference_temperature_degC = 25.0;
  bench.heating_per_plateau_K = 10.0;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(r_ohm, l_H, vb_V), plan, bench);
  const std::size_t per_level = 200;
  ASSERT_EQ(log.temperature_degC.size(), log.time_s.size());
  for (std::size_t level = 0; level < plan.supply_levels_V.size(); ++level) {
    const double theta_degC = 25.0 + 10.0 * static_cast<double>(level);
    const std::size_t last = (level + 1) * per_level - 1;
    EXPECT_DOUBLE_EQ(log.temperature_degC[last], theta_degC);
    EXPECT_DOUBLE_EQ(log.temperature_degC[last + 1 - per_level], theta_degC);
    // physics: R = (V − Vb)/i on a settled plateau; IEC 60028 copper law R(θ) = R_ref·(k + θ)/(k + θ_ref)
    const double measured_ohm = (v_V - vb_V) / log.current_A[last];
    EXPECT_NEAR(measured_ohm, r_ohm * (234.5 + theta_degC) / (234.5 + 25.0),
                kAnalyticRelativeTolerance * r_ohm);
  }
  // IEC 60028-derived check value: R(65 °C)/R(25 °C) = 299.5/259.5 = 1.15414 (by hand)
  const double last_ohm = (v_V - vb_V) / log.current_A.back();
  EXPECT_NEAR(last_ohm / r_ohm, 1.15414, 1e-5);
}

TEST(SimulateLockedRotorPlateaus, ResistanceGivenAtAnotherTemperatureIsCorrected) {
  const double r_ohm = 1.0, l_H = 1e-3, v_V = 5.0;
  PlateauPlan plan;
  plan.supply_levels_V = {v_V};
  plan.sample_period_s = 1e-4;
  plan.hold_s = kSettleTimeConstants * l_H / r_ohm;
  BenchConditions bench;
  bench.resistance_reference_temperature_degC = 20.0;
  bench.winding_temperature_degC = 75.0;
  const SampledLog log = SimulateLockedRotorPlateaus(Motor(r_ohm, l_H, 0.0), plan, bench);
  // IEC 60028 (references.md check value): R(75 °C)/R(20 °C) = 1.2161
  EXPECT_NEAR(v_V / log.current_A.back(), 1.2161, 5e-5);
}

TEST(SimulateLockedRotor, RejectsPlansThatCannotBeSimulated) {
  // common practice: misuse is reported, not simulated into nonsense
  const MotorParameters motor = Motor(1.0, 1e-3, 0.0);
  PlateauPlan no_levels;
  EXPECT_THROW(SimulateLockedRotorPlateaus(motor, no_levels, BenchConditions{}),
               std::invalid_argument);
  PlateauPlan short_hold;
  short_hold.supply_levels_V = {1.0};
  short_hold.hold_s = 0.1 * short_hold.sample_period_s;
  EXPECT_THROW(SimulateLockedRotorPlateaus(motor, short_hold, BenchConditions{}),
               std::invalid_argument);
  StepPlan zero_period = Step(0.0, 1.0);
  zero_period.sample_period_s = 0.0;
  EXPECT_THROW(SimulateLockedRotorStep(motor, zero_period, BenchConditions{}),
               std::invalid_argument);
  EXPECT_THROW(SimulateLockedRotorStep(Motor(1.0, -1e-3, 0.0), Step(0.0, 1.0), BenchConditions{}),
               std::invalid_argument);
  BenchConditions negative_sigma;
  negative_sigma.current_noise_sigma_A = -1.0;
  EXPECT_THROW(SimulateLockedRotorStep(motor, Step(0.0, 1.0), negative_sigma),
               std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model

#include "src/model/simulate_spin_down.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>

#include "src/model/free_shaft_dynamics.h"
#include "src/model/free_shaft_time_constants.h"

namespace coilspin::model {
namespace {

// RK4 at 20 steps per fastest time constant (src/model/free_shaft_dynamics.h).
constexpr double kIntegratorRelativeTolerance = 1e-8;
constexpr double kSettleTimeConstants = 40.0;  // e^(−40): the run-up has settled
constexpr double kSamplePeriod_s = 1e-4;

// R, L, Ke, Kt, J, B, Tc, Vb
const MotorParameters kMotor{1.5, 1.2e-3, 0.03, 0.028, 5e-6, 1e-5, 2.5e-3, 0.4};

SpinDownPlan SettledRunThenCoast(const MotorParameters& motor, double supply_V, double coast_s) {
  FreeShaftInput input;
  input.supply_V = supply_V;
  SpinDownPlan plan;
  plan.supply_V = supply_V;
  plan.sample_period_s = kSamplePeriod_s;
  plan.run_s = std::ceil(kSettleTimeConstants * TimeConstantsOf(motor, input).slowest_s / kSamplePeriod_s) *
               kSamplePeriod_s;
  plan.coast_s = coast_s;
  return plan;
}

std::size_t PowerOffIndex(const SpinDownPlan& plan) {
  return static_cast<std::size_t>(std::llround(SpinDownPowerOffTime_s(plan) / plan.sample_period_s));
}

TEST(SimulateSpinDown, OpenCircuitCoastFollowsTheClosedFormAndLogsTheBackEmf) {
  const double j = kMotor.inertia_kg_m2, b = kMotor.viscous_friction_N_m_s_per_rad, tc = kMotor.coulomb_friction_N_m;
  const SpinDownPlan plan = SettledRunThenCoast(kMotor, 9.0, 0.6);
  const SampledLog log = SimulateSpinDown(kMotor, plan, BenchConditions{});
  const std::size_t off = PowerOffIndex(plan);
  ASSERT_EQ(log.time_s.size(), off + std::llround(plan.coast_s / kSamplePeriod_s));
  EXPECT_DOUBLE_EQ(log.time_s[off], SpinDownPowerOffTime_s(plan));
  // physics (steady state): before t_off the current is positive and holds Kt·i = B·ω + Tc
  EXPECT_NEAR(kMotor.torque_constant_N_m_per_A * log.current_A[off - 1],
              b * log.speed_rad_s[off - 1] + tc, kIntegratorRelativeTolerance * tc);
  const double w0 = log.speed_rad_s[off];
  ASSERT_GT(w0, 0.0);
  // physics (references.md): ω(t) = (ω₀ + Tc/B)·e^(−t·B/J) − Tc/B, stopping at (J/B)·ln(1 + B·ω₀/Tc)
  const double stop_s = (j / b) * std::log(1.0 + b * w0 / tc);
  ASSERT_LT(stop_s, plan.coast_s);
  std::size_t first_rest = log.time_s.size();
  for (std::size_t k = off; k < log.time_s.size(); ++k) {
    const double t_s = log.time_s[k] - log.time_s[off];
    EXPECT_EQ(log.current_A[k], 0.0) << "open circuit, sample " << k;
    // physics: with the terminals open the terminal voltage is the back-EMF, v = Ke·ω
    EXPECT_DOUBLE_EQ(log.voltage_V[k], kMotor.back_emf_constant_V_s_per_rad * log.speed_rad_s[k]);
    const double expected_rad_s = t_s < stop_s ? (w0 + tc / b) * std::exp(-t_s * b / j) - tc / b : 0.0;
    EXPECT_NEAR(log.speed_rad_s[k], expected_rad_s, kIntegratorRelativeTolerance * w0) << "t = " << t_s;
    if (log.speed_rad_s[k] == 0.0 && first_rest == log.time_s.size()) first_rest = k;
  }
  // physics: the rotor is exactly at rest from the first sample after the stop time on
  ASSERT_LT(first_rest, log.time_s.size());
  EXPECT_LT(log.time_s[first_rest - 1] - log.time_s[off], stop_s);
  EXPECT_GE(log.time_s[first_rest] - log.time_s[off], stop_s);
  for (std::size_t k = first_rest; k < log.time_s.size(); ++k) EXPECT_EQ(log.speed_rad_s[k], 0.0);
}

TEST(SimulateSpinDown, BrakingResistorKeepsCurrentFlowingAndSlowsTheRotorFaster) {
  // physics: a resistor R_b across the terminals gives L·di/dt = −(R + R_b)·i − Ke·ω (Vb = 0), so
  // i = −Ke·ω/(R + R_b) − (L/(R + R_b))·di/dt. Once the switching transient has passed (10 τe),
  // i decays with the braking time constant τ_b = J·(R + R_b)/(Kt·Ke), making the lag term a
  // fraction τe/τ_b of i; the bound allows twice that. v = −R_b·i by Kirchhoff's law.
  MotorParameters motor = kMotor;
  motor.brush_drop_V = 0.0;
  const double brake_ohm = 2.0, loop_ohm = motor.resistance_ohm + brake_ohm;
  SpinDownPlan plan = SettledRunThenCoast(motor, 9.0, 0.05);
  const SampledLog open = SimulateSpinDown(motor, plan, BenchConditions{});
  plan.brake_resistance_ohm = brake_ohm;
  const SampledLog braked = SimulateSpinDown(motor, plan, BenchConditions{});
  const std::size_t off = PowerOffIndex(plan);
  const double electrical_s = motor.inductance_H / loop_ohm;
  const double braking_s = motor.inertia_kg_m2 * loop_ohm /
                           (motor.torque_constant_N_m_per_A * motor.back_emf_constant_V_s_per_rad);
  constexpr double kTransientTimeConstants = 10.0;
  int checked = 0;
  for (std::size_t k = off; k < braked.time_s.size(); ++k) {
    EXPECT_DOUBLE_EQ(braked.voltage_V[k], -brake_ohm * braked.current_A[k]);
    if (braked.time_s[k] - braked.time_s[off] < kTransientTimeConstants * electrical_s) continue;
    const double quasi_static_A = -motor.back_emf_constant_V_s_per_rad * braked.speed_rad_s[k] / loop_ohm;
    EXPECT_LT(braked.current_A[k], 0.0) << "the current opposes the rotation";
    EXPECT_NEAR(braked.current_A[k], quasi_static_A, 2.0 * electrical_s / braking_s * std::abs(quasi_static_A)) << k;
    ++checked;
  }
  EXPECT_GT(checked, 100);
  // physics: the braking torque Kt·i adds to friction, so the rotor is slower at every coast instant
  EXPECT_LT(braked.speed_rad_s.back(), open.speed_rad_s.back());
}

TEST(SimulateSpinDown, LogsOnlyTheChannelsAskedFor) {
  SpinDownPlan plan = SettledRunThenCoast(kMotor, 6.0, 0.01);
  plan.log_voltage = false;
  plan.log_current = false;
  const SampledLog log = SimulateSpinDown(kMotor, plan, BenchConditions{});
  // bench-logs.md: spin-down needs time and speed (or position); voltage and current are optional
  EXPECT_TRUE(log.voltage_V.empty());
  EXPECT_TRUE(log.current_A.empty());
  EXPECT_EQ(log.speed_rad_s.size(), log.time_s.size());
}

TEST(SimulateSpinDown, RejectsPlansThatCannotBeSimulated) {
  // common practice: misuse is reported, not simulated into nonsense
  SpinDownPlan no_coast;
  no_coast.coast_s = 0.0;
  EXPECT_THROW(SimulateSpinDown(kMotor, no_coast, BenchConditions{}), std::invalid_argument);
  SpinDownPlan no_run;
  no_run.run_s = 0.0;
  EXPECT_THROW(SimulateSpinDown(kMotor, no_run, BenchConditions{}), std::invalid_argument);
  EXPECT_THROW(SpinDownPowerOffTime_s(no_run), std::invalid_argument);
  SpinDownPlan negative_brake;
  negative_brake.brake_resistance_ohm = -1.0;
  EXPECT_THROW(SimulateSpinDown(kMotor, negative_brake, BenchConditions{}), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model

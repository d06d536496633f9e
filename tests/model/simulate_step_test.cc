#include "src/model/simulate_step.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <string>

#include "src/model/free_shaft_dynamics.h"
#include "src/model/free_shaft_time_constants.h"
#include "src/units/constants.h"

namespace coilspin::model {
namespace {

// RK4 at 20 steps per fastest time constant (src/model/free_shaft_dynamics.h): settled values
// agree with the steady-state equations to well below 1e-8.
constexpr double kSettledRelativeTolerance = 1e-8;
// Spans of this many slowest time constants leave e^(−40) ≈ 4e-18 of a transient.
constexpr double kSettleTimeConstants = 40.0;
constexpr double kSamplePeriod_s = 1e-5;  // τe = L/(R + R_s) ≈ 0.7 ms: 70 samples per τe
constexpr double kPreStep_s = 1e-3;
constexpr double kSupplyResistance_ohm = 0.2;

// R, L, Ke, Kt, J, B, Tc, Vb: every term of the model
const MotorParameters kMotor{1.5, 1.2e-3, 0.03, 0.028, 5e-6, 2e-6, 2.5e-3, 0.4};

BenchConditions Bench() {
  BenchConditions bench;
  bench.supply_resistance_ohm = kSupplyResistance_ohm;
  return bench;
}

// A span of kSettleTimeConstants slowest time constants, in whole samples.
double SettlingSpan_s() {
  FreeShaftInput input;
  input.supply_resistance_ohm = kSupplyResistance_ohm;
  const double span_s = kSettleTimeConstants * TimeConstantsOf(kMotor, input).slowest_s;
  return std::ceil(span_s / kSamplePeriod_s) * kSamplePeriod_s;
}

std::size_t Samples(double span_s) { return static_cast<std::size_t>(std::llround(span_s / kSamplePeriod_s)); }

FreeShaftStepPlan Plan(double initial_V, double final_V) {
  FreeShaftStepPlan plan;
  plan.initial_supply_V = initial_V;
  plan.final_supply_V = final_V;
  plan.settle_s = initial_V == 0.0 ? 0.0 : SettlingSpan_s();
  plan.pre_step_s = kPreStep_s;
  plan.hold_s = SettlingSpan_s();
  plan.sample_period_s = kSamplePeriod_s;
  return plan;
}

struct NoLoadPoint {
  double current_A, speed_rad_s, voltage_V;
};

// physics (docs/methods.md §1, steady state with i > 0, ω > 0), solved in closed form:
//   V_s − R_s·i = v,   v − R·i − Vb = Ke·ω,   Kt·i = B·ω + Tc
// ⇒ ω = (V_s − Vb − R_t·Tc/Kt)/(Ke + R_t·B/Kt) with R_t = R + R_s, then i = (B·ω + Tc)/Kt.
NoLoadPoint NoLoadPointAt(double supply_V) {
  const double loop_ohm = kMotor.resistance_ohm + kSupplyResistance_ohm;
  const double kt = kMotor.torque_constant_N_m_per_A, b = kMotor.viscous_friction_N_m_s_per_rad;
  const double tc = kMotor.coulomb_friction_N_m;
  NoLoadPoint point{};
  point.speed_rad_s = (supply_V - kMotor.brush_drop_V - loop_ohm * tc / kt) /
                      (kMotor.back_emf_constant_V_s_per_rad + loop_ohm * b / kt);
  point.current_A = (b * point.speed_rad_s + tc) / kt;
  point.voltage_V = supply_V - kSupplyResistance_ohm * point.current_A;
  return point;
}

void ExpectAtNoLoadPoint(const SampledLog& log, std::size_t k, double supply_V) {
  const NoLoadPoint point = NoLoadPointAt(supply_V);
  ASSERT_GT(point.speed_rad_s, 0.0) << "the level must turn the rotor";
  EXPECT_NEAR(log.current_A[k], point.current_A, kSettledRelativeTolerance * point.current_A) << "sample " << k;
  EXPECT_NEAR(log.speed_rad_s[k], point.speed_rad_s, kSettledRelativeTolerance * point.speed_rad_s) << "sample " << k;
  EXPECT_NEAR(log.voltage_V[k], point.voltage_V, kSettledRelativeTolerance * point.voltage_V) << "sample " << k;
}

// physics (Taylor series of L·di/dt = V_s − R_t·i − Ke·ω − Vb about the step, ω continuous and
// dω/dt = 0 there): with a = di/dt(0⁺) and τe = L/R_t,
//   (i(Δ) − i(0))/Δ = a·(1 − Δ/(2τe)) + e,   |e| ≤ a·(Δ/τe)²·(1 + τe/τm)/6 ≤ a·(Δ/τe)²/3 for τm ≥ τe.
void ExpectInitialSlope(const SampledLog& log, std::size_t step, double slope_A_s) {
  const double loop_ohm = kMotor.resistance_ohm + kSupplyResistance_ohm;
  const double electrical_s = kMotor.inductance_H / loop_ohm;
  const double mechanical_s = kMotor.inertia_kg_m2 * loop_ohm /
                              (kMotor.torque_constant_N_m_per_A * kMotor.back_emf_constant_V_s_per_rad);
  ASSERT_GE(mechanical_s, electrical_s) << "the error bound assumes τm ≥ τe";
  const double ratio = kSamplePeriod_s / electrical_s;
  const double measured_A_s = (log.current_A[step + 1] - log.current_A[step]) / kSamplePeriod_s;
  EXPECT_NEAR(measured_A_s, slope_A_s * (1.0 - 0.5 * ratio), slope_A_s * ratio * ratio / 3.0);
}

TEST(SimulateStep, FromRestLogsTheRotorAtRestThenTheStepAtItsInstant) {
  constexpr double kFinal_V = 12.0;
  const FreeShaftStepPlan plan = Plan(0.0, kFinal_V);
  const SampledLog log = SimulateStep(kMotor, plan, Bench());
  const std::size_t step = Samples(kPreStep_s);
  ASSERT_EQ(log.time_s.size(), step + Samples(plan.hold_s));
  ASSERT_EQ(log.speed_rad_s.size(), log.time_s.size());
  EXPECT_TRUE(log.position_rad.empty());
  EXPECT_TRUE(log.temperature_degC.empty());
  // documented timing (src/model/simulate_step.h): t_k = k·Δ from 0, t_step = round(pre_step_s/Δ)·Δ
  EXPECT_EQ(log.time_s.front(), 0.0);
  EXPECT_DOUBLE_EQ(StepTime_s(plan), static_cast<double>(step) * kSamplePeriod_s);
  EXPECT_DOUBLE_EQ(log.time_s[step], StepTime_s(plan));
  // physics: with V_s = 0 nothing drives the motor; it stays exactly at rest
  for (std::size_t k = 0; k < step; ++k) {
    EXPECT_EQ(log.current_A[k], 0.0) << "sample " << k;
    EXPECT_EQ(log.speed_rad_s[k], 0.0) << "sample " << k;
    EXPECT_EQ(log.voltage_V[k], 0.0) << "sample " << k;
  }
  // physics (Kirchhoff, v = V_s − R_s·i): the step sample already logs V_1, with i still 0
  EXPECT_EQ(log.current_A[step], 0.0);
  EXPECT_EQ(log.voltage_V[step], kFinal_V);
  // handbook: L·di/dt = v − R·i − Ke·ω − Vb at i = ω = 0 gives di/dt = (V_1 − Vb)/L
  ExpectInitialSlope(log, step, (kFinal_V - kMotor.brush_drop_V) / kMotor.inductance_H);
  ExpectAtNoLoadPoint(log, log.time_s.size() - 1, kFinal_V);
}

TEST(SimulateStep, BetweenTwoLevelsStartsAtTheFirstNoLoadPoint) {
  constexpr double kInitial_V = 4.0, kFinal_V = 10.0;
  const FreeShaftStepPlan plan = Plan(kInitial_V, kFinal_V);
  const SampledLog log = SimulateStep(kMotor, plan, Bench());
  const std::size_t settle = Samples(plan.settle_s), step = Samples(kPreStep_s);
  ASSERT_EQ(log.time_s.size(), step + Samples(plan.hold_s));
  // documented timing: t counts from the unlogged start, so the log starts at settle_s
  EXPECT_DOUBLE_EQ(log.time_s.front(), static_cast<double>(settle) * kSamplePeriod_s);
  EXPECT_DOUBLE_EQ(StepTime_s(plan), static_cast<double>(settle + step) * kSamplePeriod_s);
  EXPECT_DOUBLE_EQ(log.time_s[step], StepTime_s(plan));
  for (std::size_t k = 0; k < step; ++k) ExpectAtNoLoadPoint(log, k, kInitial_V);
  // physics (Kirchhoff): the step sample logs V_1 − R_s·i with the current still continuous
  const NoLoadPoint before = NoLoadPointAt(kInitial_V);
  EXPECT_NEAR(log.current_A[step], before.current_A, kSettledRelativeTolerance * before.current_A);
  EXPECT_DOUBLE_EQ(log.voltage_V[step], kFinal_V - kSupplyResistance_ohm * log.current_A[step]);
  // physics: at the V_0 no-load point V_0 = R_t·i + Ke·ω + Vb, so L·di/dt(0⁺) = V_1 − V_0
  ExpectInitialSlope(log, step, (kFinal_V - kInitial_V) / kMotor.inductance_H);
  ExpectAtNoLoadPoint(log, log.time_s.size() - 1, kFinal_V);
}

TEST(SimulateStep, EncoderAndTemperatureChannels) {
  // src/model/shaft_channels.h: an encoder zeroed at the (unlogged) start; the temperature is constant
  FreeShaftStepPlan plan = Plan(0.0, 6.0);
  plan.shaft = ShaftChannels::kPosition;
  plan.log_temperature = true;
  BenchConditions bench = Bench();
  bench.encoder_counts_per_rev = 500;
  bench.winding_temperature_degC = 31.0;
  bench.resistance_reference_temperature_degC = 31.0;
  const SampledLog log = SimulateStep(kMotor, plan, bench);
  EXPECT_TRUE(log.speed_rad_s.empty());
  ASSERT_EQ(log.position_rad.size(), log.time_s.size());
  ASSERT_EQ(log.temperature_degC.size(), log.time_s.size());
  EXPECT_EQ(log.temperature_degC.back(), bench.winding_temperature_degC);
  EXPECT_EQ(log.position_rad.front(), 0.0);
  // physics: the rotor turns forward, so the count never falls and ends well above zero
  for (std::size_t k = 1; k < log.position_rad.size(); ++k) EXPECT_GE(log.position_rad[k], log.position_rad[k - 1]);
  const double count_rad = units::kRadiansPerRevolution / bench.encoder_counts_per_rev;
  EXPECT_GT(log.position_rad.back(), 100.0 * count_rad);
}

TEST(SimulateStep, RejectsPlansThatCannotBeSimulated) {
  // common practice: misuse is reported, not simulated into nonsense
  const BenchConditions bench = Bench();
  FreeShaftStepPlan no_settle = Plan(3.0, 6.0);
  no_settle.settle_s = 0.0;  // V_0 ≠ 0 needs the motor run up at V_0 first
  FreeShaftStepPlan negative_settle = Plan(0.0, 6.0);
  negative_settle.settle_s = -1.0;
  FreeShaftStepPlan short_pre = Plan(0.0, 6.0);
  short_pre.pre_step_s = 0.1 * kSamplePeriod_s;
  FreeShaftStepPlan short_hold = Plan(0.0, 6.0);
  short_hold.hold_s = 0.1 * kSamplePeriod_s;
  FreeShaftStepPlan no_period = Plan(0.0, 6.0);
  no_period.sample_period_s = 0.0;
  for (const FreeShaftStepPlan& plan : {no_settle, negative_settle, short_pre, short_hold, no_period}) {
    try {
      SimulateStep(kMotor, plan, bench);
      ADD_FAILURE() << "simulated a plan with settle " << plan.settle_s << " s, pre-step " << plan.pre_step_s
                    << " s, hold " << plan.hold_s << " s, period " << plan.sample_period_s << " s";
    } catch (const std::invalid_argument& e) {
      EXPECT_EQ(std::string(e.what()).rfind("step simulation: ", 0), 0u) << e.what();
    }
  }
  // the step instant needs the same timing: every bad plan but the short hold (which comes after it)
  for (const FreeShaftStepPlan& plan : {no_settle, negative_settle, short_pre, no_period}) {
    EXPECT_THROW(StepTime_s(plan), std::invalid_argument);
  }
}

}  // namespace
}  // namespace coilspin::model

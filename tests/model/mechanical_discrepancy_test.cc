// The free shaft's mechanical model discrepancy (src/model/bench_artefacts.h):
// a speed-squared drag, checked against the closed-form coast, and a wandering
// Coulomb friction, checked as an Ornstein–Uhlenbeck path and as the torque the
// coasting shaft feels sample by sample.

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <stdexcept>
#include <vector>

#include "src/model/simulate_spin_down.h"
#include "src/model/wandering_friction.h"
#include "model/small_motor.h"

namespace coilspin::model {
namespace {

constexpr double kStandardErrors = 4.0;  // common practice, as tests/model/sensor_chain_test.cc

// B small enough for a closed form of the drag coast (4c·Tc > B²)
MotorParameters LowViscosityMotor() {
  MotorParameters m = SmallMotor();
  m.viscous_friction_N_m_s_per_rad = 1e-6;
  return m;
}

// Coast with drag, open circuit, ω > 0: J·dω/dt = −(c·ω² + B·ω + Tc). With q = √(4c·Tc − B²) > 0,
// ∫dω/(cω² + Bω + Tc) = (2/q)·atan((2cω + B)/q) (Gradshteyn & Ryzhik, Table of Integrals, 2.172), so
//     ω(t) = (q·tan(atan((2c·ω0 + B)/q) − q·t/(2J)) − B)/(2c).
double DragCoast_rad_s(const MotorParameters& m, double drag, double speed0, double t_s) {
  const double b = m.viscous_friction_N_m_s_per_rad, tc = m.coulomb_friction_N_m;
  const double q = std::sqrt(4.0 * drag * tc - b * b);
  return (q * std::tan(std::atan((2.0 * drag * speed0 + b) / q) - q * t_s / (2.0 * m.inertia_kg_m2)) - b) /
         (2.0 * drag);
}

void ExpectCoastFollowsTheClosedForm(const MotorParameters& motor, const SpinDownPlan& plan, double drag,
                                     double tolerance_relative) {
  BenchConditions bench;
  bench.discrepancy.drag_N_m_s2_per_rad2 = drag;
  ASSERT_GT(4.0 * drag * motor.coulomb_friction_N_m, std::pow(motor.viscous_friction_N_m_s_per_rad, 2));
  const SampledLog log = SimulateSpinDown(motor, plan, bench);
  const auto off = static_cast<std::size_t>(std::llround(SpinDownPowerOffTime_s(plan) / plan.sample_period_s));
  const double speed0 = log.speed_rad_s[off];
  int compared = 0;
  for (std::size_t k = off; k < log.time_s.size(); ++k) {
    const double expected = DragCoast_rad_s(motor, drag, speed0, log.time_s[k] - log.time_s[off]);
    if (expected < 0.05 * speed0) break;  // near the stop the closed form is steep; enough compared
    ASSERT_NEAR(log.speed_rad_s[k], expected, tolerance_relative * speed0) << "sample " << k;
    ++compared;
  }
  EXPECT_GT(compared, 100);
  // The drag is felt: without it the shaft would be faster at the last compared sample.
  const SampledLog plain = SimulateSpinDown(motor, plan, BenchConditions{});
  const std::size_t last = off + static_cast<std::size_t>(compared) - 1;
  EXPECT_GT(plain.speed_rad_s[last], log.speed_rad_s[last] * 1.01);
}

TEST(MechanicalDiscrepancy, DragCoastFollowsTheClosedForm) {
  SpinDownPlan plan;
  plan.supply_V = 6.0;
  plan.run_s = 0.5;
  plan.coast_s = 2.0;
  plan.sample_period_s = 1e-3;
  // c·ω² at 190 rad/s is about 0.36 mN·m against Tc = 2 mN·m
  ExpectCoastFollowsTheClosedForm(LowViscosityMotor(), plan, 1e-8, 1e-9);
}

TEST(MechanicalDiscrepancy, LongFlywheelCoastAt50HzFollowsTheClosedForm) {
  // A flywheel of 0.85 kg·m² coasting for 600 s logged at 50 Hz (invented, a rig of issue 9)
  MotorParameters m;
  m.resistance_ohm = 1.0;
  m.inductance_H = 5e-3;
  m.back_emf_constant_V_s_per_rad = 0.1;
  m.torque_constant_N_m_per_A = 0.1;
  m.inertia_kg_m2 = 0.85;
  m.viscous_friction_N_m_s_per_rad = 5e-5;
  m.coulomb_friction_N_m = 0.02;
  SpinDownPlan plan;
  plan.supply_V = 24.0;
  plan.run_s = 400.0;  // about five mechanical time constants J·R/(Ke·Kt) = 85 s
  plan.coast_s = 600.0;
  plan.sample_period_s = 0.02;
  ExpectCoastFollowsTheClosedForm(m, plan, 2e-7, 1e-9);
}

TEST(MechanicalDiscrepancy, FrictionWanderIsAnOrnsteinUhlenbeckPath) {
  MechanicalDiscrepancy d;
  d.friction_wander_sigma_N_m = 1e-4;
  d.friction_wander_time_s = 0.05;
  constexpr double kPeriod_s = 1e-3;
  constexpr std::size_t kSamples = 200000;
  const std::vector<double> path = FrictionWander_N_m(d, kPeriod_s, kSamples, 5);
  ASSERT_EQ(path.size(), kSamples);
  double mean = 0.0;
  for (double x : path) mean += x / kSamples;
  double squares = 0.0, lagged = 0.0;
  for (std::size_t k = 0; k < kSamples; ++k) {
    squares += (path[k] - mean) * (path[k] - mean);
    if (k > 0) lagged += (path[k] - mean) * (path[k - 1] - mean);
  }
  // OU sampled every Δ: lag-1 correlation e^(−Δ/τ) (Gillespie 1996, the exact updating formula);
  // sampling errors by Bartlett's formula for an AR(1) series (tests/model/sensor_chain_test.cc)
  const double rho = std::exp(-kPeriod_s / d.friction_wander_time_s), n = kSamples;
  EXPECT_NEAR(lagged / squares, rho, kStandardErrors * std::sqrt((1.0 - rho * rho) / n));
  EXPECT_NEAR(std::sqrt(squares / (n - 1.0)) / d.friction_wander_sigma_N_m, 1.0,
              kStandardErrors * std::sqrt((1.0 + rho * rho) / (2.0 * n * (1.0 - rho * rho))));
  EXPECT_TRUE(FrictionWander_N_m(MechanicalDiscrepancy{}, kPeriod_s, kSamples, 5).empty());
}

TEST(MechanicalDiscrepancy, CoastingShaftFeelsTcPlusTheWanderOfEachSamplePeriod) {
  // With B = 0 and no drag the open-circuit coast has J·dω/dt = −(Tc + δ_k) over [t_k, t_k+1):
  // ω_(k+1) = ω_k − (Tc + δ_k)·Δ/J exactly (physics; RK4 is exact for a constant rate).
  MotorParameters m = SmallMotor();
  m.viscous_friction_N_m_s_per_rad = 0.0;  // B = 0
  SpinDownPlan plan;
  plan.supply_V = 6.0;
  plan.run_s = 0.5;
  plan.coast_s = 1.0;
  plan.sample_period_s = 1e-3;
  BenchConditions bench;
  bench.seed = 31;
  bench.discrepancy.friction_wander_sigma_N_m = 1e-4;  // Tc + δ stays far from 0
  bench.discrepancy.friction_wander_time_s = 0.2;
  const SampledLog log = SimulateSpinDown(m, plan, bench);
  const std::vector<double> wander =
      FrictionWander_N_m(bench.discrepancy, plan.sample_period_s, log.time_s.size(), bench.seed);
  const auto off = static_cast<std::size_t>(std::llround(SpinDownPowerOffTime_s(plan) / plan.sample_period_s));
  int compared = 0;
  for (std::size_t k = off; k + 1 < log.time_s.size() && log.speed_rad_s[k + 1] > 0.0; ++k, ++compared) {
    const double felt_N_m = (log.speed_rad_s[k] - log.speed_rad_s[k + 1]) * m.inertia_kg_m2 / plan.sample_period_s;
    ASSERT_NEAR(felt_N_m, m.coulomb_friction_N_m + wander[k], 1e-12) << k;
  }
  EXPECT_GT(compared, 200);
}

TEST(MechanicalDiscrepancy, RejectsNegativeDragAndWanderWithoutATime) {
  SpinDownPlan plan;
  BenchConditions bench;
  bench.discrepancy.drag_N_m_s2_per_rad2 = -1e-8;
  EXPECT_THROW(SimulateSpinDown(SmallMotor(), plan, bench), std::invalid_argument);
  bench = {};
  bench.discrepancy.friction_wander_sigma_N_m = 1e-4;
  EXPECT_THROW(SimulateSpinDown(SmallMotor(), plan, bench), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model

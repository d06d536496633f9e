// The free-shaft fit says when a log breaks its assumptions: a coast that is
// not open circuit (a braking resistance across the terminals), speed read
// through a gearbox. Truth from the forward model (src/model).

#include <gtest/gtest.h>

#include "free_shaft/free_shaft_bench.h"

namespace coilspin::testing {
namespace {

model::MotorParameters Motor() {
  model::MotorParameters m;
  m.resistance_ohm = 2.0;
  m.inductance_H = 1e-3;
  m.back_emf_constant_V_s_per_rad = m.torque_constant_N_m_per_A = 0.03;
  m.inertia_kg_m2 = 2e-5;
  m.viscous_friction_N_m_s_per_rad = 1e-5;
  m.coulomb_friction_N_m = 2e-3;
  return m;
}

bool Warns(const MotorEstimate& e, const std::string& text) {
  for (const auto& w : e.warnings)
    if (w.find(text) != std::string::npos) return true;
  return false;
}

TEST(FreeShaftWarnings, BrakedCoastIsFlagged) {
  model::SpinDownPlan plan;
  plan.supply_V = 12.0;
  plan.run_s = 1.0;
  plan.coast_s = 3.0;
  plan.brake_resistance_ohm = 10.0;  // i = −Ke·ω/(R + R_brake) flows: not open circuit
  std::vector<joint::TestLog> logs;
  logs.push_back({TestKind::kSpinDown, ToBenchLog(model::SimulateSpinDown(Motor(), plan, Noise(61, false)), "braked.csv")});
  const MotorEstimate e = joint::FitMotor(logs, {});
  EXPECT_TRUE(Warns(e, "current")) << (e.warnings.empty() ? "no warnings" : e.warnings.front());
}

TEST(FreeShaftWarnings, OpenCoastIsNotFlagged) {
  BenchOptions o;
  o.locked_rotor = o.no_load = false;
  o.seed = 62;
  const MotorEstimate e = joint::FitMotor(SimulateBench(Motor(), 12.0, o), {});
  EXPECT_FALSE(Warns(e, "current"));
}

TEST(FreeShaftWarnings, GearboxIsNamed) {
  BenchOptions o;
  o.seed = 63;
  joint::MotorFitOptions options;
  options.gear_ratio = 4.0;  // the logs here are at the motor shaft already; only the note is checked
  const MotorEstimate e = joint::FitMotor(SimulateBench(Motor(), 12.0, o), options);
  EXPECT_TRUE(Warns(e, "gearbox"));
}

}  // namespace
}  // namespace coilspin::testing

namespace coilspin::testing {
namespace {

// Each parameter's information shares over the tests sum to 1 (they split
// Var(θ_j) = Σ_g v_gj by residual group; fitters/core/least_squares.h).
TEST(InformationShare, SplitsEachParameterOverTheTests) {
  BenchOptions o;
  o.seed = 64;
  const MotorEstimate e = joint::FitMotor(SimulateBench(Motor(), 12.0, o), {});
  ASSERT_FALSE(e.correlation_names.empty());
  for (const auto& key : e.correlation_names) {
    double total = 0.0;
    for (const auto& t : e.tests)
      for (const auto& [k, share] : t.information_share)
        if (k == key) total += share;
    EXPECT_NEAR(total, 1.0, 1e-9) << key;
  }
  // Inertia is informed by the coast (B/J, Tc/J) and the no-load friction, never by locked-rotor plateaus alone.
  for (const auto& [k, share] : e.tests.front().information_share)
    if (k == "inertia") EXPECT_LT(share, 0.05);
}

}  // namespace
}  // namespace coilspin::testing

namespace coilspin::testing {
namespace {

// Without a locked-rotor test, no-load plateaus alone leave Ke undetermined
// (ī follows ω through friction, so only Ke + R·B/Kt is fixed); with a coast
// voltage giving Ke, the same plateaus still give B and Tc, and the coast J.
TEST(NoLoadWithoutResistance, KeNeedsAnotherTestAndThenFrictionFollows) {
  BenchOptions o;
  o.locked_rotor = o.spin_down = false;
  o.seed = 65;
  const MotorEstimate alone = joint::FitMotor(SimulateBench(Motor(), 12.0, o), {});
  EXPECT_EQ(alone.Find("back_emf_constant"), nullptr);
  o.spin_down = true;
  const MotorEstimate with_coast = joint::FitMotor(SimulateBench(Motor(), 12.0, o), {});
  ASSERT_NE(with_coast.Find("back_emf_constant"), nullptr);
  EXPECT_NEAR(with_coast.Find("back_emf_constant")->value, 0.03, 0.03 * 0.01);
  ASSERT_NE(with_coast.Find("inertia"), nullptr);
  EXPECT_NEAR(with_coast.Find("inertia")->value, 2e-5, 2e-5 * 0.03);
  for (const auto& [key, reason] : with_coast.not_identified) EXPECT_NE(key, "back_emf_constant");
}

}  // namespace
}  // namespace coilspin::testing

// Kt/Ke consistency in a fit: a motor whose Kt is 0.93·Ke, measured with a
// torque column, is "inconsistent"; with Kt = Ke it is "consistent"; without a
// torque column Kt is assumed equal to Ke and the check says "not-checked"
// (docs/methods.md, Kt/Ke consistency; physics: Kt = Ke in SI for an ideal machine).

#include <gtest/gtest.h>

#include "free_shaft/free_shaft_bench.h"

namespace coilspin::testing {
namespace {

model::MotorParameters Motor(double kt_over_ke) {
  model::MotorParameters m;
  m.resistance_ohm = 1.5;
  m.inductance_H = 1e-3;
  m.back_emf_constant_V_s_per_rad = 0.04;
  m.torque_constant_N_m_per_A = 0.04 * kt_over_ke;
  m.inertia_kg_m2 = 3e-5;
  m.viscous_friction_N_m_s_per_rad = 1.5e-5;
  m.coulomb_friction_N_m = 3e-3;
  return m;
}

std::string Verdict(double kt_over_ke, bool torque_column, std::uint64_t seed) {
  BenchOptions o;
  o.torque_column = torque_column;
  o.seed = seed;
  const MotorEstimate e = joint::FitMotor(SimulateBench(Motor(kt_over_ke), 12.0, o), {});
  return e.consistency ? e.consistency->verdict : "";
}

TEST(FitConsistency, MismatchedMotorIsInconsistent) { EXPECT_EQ(Verdict(0.93, true, 51), "inconsistent"); }
TEST(FitConsistency, IdealMotorIsConsistent) { EXPECT_EQ(Verdict(1.0, true, 52), "consistent"); }
TEST(FitConsistency, WithoutTorqueColumnNotChecked) { EXPECT_EQ(Verdict(0.93, false, 53), "not-checked"); }

TEST(FitConsistency, MeasuredKtIsRecovered) {
  BenchOptions o;
  o.torque_column = true;
  o.seed = 54;
  const MotorEstimate e = joint::FitMotor(SimulateBench(Motor(0.93), 12.0, o), {});
  const QuantityEstimate* kt = e.Find("torque_constant");
  ASSERT_NE(kt, nullptr);
  EXPECT_EQ(kt->basis, "measured");
  EXPECT_NEAR(kt->value, 0.0372, 0.0372 * 0.02);
}

}  // namespace
}  // namespace coilspin::testing

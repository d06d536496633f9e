// The joint fit of all four tests — locked-rotor plateaus, no-load plateaus,
// spin-down and a free-shaft voltage step — recovers a known motor from
// simulated benches (speed or encoder counts, with and without a brush drop,
// Kt equal to Ke or measured with a torque column). Tolerances are the
// issue's: R 1 %, L 3 %, Ke 1 %, Kt 2 %, J 3 %, B 8 %, Tc 6 %, and Vb 25 %.

#include <gtest/gtest.h>

#include "free_shaft/free_shaft_bench.h"

namespace coilspin::testing {
namespace {

struct JointCase {
  std::string name;
  model::MotorParameters motor;
  double top_V;
  bool encoder;
  bool torque_column;
  std::uint64_t seed;
};

void PrintTo(const JointCase& c, std::ostream* os) { *os << c.name; }


void ExpectWithin(const MotorEstimate& e, const char* key, double truth, double tolerance) {
  const QuantityEstimate* q = e.Find(key);
  ASSERT_NE(q, nullptr) << key;
  EXPECT_NEAR(q->value, truth, tolerance * std::fabs(truth)) << key;
}

class FourTestRecovery : public ::testing::TestWithParam<JointCase> {};

TEST_P(FourTestRecovery, RecoversTheWholeMotor) {
  const JointCase& c = GetParam();
  BenchOptions o;
  o.encoder = c.encoder;
  o.torque_column = c.torque_column;
  o.step = true;
  o.seed = c.seed;
  joint::MotorFitOptions options;
  if (c.encoder) options.counts_per_rev = 2048;
  const MotorEstimate e = joint::FitMotor(SimulateBench(c.motor, c.top_V, o), options);
  ASSERT_EQ(e.tests.size(), 4u);
  ExpectWithin(e, "resistance", c.motor.resistance_ohm, 0.01);
  ExpectWithin(e, "inductance", c.motor.inductance_H, 0.03);
  ExpectWithin(e, "back_emf_constant", c.motor.back_emf_constant_V_s_per_rad, 0.01);
  ExpectWithin(e, "torque_constant", c.motor.torque_constant_N_m_per_A, 0.02);
  ExpectWithin(e, "inertia", c.motor.inertia_kg_m2, 0.03);
  ExpectWithin(e, "viscous_friction", c.motor.viscous_friction_N_m_s_per_rad, 0.08);
  ExpectWithin(e, "coulomb_friction", c.motor.coulomb_friction_N_m, 0.06);
  if (c.motor.brush_drop_V > 0.0) ExpectWithin(e, "brush_drop", c.motor.brush_drop_V, 0.25);
  EXPECT_EQ(e.Find("torque_constant")->basis, c.torque_column ? "measured" : "equal-to-Ke");
  // Every test informs the fit: each has a share of some parameter's information.
  for (const auto& t : e.tests) EXPECT_FALSE(t.information_share.empty()) << t.kind;
}

INSTANTIATE_TEST_SUITE_P(
    Motors, FourTestRecovery,
    ::testing::Values(
        JointCase{"small_12V_speed", IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0), 12.0, false, false, 51},
        JointCase{"brushed_6V_encoder", IdealMotor(0.8, 0.3e-3, 0.012, 6e-6, 3e-6, 8e-4, 0.5), 6.0, true, false, 52},
        JointCase{"large_24V_torque_column", IdealMotor(0.6, 2e-3, 0.08, 4e-4, 8e-5, 1.5e-2, 0.7), 24.0, false, true, 53}),
    [](const auto& info) { return info.param.name; });

}  // namespace
}  // namespace coilspin::testing

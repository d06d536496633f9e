// The joint fit of locked-rotor, no-load and spin-down logs recovers known
// Ke, J, B, Tc (and R) from simulated benches, with speed or encoder counts,
// and its 95 % intervals contain the truth. Tolerances are the issue's:
// Ke 1 %, J 3 %, B 8 %, Tc 6 %.

#include <gtest/gtest.h>

#include "free_shaft/free_shaft_bench.h"

namespace coilspin::testing {
namespace {

struct MotorCase {
  std::string name;
  model::MotorParameters motor;
  double top_V;
  bool encoder;
  std::uint64_t seed;
};

void PrintTo(const MotorCase& c, std::ostream* os) { *os << c.name; }


void ExpectRecovered(const MotorEstimate& e, const char* key, double truth, double tolerance) {
  const QuantityEstimate* q = e.Find(key);
  ASSERT_NE(q, nullptr) << key;
  EXPECT_NEAR(q->value, truth, tolerance * std::fabs(truth)) << key;
  EXPECT_LE(q->ci_low, truth) << key;
  EXPECT_GE(q->ci_high, truth) << key;
}

class FreeShaftRecovery : public ::testing::TestWithParam<MotorCase> {};

TEST_P(FreeShaftRecovery, RecoversMechanicsFromThreeTests) {
  const MotorCase& c = GetParam();
  BenchOptions o;
  o.encoder = c.encoder;
  o.seed = c.seed;
  joint::MotorFitOptions options;
  if (c.encoder) options.counts_per_rev = 2048;
  const MotorEstimate e = joint::FitMotor(SimulateBench(c.motor, c.top_V, o), options);
  ExpectRecovered(e, "resistance", c.motor.resistance_ohm, 0.01);
  ExpectRecovered(e, "back_emf_constant", c.motor.back_emf_constant_V_s_per_rad, 0.01);
  ExpectRecovered(e, "inertia", c.motor.inertia_kg_m2, 0.03);
  ExpectRecovered(e, "viscous_friction", c.motor.viscous_friction_N_m_s_per_rad, 0.08);
  ExpectRecovered(e, "coulomb_friction", c.motor.coulomb_friction_N_m, 0.06);
  const QuantityEstimate* kt = e.Find("torque_constant");
  ASSERT_NE(kt, nullptr);
  EXPECT_EQ(kt->basis, "equal-to-Ke");
  ASSERT_TRUE(e.consistency.has_value());
  EXPECT_EQ(e.consistency->verdict, "not-checked");
}

INSTANTIATE_TEST_SUITE_P(
    Motors, FreeShaftRecovery,
    ::testing::Values(MotorCase{"small_12V_speed", IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0), 12.0, false, 31},
                      MotorCase{"small_12V_encoder", IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0), 12.0, true, 32},
                      MotorCase{"brushed_6V_speed", IdealMotor(0.8, 0.3e-3, 0.012, 6e-6, 3e-6, 8e-4, 0.5), 6.0, false, 33},
                      MotorCase{"large_24V_encoder", IdealMotor(0.6, 2e-3, 0.08, 4e-4, 8e-5, 1.5e-2, 0.0), 24.0, true, 34}),
    [](const auto& info) { return info.param.name; });

TEST(SpinDownAlone, GivesRatiosAndSaysWhyAbsoluteValuesAreMissing) {
  const model::MotorParameters m = IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0);
  BenchOptions o;
  o.locked_rotor = o.no_load = false;
  o.coast_voltage = false;
  o.seed = 41;
  const MotorEstimate e = joint::FitMotor(SimulateBench(m, 12.0, o), {});
  const QuantityEstimate* b_over_j = nullptr;
  for (const auto& q : e.ratios)
    if (q.key == "viscous_over_inertia") b_over_j = &q;
  ASSERT_NE(b_over_j, nullptr);
  EXPECT_NEAR(b_over_j->value, 0.5, 0.5 * 0.08);  // B/J = 1e-5/2e-5
  EXPECT_EQ(e.Find("inertia"), nullptr);
  bool reason = false;
  for (const auto& [key, why] : e.not_identified)
    if (key == "inertia" && why.find("B/J") != std::string::npos) reason = true;
  EXPECT_TRUE(reason);
}

TEST(SpinDownWithKnownInertia, GivesAbsoluteFriction) {
  const model::MotorParameters m = IdealMotor(2.0, 1e-3, 0.03, 2e-5, 1e-5, 2e-3, 0.0);
  BenchOptions o;
  o.locked_rotor = o.no_load = false;
  o.seed = 42;
  joint::MotorFitOptions options;
  options.known_inertia_kg_m2 = 2e-5;
  const MotorEstimate e = joint::FitMotor(SimulateBench(m, 12.0, o), options);
  ExpectRecovered(e, "viscous_friction", 1e-5, 0.08);
  ExpectRecovered(e, "coulomb_friction", 2e-3, 0.06);
  ExpectRecovered(e, "back_emf_constant", 0.03, 0.01);  // from the coast voltage, v = Ke·ω
}

}  // namespace
}  // namespace coilspin::testing

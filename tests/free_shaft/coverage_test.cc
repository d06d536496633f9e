// Interval coverage on simulated benches (statistics: a 95 % interval should
// hold the truth in about 95 % of repetitions). Twenty benches with fixed
// seeds; each parameter's interval must hold the truth at least 16 times
// (the chance of 15 or fewer at a true rate of 0.95 is under 2 %, binomial).

#include <gtest/gtest.h>

#include "free_shaft/coverage_tally.h"
#include "free_shaft/free_shaft_bench.h"

namespace coilspin::testing {
namespace {

constexpr int kBenches = 20;
constexpr int kMinCovered = 16;

TEST(FreeShaftCoverage, NominalIntervalsHoldTheTruth) {
  model::MotorParameters m;
  m.resistance_ohm = 1.2;
  m.inductance_H = 0.6e-3;
  m.back_emf_constant_V_s_per_rad = m.torque_constant_N_m_per_A = 0.025;
  m.inertia_kg_m2 = 1.5e-5;
  m.viscous_friction_N_m_s_per_rad = 8e-6;
  m.coulomb_friction_N_m = 1.8e-3;
  m.brush_drop_V = 0.4;
  const Truths truths = {
      {"resistance", m.resistance_ohm},         {"back_emf_constant", m.back_emf_constant_V_s_per_rad},
      {"inertia", m.inertia_kg_m2},             {"viscous_friction", m.viscous_friction_N_m_s_per_rad},
      {"coulomb_friction", m.coulomb_friction_N_m}, {"brush_drop", m.brush_drop_V}};
  std::map<std::string, int> covered;
  for (int k = 0; k < kBenches; ++k) {
    BenchOptions o;
    o.seed = 1000 + 10 * k;
    const MotorEstimate e = joint::FitMotor(SimulateBench(m, 10.0, o), {});
    CountCovered(e, truths, &covered);
  }
  for (const auto& [key, truth] : truths) EXPECT_GE(covered[key], kMinCovered) << key << " covered " << covered[key];
}

}  // namespace
}  // namespace coilspin::testing

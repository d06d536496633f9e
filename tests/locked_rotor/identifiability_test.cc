// What the locked-rotor logs cannot determine is reported as not identified,
// with the reason, never as a number (docs/methods.md §2: Vb separates from R
// only with plateaus at two or more current magnitudes; L needs a resolved
// current rise). Logs of one motor share R.

#include <gtest/gtest.h>

#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"

namespace coilspin::locked_rotor {
namespace {

model::MotorParameters Motor() {
  model::MotorParameters m;
  m.resistance_ohm = 1.8;
  m.inductance_H = 0.9e-3;
  return m;
}

model::BenchConditions Noisy(std::uint64_t seed) {
  model::BenchConditions b;
  b.voltage_noise_sigma_V = 2e-3;
  b.current_noise_sigma_A = 2e-3;
  b.seed = seed;
  return b;
}

BenchLog Plateaus(std::vector<double> levels, std::uint64_t seed) {
  model::PlateauPlan p;
  p.supply_levels_V = std::move(levels);
  p.hold_s = 0.4;
  return testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(), p, Noisy(seed)), "p" + std::to_string(seed));
}

std::string ReasonFor(const MotorEstimate& e, const std::string& key) {
  for (const auto& [k, reason] : e.not_identified)
    if (k == key) return reason;
  return "";
}

TEST(LockedRotorIdentifiability, PlateausAloneLeaveInductanceUndetermined) {
  const BenchLog log = Plateaus({1.0, 2.0, 3.0, 4.0}, 1);
  const MotorEstimate e = FitLockedRotor({&log}, {});
  ASSERT_NE(e.Find("resistance"), nullptr);
  EXPECT_EQ(e.Find("inductance"), nullptr);
  EXPECT_NE(ReasonFor(e, "inductance").find("step capture"), std::string::npos);
}

TEST(LockedRotorIdentifiability, SymmetricPairLeavesBrushDropUndetermined) {
  const BenchLog log = Plateaus({3.0, -3.0}, 2);
  const MotorEstimate e = FitLockedRotor({&log}, {});
  const QuantityEstimate* r = e.Find("resistance");
  ASSERT_NE(r, nullptr);
  EXPECT_NEAR(r->value, 1.8, 1.8 * 0.01);
  EXPECT_EQ(e.Find("brush_drop"), nullptr);
  EXPECT_NE(ReasonFor(e, "brush_drop").find("held at 0 V"), std::string::npos);
  EXPECT_DOUBLE_EQ(r->degrees_of_freedom, 1.0);  // two plateau means, one parameter
}

TEST(LockedRotorIdentifiability, OnePlateauDeterminesNothing) {
  const BenchLog log = Plateaus({3.0}, 3);
  const MotorEstimate e = FitLockedRotor({&log}, {});
  EXPECT_EQ(e.Find("resistance"), nullptr);
  EXPECT_NE(ReasonFor(e, "resistance").find("at least 2"), std::string::npos);
}

TEST(LockedRotorIdentifiability, SeveralLogsShareOneResistance) {
  const BenchLog a = Plateaus({1.0, 2.0, 3.0}, 4);
  const BenchLog b = Plateaus({-1.5, -2.5, -3.5, 4.0}, 5);
  const MotorEstimate both = FitLockedRotor({&a, &b}, {});
  const MotorEstimate only_a = FitLockedRotor({&a}, {});
  ASSERT_NE(both.Find("resistance"), nullptr);
  ASSERT_NE(only_a.Find("resistance"), nullptr);
  EXPECT_EQ(both.tests.size(), 2u);
  EXPECT_NEAR(both.Find("resistance")->value, 1.8, 1.8 * 0.01);
  // Pooling two logs narrows the interval (more plateaus, more degrees of freedom).
  EXPECT_LT(both.Find("resistance")->std_error, only_a.Find("resistance")->std_error);
}

}  // namespace
}  // namespace coilspin::locked_rotor

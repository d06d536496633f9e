// Closed-form starting values of the locked-rotor fit, on noise-free benches
// where the answer is known exactly (physics: Ohm's law on settled plateaus,
// v = R·i + Vb·sgn(i); first-order rise i(t) = (V/R)(1 − e^(−tR/L))).

#include <gtest/gtest.h>

#include "fitters/locked_rotor/capture.h"
#include "fitters/locked_rotor/initial_estimates.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"

namespace coilspin::locked_rotor {
namespace {

model::MotorParameters Motor(double r, double l, double vb) {
  model::MotorParameters m;
  m.resistance_ohm = r;
  m.inductance_H = l;
  m.brush_drop_V = vb;
  return m;
}

TEST(PlateauLine, RecoversResistanceAndBrushDropExactly) {
  model::PlateauPlan plan;
  plan.supply_levels_V = {2.0, 4.0, 6.0, -3.0, -5.0};
  plan.hold_s = 0.2;
  const auto log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(2.2, 1.5e-3, 0.8), plan, {}), "p");
  const auto plateaus = FindLockedPlateaus(log, {});
  ASSERT_EQ(plateaus.size(), 5u);
  const auto line = FitPlateauLine(plateaus, std::vector<double>(plateaus.size(), 1.0), true);
  ASSERT_TRUE(line.has_value());
  EXPECT_NEAR(line->resistance_ohm, 2.2, 1e-9);
  EXPECT_NEAR(line->brush_drop_V, 0.8, 1e-9);
}

TEST(PlateauLine, OneLevelCannotSeparateBrushDrop) {
  model::PlateauPlan plan;
  plan.supply_levels_V = {3.0, -3.0};  // equal magnitudes: v = R·i + Vb·sgn(i) is one equation twice
  plan.hold_s = 0.2;
  const auto log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(2.2, 1.5e-3, 0.8), plan, {}), "p");
  const auto plateaus = FindLockedPlateaus(log, {});
  ASSERT_EQ(plateaus.size(), 2u);
  EXPECT_FALSE(FitPlateauLine(plateaus, {1.0, 1.0}, true).has_value());
}

TEST(StepStart, NoiseFreeStepGivesResistanceAndInductanceNearTruth) {
  model::StepPlan plan;
  plan.supply_before_V = 0.0;
  plan.supply_after_V = 6.0;
  plan.before_s = 0.2e-3;
  plan.after_s = 8e-3;
  plan.sample_period_s = 10e-6;
  const auto log = testing::ToBenchLog(model::SimulateLockedRotorStep(Motor(2.2, 1.5e-3, 0.0), plan, {}), "s");
  EXPECT_EQ(ClassifyCapture(log).kind, CaptureKind::kStep);
  const auto start = EstimateStepStart(log, 0.0, std::nullopt);
  ASSERT_TRUE(start.has_value());
  EXPECT_NEAR(start->resistance_ohm, 2.2, 2.2 * 1e-3);  // settled after 11 τ: e^−11 ≈ 2e-5
  // Central differences of an exponential over Δ = τ/147 are exact to ~(Δ/τ)²/6.
  EXPECT_NEAR(start->inductance_H, 1.5e-3, 1.5e-3 * 0.02);
}

TEST(CaptureKind, SlowLoggerIsAPlateauLog) {
  model::PlateauPlan plan;
  plan.supply_levels_V = {2.0, 4.0, 6.0};
  plan.hold_s = 0.3;
  plan.sample_period_s = 1e-3;  // τ = 0.68 ms: the rise is over within one sample
  const auto log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(2.2, 1.5e-3, 0.0), plan, {}), "p");
  EXPECT_EQ(ClassifyCapture(log).kind, CaptureKind::kPlateaus);
}

}  // namespace
}  // namespace coilspin::locked_rotor

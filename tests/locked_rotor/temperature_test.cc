// Winding temperature: R is corrected to the reference temperature with the
// copper law R(θ) = R_ref·(k + θ)/(k + θ_ref), k = 234.5 °C (IEC 60028
// annealed copper, docs/methods.md §7), and heating across plateaus that no
// temperature explains is warned about.

#include <gtest/gtest.h>

#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "locked_rotor/simulated_bench.h"
#include "src/model/simulate_locked_rotor.h"

namespace coilspin::locked_rotor {
namespace {

model::MotorParameters Motor() {
  model::MotorParameters m;
  m.resistance_ohm = 3.3;   // at 20 degC (bench.resistance_reference_temperature_degC below)
  m.inductance_H = 1e-3;
  return m;
}

model::BenchConditions HeatingBench(double heating_K) {
  model::BenchConditions b;
  b.winding_temperature_degC = 30.0;
  b.resistance_reference_temperature_degC = 20.0;
  b.heating_per_plateau_K = heating_K;
  b.voltage_noise_sigma_V = 1e-3;
  b.current_noise_sigma_A = 1e-3;
  b.seed = 21;
  return b;
}

model::PlateauPlan Plan(bool log_temperature) {
  model::PlateauPlan p;
  p.supply_levels_V = {1.0, 2.0, 3.0, 4.0, 5.0, 6.0};
  p.hold_s = 0.5;
  p.log_temperature = log_temperature;
  return p;
}

bool HasWarningContaining(const MotorEstimate& e, const std::string& text) {
  for (const auto& w : e.warnings)
    if (w.find(text) != std::string::npos) return true;
  return false;
}

TEST(LockedRotorTemperature, HeatingWithoutTemperatureIsWarned) {
  // 3 K per plateau: R rises 15 K × 0.39 %/K ≈ 5.8 % over the test.
  const BenchLog log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(), Plan(false), HeatingBench(3.0)), "hot.csv");
  const MotorEstimate e = FitLockedRotor({&log}, {});
  EXPECT_TRUE(HasWarningContaining(e, "resistance rose"));
}

TEST(LockedRotorTemperature, SteadyWindingIsNotWarned) {
  const BenchLog log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(), Plan(false), HeatingBench(0.0)), "cool.csv");
  const MotorEstimate e = FitLockedRotor({&log}, {});
  EXPECT_FALSE(HasWarningContaining(e, "resistance"));
}

TEST(LockedRotorTemperature, LoggedTemperatureCorrectsToReference) {
  const BenchLog log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(), Plan(true), HeatingBench(3.0)), "logged.csv");
  LockedRotorOptions options;
  options.reference_temperature_degC = 20.0;
  const MotorEstimate e = FitLockedRotor({&log}, options);
  const QuantityEstimate* r = e.Find("resistance");
  ASSERT_NE(r, nullptr);
  EXPECT_NEAR(r->value, 3.3, 3.3 * 1e-3);  // the simulator's R at 20 degC
  EXPECT_FALSE(HasWarningContaining(e, "resistance rose"));
  ASSERT_TRUE(r->at_temperature_degC.has_value());
  EXPECT_DOUBLE_EQ(*r->at_temperature_degC, 20.0);
}

TEST(LockedRotorTemperature, GivenWindingTemperatureCorrectsToReference) {
  const BenchLog log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(), Plan(false), HeatingBench(0.0)), "given.csv");
  LockedRotorOptions options;
  options.winding_temperature_degC = 30.0;
  options.reference_temperature_degC = 75.0;
  const MotorEstimate e = FitLockedRotor({&log}, options);
  const QuantityEstimate* r = e.Find("resistance");
  ASSERT_NE(r, nullptr);
  // R(75)/R(20) = (234.5 + 75)/(234.5 + 20) = 1.2161 (references.md check value, IEC 60028).
  EXPECT_NEAR(r->value, 3.3 * 309.5 / 254.5, 3.3 * 1.2161 * 1e-3);
}

TEST(LockedRotorTemperature, ReferenceWithoutWindingTemperatureIsWarned) {
  const BenchLog log = testing::ToBenchLog(model::SimulateLockedRotorPlateaus(Motor(), Plan(false), HeatingBench(0.0)), "x.csv");
  LockedRotorOptions options;
  options.reference_temperature_degC = 25.0;
  const MotorEstimate e = FitLockedRotor({&log}, options);
  EXPECT_TRUE(HasWarningContaining(e, "not corrected"));
}

}  // namespace
}  // namespace coilspin::locked_rotor

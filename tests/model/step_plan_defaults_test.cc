#include "src/model/step_plan_defaults.h"

#include <gtest/gtest.h>

#include <stdexcept>

namespace coilspin::model {
namespace {

MotorParameters Winding(double resistance_ohm, double inductance_H) {
  MotorParameters motor;
  motor.resistance_ohm = resistance_ohm;
  motor.inductance_H = inductance_H;
  return motor;
}

TEST(StepSamplePeriod, SlowWindingGetsTheFastLoggersPeriod) {
  // physics: τe = L/(R + R_s) = 1 mH/(1.8 + 0.2) ohm = 0.5 ms; τe/10 = 50 µs is longer than the
  // logger's 20 µs, which then gives 25 samples per τe
  BenchConditions bench;
  bench.supply_resistance_ohm = 0.2;
  EXPECT_EQ(StepSamplePeriod_s(Winding(1.8, 1e-3), bench), kFastLoggerSamplePeriod_s);
}

TEST(StepSamplePeriod, FastWindingGetsTenSamplesPerElectricalTimeConstant) {
  // physics: τe = 0.1 mH/(0.8 + 0.2) ohm = 0.1 ms, shorter than 10 × 20 µs: Δ = τe/10 = 10 µs
  BenchConditions bench;
  bench.supply_resistance_ohm = 0.2;
  EXPECT_NEAR(StepSamplePeriod_s(Winding(0.8, 0.1e-3), bench), 10e-6, 1e-18);
}

TEST(StepSamplePeriod, UsesTheResistanceOfTheWarmWinding) {
  // IEC 60028 (references.md check value): R(75 °C)/R(20 °C) = 1.2161, so τe = 0.1 mH/1.2161 ohm
  constexpr double kRatio75Over20 = 1.2161, kRatioDecimalsTolerance = 5e-5;
  BenchConditions bench;
  bench.resistance_reference_temperature_degC = 20.0;
  bench.winding_temperature_degC = 75.0;
  const double period_s = StepSamplePeriod_s(Winding(1.0, 0.1e-3), bench);
  EXPECT_NEAR(0.1e-3 / kSamplesPerElectricalTimeConstant / period_s, kRatio75Over20, kRatioDecimalsTolerance);
}

TEST(StepSamplePeriod, RejectsAWindingWithoutATimeConstant) {
  // common practice: no inductance, no current rise to resolve
  EXPECT_THROW(StepSamplePeriod_s(Winding(1.0, 0.0), BenchConditions{}), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model

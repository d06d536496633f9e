#include "src/model/copper_resistance.h"

#include <gtest/gtest.h>

#include <stdexcept>

#include "src/units/constants.h"

namespace coilspin::model {
namespace {

// references.md check value: R(75 °C)/R(20 °C) = (234.5 + 75)/(234.5 + 20) = 1.2161,
// derived from the IEC 60028 coefficient; given to 4 decimals.
constexpr double kRatio75Over20 = 1.2161;
constexpr double kRatioDecimalsTolerance = 5e-5;
// IEC 60028: annealed copper, temperature coefficient at 20 °C, 0.00393 /K (3 digits).
constexpr double kAlpha20_per_K = 0.00393;
constexpr double kAlphaTolerance_per_K = 5e-6;
constexpr double kRoundingTolerance = 1e-15;

TEST(CopperResistance, SeventyFiveOverTwentyIsTheIecCheckValue) {
  // IEC 60028 (references.md): R(75 °C)/R(20 °C) = 1.2161
  EXPECT_NEAR(CopperResistanceAt(1.0, 20.0, 75.0), kRatio75Over20, kRatioDecimalsTolerance);
}

TEST(CopperResistance, SlopeAtTwentyDegreesIsTheIecCoefficient) {
  // IEC 60028: α20 = (dR/dθ)/R at 20 °C = 0.00393 /K; the line is straight, so one kelvin is exact.
  const double r20_ohm = 2.0;
  const double slope = (CopperResistanceAt(r20_ohm, 20.0, 21.0) - r20_ohm) / r20_ohm;
  EXPECT_NEAR(slope, kAlpha20_per_K, kAlphaTolerance_per_K);
}

TEST(CopperResistance, ScalesWithTheResistanceAndUsesTheNamedConstant) {
  // physics: R(θ) = R_ref·(k + θ)/(k + θ_ref), k = 234.5 °C (IEC 60028, IEEE Std 113)
  EXPECT_DOUBLE_EQ(units::kCopperTemperatureConstant_degC, 234.5);
  EXPECT_NEAR(CopperResistanceAt(3.0, 25.0, 65.0), 3.0 * (234.5 + 65.0) / (234.5 + 25.0),
              kRoundingTolerance * 3.0);
}

TEST(CopperResistance, CorrectingBackRecoversTheReference) {
  // physics: the same straight line read both ways is an identity
  const double hot_ohm = CopperResistanceAt(1.5, 25.0, 90.0);
  EXPECT_NEAR(CopperResistanceAt(hot_ohm, 90.0, 25.0), 1.5, kRoundingTolerance * 1.5);
}

TEST(CopperResistance, RejectsTemperaturesBelowTheLinesZero) {
  // physics: below θ = −k the linear law would give R ≤ 0
  EXPECT_THROW(CopperResistanceAt(1.0, 25.0, -234.5), std::invalid_argument);
  EXPECT_THROW(CopperResistanceAt(1.0, -300.0, 25.0), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::model

// Unit spellings and their factors to SI, checked against outside values.

#include "src/units/units.h"

#include <gtest/gtest.h>

#include <cmath>

#include "src/units/constants.h"

namespace coilspin::units {
namespace {

double FactorOf(Quantity quantity, const char* spelling) {
  const std::optional<Conversion> conversion = LookUpUnit(quantity, spelling);
  EXPECT_TRUE(conversion.has_value()) << spelling;
  return conversion ? conversion->factor : std::nan("");
}

TEST(Constants, PiAndStandardGravity) {
  EXPECT_DOUBLE_EQ(kPi, std::acos(-1.0));                   // physics (definition: cos π = −1)
  EXPECT_EQ(kRadiansPerRevolution, 2.0 * std::acos(-1.0));  // physics (definition of the radian)
  EXPECT_EQ(kStandardGravity_m_s2, 9.80665);                // NIST SP 811, Appendix B (exact)
  EXPECT_EQ(kOunceForceInch_N_m, 7.061552e-3);              // NIST SP 811, Appendix B
  EXPECT_EQ(kCelsiusZero_K, 273.15);                        // NIST SP 811, 4.2.1.1 (exact)
}

TEST(TimeUnits, FactorsToSeconds) {
  EXPECT_EQ(FactorOf(Quantity::kTime, "s"), 1.0);         // physics (SI base unit)
  EXPECT_EQ(FactorOf(Quantity::kTime, "sec"), 1.0);       // physics (synonym of s)
  EXPECT_EQ(FactorOf(Quantity::kTime, "ms"), 1e-3);       // NIST SP 811, 4.3 (prefix milli)
  EXPECT_EQ(FactorOf(Quantity::kTime, "us"), 1e-6);       // NIST SP 811, 4.3 (prefix micro)
  EXPECT_EQ(FactorOf(Quantity::kTime, "\u00b5s"), 1e-6);  // same, MICRO SIGN spelling
  EXPECT_EQ(FactorOf(Quantity::kTime, "\u03bcs"), 1e-6);  // same, GREEK MU spelling
}

TEST(ElectricalUnits, FactorsToVoltsAndAmperes) {
  EXPECT_EQ(FactorOf(Quantity::kVoltage, "V"), 1.0);     // physics (SI unit)
  EXPECT_EQ(FactorOf(Quantity::kVoltage, "Volt"), 1.0);  // physics (synonym of V)
  EXPECT_EQ(FactorOf(Quantity::kVoltage, "volt"), 1.0);  // physics (synonym of V)
  EXPECT_EQ(FactorOf(Quantity::kVoltage, "mV"), 1e-3);   // NIST SP 811, 4.3
  EXPECT_EQ(FactorOf(Quantity::kCurrent, "A"), 1.0);     // physics (SI unit)
  EXPECT_EQ(FactorOf(Quantity::kCurrent, "mA"), 1e-3);   // NIST SP 811, 4.3
}

TEST(SpeedUnits, FactorsToRadiansPerSecond) {
  // physics (definition): 1 rpm = 2π rad / 60 s = 0.104719755 rad/s (references.md)
  EXPECT_NEAR(FactorOf(Quantity::kSpeed, "rpm"), 0.104719755, 1e-9);
  EXPECT_DOUBLE_EQ(FactorOf(Quantity::kSpeed, "rpm"), 0.10471975511965977);
  EXPECT_DOUBLE_EQ(FactorOf(Quantity::kSpeed, "RPM"), 0.10471975511965977);
  EXPECT_DOUBLE_EQ(FactorOf(Quantity::kSpeed, "rev/s"), 6.283185307179586);  // physics: 2π rad per rev
  EXPECT_EQ(FactorOf(Quantity::kSpeed, "rad/s"), 1.0);                       // physics (SI unit)
}

TEST(PositionUnits, FactorsToRadians) {
  EXPECT_DOUBLE_EQ(FactorOf(Quantity::kPosition, "deg"), 0.017453292519943295);  // physics: π/180
  EXPECT_DOUBLE_EQ(FactorOf(Quantity::kPosition, "rev"), 6.283185307179586);     // physics: 2π
  EXPECT_EQ(FactorOf(Quantity::kPosition, "rad"), 1.0);                          // physics (SI unit)
  const std::optional<Conversion> counts = LookUpUnit(Quantity::kPosition, "counts");
  ASSERT_TRUE(counts.has_value());
  EXPECT_TRUE(counts->needs_counts_per_rev);            // physics: counts mean nothing without CPR
  EXPECT_DOUBLE_EQ(counts->factor, 6.283185307179586);  // physics: 2π per revolution of counts
  EXPECT_FALSE(LookUpUnit(Quantity::kPosition, "rev")->needs_counts_per_rev);  // physics
}

TEST(TorqueUnits, FactorsToNewtonMetres) {
  EXPECT_EQ(FactorOf(Quantity::kTorque, "oz*in"), 7.061552e-3);         // NIST SP 811, Appendix B: ozf·in
  EXPECT_DOUBLE_EQ(FactorOf(Quantity::kTorque, "kgf*cm"), 9.80665e-2);  // NIST SP 811, App. B: kgf·m / 100
  EXPECT_EQ(FactorOf(Quantity::kTorque, "mN*m"), 1e-3);                 // NIST SP 811, 4.3
  EXPECT_EQ(FactorOf(Quantity::kTorque, "mNm"), 1e-3);                  // NIST SP 811, 4.3
  for (const char* spelling : {"N*m", "Nm", "N\u00b7m", "N.m"}) {
    EXPECT_EQ(FactorOf(Quantity::kTorque, spelling), 1.0) << spelling;  // physics (SI unit, synonyms)
  }
  EXPECT_EQ(FactorOf(Quantity::kTorque, "lbf*in"), 1.129848e-1);       // NIST SP 811, Appendix B: lbf·in
  // Spellings outside the table are not guessed.
  EXPECT_FALSE(LookUpUnit(Quantity::kTorque, "lbfin").has_value());   // common practice (never guess)
  EXPECT_FALSE(LookUpUnit(Quantity::kTorque, "lb*in").has_value());   // a mass·length, not a torque
}

TEST(TemperatureUnits, KelvinBecomesCelsius) {
  const std::optional<Conversion> kelvin = LookUpUnit(Quantity::kTemperature, "K");
  ASSERT_TRUE(kelvin.has_value());
  // NIST SP 811, 4.2.1.1: t/degC = T/K − 273.15, so 300 K = 26.85 degC.
  EXPECT_NEAR(300.0 * kelvin->factor + kelvin->offset, 26.85, 1e-12);
  EXPECT_EQ(LookUpUnit(Quantity::kTemperature, "degC")->offset, 0.0);  // physics (same scale)
}

TEST(UnitLookUp, UnknownSpellingsAreNotGuessed) {
  // common practice (docs/file-formats.md: exact spellings only, nothing guessed)
  EXPECT_FALSE(LookUpUnit(Quantity::kTime, "S").has_value());
  EXPECT_FALSE(LookUpUnit(Quantity::kTime, "rpm").has_value());  // a unit of another quantity
  EXPECT_FALSE(LookUpUnit(Quantity::kSpeed, "Rpm").has_value());
  EXPECT_FALSE(LookUpUnit(Quantity::kVoltage, "Volts").has_value());
  EXPECT_FALSE(LookUpUnit(Quantity::kCurrent, "").has_value());
  EXPECT_FALSE(LookUpUnit(Quantity::kCurrent, " A").has_value());
}

TEST(UnitLookUp, AcceptedUnitsListTheContractFirstAndAllLookUp) {
  // docs/file-formats.md: the spellings of the input contract, in its order, come first.
  const std::vector<std::string> time = AcceptedUnits(Quantity::kTime);
  ASSERT_GE(time.size(), 3u);
  EXPECT_EQ(time[0], "s");
  EXPECT_EQ(time[1], "ms");
  EXPECT_EQ(time[2], "us");
  const std::vector<std::string> torque = AcceptedUnits(Quantity::kTorque);
  ASSERT_GE(torque.size(), 4u);
  EXPECT_EQ(torque[2], "oz*in");
  EXPECT_EQ(torque[3], "kgf*cm");
  for (Quantity quantity : AllQuantities()) {
    for (const std::string& spelling : AcceptedUnits(quantity)) {
      EXPECT_TRUE(LookUpUnit(quantity, spelling).has_value()) << spelling;  // physics (consistency)
    }
  }
}

TEST(Quantities, NamesRoundTripIgnoringCase) {
  ASSERT_EQ(AllQuantities().size(), 7u);  // docs/file-formats.md lists seven quantities
  for (Quantity quantity : AllQuantities()) {
    EXPECT_EQ(QuantityFromName(QuantityName(quantity)), quantity);
  }
  EXPECT_EQ(QuantityFromName("Time"), Quantity::kTime);  // common practice (case-insensitive)
  EXPECT_EQ(QuantityFromName("VOLTAGE"), Quantity::kVoltage);
  EXPECT_FALSE(QuantityFromName("volts").has_value());
  EXPECT_FALSE(QuantityFromName("").has_value());
}

TEST(Quantities, InternalUnitsAreSi) {
  EXPECT_EQ(InternalUnit(Quantity::kTime), "s");  // physics (SI)
  EXPECT_EQ(InternalUnit(Quantity::kSpeed), "rad/s");
  EXPECT_EQ(InternalUnit(Quantity::kPosition), "rad");
  EXPECT_EQ(InternalUnit(Quantity::kTorque), "N*m");
  EXPECT_EQ(InternalUnit(Quantity::kTemperature), "degC");  // units.h: kept in degC
}

}  // namespace
}  // namespace coilspin::units

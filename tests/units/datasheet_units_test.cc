// Units of datasheet figures, every spelling issue 13 names, converted to SI
// and checked against the factors printed in NIST SP 811 (2008), Appendix B,
// typed in here from the table (not computed the way the code computes them).

#include "src/units/datasheet_units.h"

#include <gtest/gtest.h>

#include <cmath>

#include "src/units/unit_text.h"

namespace coilspin::units {
namespace {

// NIST SP 811 Appendix B.8/B.9, as printed (seven significant digits).
constexpr double kNistOunceForceInch_N_m = 7.061552e-3;       // ounce (avoirdupois)-force inch
constexpr double kNistPoundForceInch_N_m = 1.129848e-1;       // pound-force inch
constexpr double kNistKilogramForce_N = 9.80665;              // kilogram-force (exact)
constexpr double kNistPoundInchSquared_kg_m2 = 2.926397e-4;   // pound inch squared (from memory of B.9)
constexpr double kNistPoundFootSquared_kg_m2 = 4.214011e-2;   // pound foot squared (from memory of B.9)
constexpr double kSevenDigits = 5e-7;                          // relative rounding of a printed factor
const double kPiFromCosine = std::acos(-1.0);                  // physics (definition: cos π = −1)

double Factor(Dimension dimension, const char* spelling) {
  const std::optional<DatasheetUnit> unit = LookUpDatasheetUnit(dimension, spelling);
  EXPECT_TRUE(unit.has_value()) << spelling;
  return unit ? unit->factor_to_si : std::nan("");
}

void ExpectNist(double factor, double nist) { EXPECT_NEAR(factor / nist, 1.0, kSevenDigits); }

TEST(DatasheetUnits, TorqueConstantSpellingsOfIssue13) {
  const Dimension kt = Dimension::kTorqueConstant;
  for (const char* milli : {"mN\u00b7m/A", "mNm/A", "mN.m/A", "mN*m/A", "mN m/A"}) {
    EXPECT_DOUBLE_EQ(Factor(kt, milli), 1e-3) << milli;  // NIST SP 811 4.3: prefix milli
  }
  for (const char* si : {"N-m/A", "N*m/A", "N\u00b7m/A", "Nm/A", "N.m/A"}) {
    EXPECT_EQ(Factor(kt, si), 1.0) << si;  // physics: the SI unit
  }
  for (const char* ounce_inch : {"oz\u00b7in/A", "oz-in/A", "oz*in/A"}) {
    ExpectNist(Factor(kt, ounce_inch), kNistOunceForceInch_N_m);  // NIST SP 811 App. B: ozf·in
  }
  for (const char* pound_inch : {"lbf\u00b7in/A", "lbf-in/A", "lbf*in/A"}) {
    ExpectNist(Factor(kt, pound_inch), kNistPoundForceInch_N_m);  // NIST SP 811 App. B: lbf·in
  }
  ExpectNist(Factor(kt, "kgf\u00b7cm/A"), kNistKilogramForce_N * 1e-2);  // NIST SP 811 App. B: kgf; cm = 1e-2 m
}

TEST(DatasheetUnits, SpeedAndBackEmfConstantSpellingsOfIssue13) {
  // physics: 1 rpm = 2π/60 rad/s
  EXPECT_DOUBLE_EQ(Factor(Dimension::kSpeedConstant, "rpm/V"), 2.0 * kPiFromCosine / 60.0);
  EXPECT_DOUBLE_EQ(Factor(Dimension::kBackEmfConstant, "V/krpm"), 60.0 / (2.0 * kPiFromCosine * 1000.0));
  EXPECT_DOUBLE_EQ(Factor(Dimension::kBackEmfConstant, "V/Krpm"), 60.0 / (2.0 * kPiFromCosine * 1000.0));
  EXPECT_EQ(SiUnitOf(Dimension::kSpeedConstant), "rad/(s*V)");  // the result file's spelling of Kv in SI
}

TEST(DatasheetUnits, InertiaSpellings) {
  const Dimension j = Dimension::kInertia;
  EXPECT_NEAR(Factor(j, "g\u00b7cm\u00b2"), 1e-7, 1e-22);  // NIST SP 811 4.3: g = 1e-3 kg, cm = 1e-2 m
  EXPECT_NEAR(Factor(j, "g*cm^2"), 1e-7, 1e-22);
  EXPECT_NEAR(Factor(j, "kg\u00b7cm\u00b2"), 1e-4, 1e-19);
  EXPECT_EQ(Factor(j, "kg*m^2"), 1.0);                          // physics: the SI unit
  ExpectNist(Factor(j, "lb\u00b7in\u00b2"), kNistPoundInchSquared_kg_m2);
  ExpectNist(Factor(j, "lb*ft^2"), kNistPoundFootSquared_kg_m2);
  ExpectNist(Factor(j, "oz*in^2"), kNistPoundInchSquared_kg_m2 / 16.0);  // NIST SP 811: oz = lb/16
  ExpectNist(Factor(j, "oz-in-s^2"), kNistOunceForceInch_N_m);            // physics: 1 N·m·s² = 1 kg·m²
}

TEST(DatasheetUnits, TorqueResistanceAndOtherLines) {
  ExpectNist(Factor(Dimension::kTorque, "kgf\u00b7cm"), kNistKilogramForce_N * 1e-2);  // NIST SP 811 App. B
  ExpectNist(Factor(Dimension::kTorque, "gf\u00b7cm"), kNistKilogramForce_N * 1e-5);   // NIST SP 811 App. B and 4.3
  ExpectNist(Factor(Dimension::kTorque, "oz-in"), kNistOunceForceInch_N_m);             // NIST SP 811 App. B
  ExpectNist(Factor(Dimension::kTorque, "lbf-in"), kNistPoundForceInch_N_m);            // NIST SP 811 App. B
  EXPECT_DOUBLE_EQ(Factor(Dimension::kTorque, "mN\u00b7m"), 1e-3);                     // NIST SP 811 4.3
  EXPECT_EQ(Factor(Dimension::kResistance, "\u03a9"), 1.0);                             // SI: ohm
  EXPECT_EQ(Factor(Dimension::kResistance, "\u2126"), 1.0);                             // SI: ohm (OHM SIGN)
  EXPECT_DOUBLE_EQ(Factor(Dimension::kResistance, "m\u03a9"), 1e-3);                   // NIST SP 811 4.3
  EXPECT_DOUBLE_EQ(Factor(Dimension::kInductance, "\u00b5H"), 1e-6);                   // NIST SP 811 4.3: micro
  EXPECT_DOUBLE_EQ(Factor(Dimension::kInductance, "mH"), 1e-3);                        // NIST SP 811 4.3
  EXPECT_DOUBLE_EQ(Factor(Dimension::kSpeed, "rpm"), 2.0 * kPiFromCosine / 60.0);      // physics
  EXPECT_DOUBLE_EQ(Factor(Dimension::kSpeed, "min\u207b\u00b9"), 2.0 * kPiFromCosine / 60.0);  // physics
  EXPECT_DOUBLE_EQ(Factor(Dimension::kTime, "ms"), 1e-3);                              // NIST SP 811 4.3
  EXPECT_DOUBLE_EQ(Factor(Dimension::kRatio, "%"), 1e-2);                              // NIST SP 811 7.10.2
  EXPECT_EQ(Factor(Dimension::kRatio, ""), 1.0);                                       // a bare number
  EXPECT_DOUBLE_EQ(Factor(Dimension::kMotorConstant, "mNm/\u221aW"), 1e-3);            // NIST SP 811 4.3
  // physics: rpm per mN·m = (2π/60 rad/s) / (1e-3 N·m)
  EXPECT_DOUBLE_EQ(Factor(Dimension::kSpeedTorqueSlope, "rpm/mNm"), 2.0 * kPiFromCosine / 60.0 / 1e-3);
}

TEST(DatasheetUnits, TemperatureKeepsItsOffset) {
  const std::optional<DatasheetUnit> kelvin = LookUpDatasheetUnit(Dimension::kTemperature, "K");
  ASSERT_TRUE(kelvin.has_value());
  EXPECT_EQ(kelvin->offset_to_si, -273.15);  // NIST SP 811 4.2.1.1: t/°C = T/K − 273.15
}

TEST(DatasheetUnits, WrongDimensionsAndUnknownSpellingsAreNotGuessed) {
  // common practice (nothing is guessed): a unit of another dimension is not this one's
  EXPECT_FALSE(LookUpDatasheetUnit(Dimension::kResistance, "mH").has_value());
  EXPECT_FALSE(LookUpDatasheetUnit(Dimension::kTorqueConstant, "V/krpm").has_value());
  EXPECT_FALSE(LookUpDatasheetUnit(Dimension::kInertia, "g*cm").has_value());
  EXPECT_FALSE(LookUpDatasheetUnit(Dimension::kTorque, "kgfcm").has_value());
  const std::vector<Dimension> of_mh = DimensionsOfUnit("mH");
  ASSERT_EQ(of_mh.size(), 1u);
  EXPECT_EQ(of_mh[0], Dimension::kInductance);
  EXPECT_TRUE(DimensionsOfUnit("furlong").empty());
}

TEST(DatasheetUnits, EveryAcceptedSpellingLooksUpAndSiComesFirst) {
  for (Dimension d : {Dimension::kResistance, Dimension::kInductance, Dimension::kVoltage, Dimension::kCurrent,
                      Dimension::kSpeed, Dimension::kTorque, Dimension::kTime, Dimension::kPower, Dimension::kInertia,
                      Dimension::kTorqueConstant, Dimension::kBackEmfConstant, Dimension::kMotorConstant,
                      Dimension::kViscousFriction, Dimension::kSpeedTorqueSlope, Dimension::kRatio}) {
    const std::vector<std::string> spellings = AcceptedDatasheetUnits(d);
    ASSERT_FALSE(spellings.empty());
    EXPECT_EQ(Factor(d, spellings.front().c_str()), 1.0) << DimensionName(d);  // physics: SI first
    for (const std::string& s : spellings) EXPECT_TRUE(LookUpDatasheetUnit(d, s).has_value()) << s;
  }
}

TEST(DatasheetUnits, DistinctUnitsDropSynonyms) {
  // N*m/A, Nm/A are one size; mN*m/A, mNm/A another (NIST SP 811 4.3)
  const std::vector<DatasheetUnit> kt = DistinctDatasheetUnits(Dimension::kTorqueConstant);
  ASSERT_EQ(kt.size(), 5u);  // N·m, mN·m, ozf·in, kgf·cm, lbf·in per ampere
  EXPECT_EQ(kt[0].spelling, "N*m/A");
}

TEST(UnitText, NormalisesOperatorsButGuessesNothing) {
  EXPECT_EQ(NormalisedUnitSpelling("N-m/A"), "N*m/A");
  EXPECT_EQ(NormalisedUnitSpelling("mN.m / A"), "mN*m/A");
  EXPECT_EQ(NormalisedUnitSpelling("g\u00b7cm\u00b2"), "g*cm^2");
  EXPECT_EQ(NormalisedUnitSpelling("mNm/\u221aW"), "mNm/sqrt(W)");
  EXPECT_EQ(NormalisedUnitSpelling("\u03bcH"), "uH");
  EXPECT_EQ(NormalisedUnitSpelling("min^-1"), "min^-1");  // a minus sign after '^' is an exponent, kept
}

TEST(UnitText, SplitsNumberAndUnit) {
  const NumberAndUnit a = SplitNumberAndUnit("  28.5 mN*m/A ", "2.2 oz*in/A");
  ASSERT_TRUE(a.value.has_value());
  EXPECT_EQ(*a.value, 28.5);
  EXPECT_EQ(a.unit, "mN*m/A");
  EXPECT_EQ(SplitNumberAndUnit("75", "x").unit, "");
  EXPECT_NE(SplitNumberAndUnit("ohm", "2.3 ohm").error.find("does not start with a number"), std::string::npos);
  EXPECT_NE(SplitNumberAndUnit("2,3 ohm", "2.3 ohm").error.find("decimal separator"), std::string::npos);
}

}  // namespace
}  // namespace coilspin::units

// Datasheet motor constants ("2.2 oz*in/A", "1.6 V/krpm", "850 rpm/V") and their
// factors to SI, checked against NIST SP 811 Appendix B and the definitions.

#include "src/units/compound_units.h"

#include <gtest/gtest.h>

#include <cmath>

namespace coilspin::units {
namespace {

const double kPiFromCosine = std::acos(-1.0);  // physics (definition: cos π = −1)

double FactorOf(const char* spelling, ConstantKind kind) {
  const std::optional<CompoundConversion> conversion = LookUpCompoundUnit(spelling);
  EXPECT_TRUE(conversion.has_value()) << spelling;
  if (!conversion) return std::nan("");
  EXPECT_EQ(conversion->kind, kind) << spelling;
  return conversion->factor_to_si;
}

MotorConstant Parsed(const char* text) {
  const MotorConstantParse parsed = ParseMotorConstant(text);
  EXPECT_TRUE(parsed.constant.has_value()) << text << ": " << parsed.error;
  return parsed.constant.value_or(MotorConstant{});
}

TEST(TorqueConstantUnits, FactorsToNewtonMetresPerAmpere) {
  const ConstantKind kt = ConstantKind::kTorqueConstant;
  EXPECT_DOUBLE_EQ(FactorOf("oz*in/A", kt), 7.061552e-3);    // NIST SP 811 Appendix B: ozf·in = 7.061552e-3 N·m
  EXPECT_DOUBLE_EQ(FactorOf("kgf*cm/A", kt), 9.80665e-2);    // NIST SP 811 Appendix B: kgf·m = 9.80665 N·m; cm = 1e-2 m
  EXPECT_DOUBLE_EQ(FactorOf("mN*m/A", kt), 1e-3);            // NIST SP 811 4.3: prefix milli
  EXPECT_DOUBLE_EQ(FactorOf("mNm/A", kt), 1e-3);             // NIST SP 811 4.3 (same unit, no operator)
  EXPECT_EQ(FactorOf("N*m/A", kt), 1.0);                     // physics (SI unit)
  EXPECT_EQ(FactorOf("Nm/A", kt), 1.0);                      // physics (SI unit, no operator)
  EXPECT_DOUBLE_EQ(FactorOf("oz\u00b7in/A", kt), 7.061552e-3);  // NIST SP 811 Appendix B, '·' spelling
  EXPECT_DOUBLE_EQ(FactorOf("mN\u00b7m/A", kt), 1e-3);          // NIST SP 811 4.3, '·' spelling
  EXPECT_DOUBLE_EQ(FactorOf("kgf\u00b7cm/A", kt), 9.80665e-2);  // NIST SP 811 Appendix B, '·' spelling
  EXPECT_DOUBLE_EQ(FactorOf("lbf*in/A", kt), 1.129848e-1);      // NIST SP 811 Appendix B: lbf·in = 0.1129848 N·m
  EXPECT_DOUBLE_EQ(FactorOf("lbf\u00b7in/A", kt), 1.129848e-1);  // NIST SP 811 Appendix B, '·' spelling
  // Datasheets join the factors of N·m with '-' or '.' (issue 13's spellings).
  EXPECT_EQ(FactorOf("N-m/A", kt), 1.0);                        // physics (SI unit)
  EXPECT_DOUBLE_EQ(FactorOf("mN.m/A", kt), 1e-3);               // NIST SP 811 4.3: prefix milli
  EXPECT_DOUBLE_EQ(FactorOf("oz-in/A", kt), 7.061552e-3);       // NIST SP 811 Appendix B (ozf·in)
  EXPECT_DOUBLE_EQ(FactorOf("lbf-in/A", kt), 1.129848e-1);      // NIST SP 811 Appendix B (lbf·in)
}

TEST(BackEmfConstantUnits, FactorsToVoltSecondsPerRadian) {
  const ConstantKind ke = ConstantKind::kBackEmfConstant;
  // physics: 1 rpm = 2π rad / 60 s, so 1 V/rpm = 60/(2π) V·s/rad = 9.549296585513721
  EXPECT_DOUBLE_EQ(FactorOf("V/rpm", ke), 9.549296585513721);
  EXPECT_DOUBLE_EQ(FactorOf("V/rpm", ke), 60.0 / (2.0 * kPiFromCosine));
  EXPECT_DOUBLE_EQ(FactorOf("V/krpm", ke), 9.549296585513721e-3);  // physics + NIST SP 811 4.3 (kilo)
  EXPECT_DOUBLE_EQ(FactorOf("mV/rpm", ke), 9.549296585513721e-3);  // physics + NIST SP 811 4.3 (milli)
  EXPECT_DOUBLE_EQ(FactorOf("V/kRPM", ke), 9.549296585513721e-3);  // same, capital spelling
  EXPECT_DOUBLE_EQ(FactorOf("mV/RPM", ke), 9.549296585513721e-3);  // same, capital spelling
  EXPECT_DOUBLE_EQ(FactorOf("V/Krpm", ke), 9.549296585513721e-3);  // same; datasheets capitalise the K
  EXPECT_EQ(FactorOf("V*s/rad", ke), 1.0);                         // physics (SI unit)
  EXPECT_EQ(FactorOf("V\u00b7s/rad", ke), 1.0);                    // physics (SI unit, '·')
  EXPECT_EQ(FactorOf("V/(rad/s)", ke), 1.0);                       // physics (the same unit)
}

TEST(SpeedConstantUnits, FactorsToRadiansPerSecondPerVolt) {
  const ConstantKind kv = ConstantKind::kSpeedConstant;
  EXPECT_DOUBLE_EQ(FactorOf("rpm/V", kv), 0.10471975511965977);    // physics: 2π/60 (references.md: 0.104719755)
  EXPECT_NEAR(FactorOf("rpm/V", kv), 0.104719755, 1e-9);            // references.md, rpm to rad/s
  EXPECT_DOUBLE_EQ(FactorOf("RPM/V", kv), 0.10471975511965977);    // same, capital spelling
  EXPECT_DOUBLE_EQ(FactorOf("krpm/V", kv), 104.71975511965977);    // physics + NIST SP 811 4.3 (kilo)
  EXPECT_EQ(FactorOf("(rad/s)/V", kv), 1.0);                       // physics (SI unit)
}

TEST(ParseMotorConstant, DatasheetSpellingsBecomeSi) {
  // NIST SP 811 Appendix B: 2.2 ozf·in = 2.2 × 7.061552e-3 N·m
  EXPECT_NEAR(Parsed("2.2 oz*in/A").value_si, 0.0155354144, 1e-15);
  EXPECT_NEAR(Parsed("15.3 mN*m/A").value_si, 0.0153, 1e-15);          // NIST SP 811 4.3
  EXPECT_NEAR(Parsed("0.35 kgf*cm/A").value_si, 0.034323275, 1e-15);   // NIST SP 811 Appendix B
  EXPECT_EQ(Parsed("0.0191 N*m/A").value_si, 0.0191);                   // physics (SI already)
  // physics: 1.6 V per 1000 rpm = 1.6·60/(2π·1000) V·s/rad
  EXPECT_NEAR(Parsed("1.6 V/krpm").value_si, 0.015278874536821955, 1e-15);
  EXPECT_EQ(Parsed("0.0167 V*s/rad").value_si, 0.0167);                 // physics (SI already)
  EXPECT_NEAR(Parsed("2 mV/rpm").value_si, 0.01909859317102744, 1e-15);  // physics: 2e-3·60/(2π)
  const MotorConstant kv = Parsed("850 rpm/V");
  EXPECT_EQ(kv.kind, ConstantKind::kSpeedConstant);
  EXPECT_NEAR(kv.value_si, 850.0 * 2.0 * kPiFromCosine / 60.0, 1e-12);  // physics: rpm = 2π/60 rad/s
}

TEST(ParseMotorConstant, KvBecomesKeAsSixtyOverTwoPiKv) {
  // physics: Ke = 60/(2π·Kv) V·s/rad for Kv in rpm/V (references.md)
  const MotorConstant kv = Parsed("850 rpm/V");
  EXPECT_NEAR(BackEmfConstantOf_V_s_per_rad(kv), 60.0 / (2.0 * kPiFromCosine * 850.0), 1e-15);
  EXPECT_NEAR(BackEmfConstantOf_V_s_per_rad(kv), 0.011234466571192613, 1e-15);
  EXPECT_NEAR(BackEmfConstantFromSpeedConstant_V_s_per_rad(50.0), 0.02, 1e-15);  // physics: Ke = 1/Kv in SI
  // A back-EMF constant passes through unchanged (physics: it already is Ke).
  EXPECT_EQ(BackEmfConstantOf_V_s_per_rad(Parsed("0.0167 V*s/rad")), 0.0167);
  EXPECT_THROW(BackEmfConstantOf_V_s_per_rad(Parsed("2.2 oz*in/A")), std::invalid_argument);  // physics: Kt ≠ Ke kind
}

TEST(ParseMotorConstant, KeepsWhatWasWrittenAndIgnoresSpaces) {
  const MotorConstant kt = Parsed("  2.2   oz\u00b7in/A ");
  EXPECT_EQ(kt.kind, ConstantKind::kTorqueConstant);  // NIST SP 811: oz·in/A is torque per current
  EXPECT_EQ(kt.value, 2.2);
  EXPECT_EQ(kt.unit, "oz*in/A");                      // the table's spelling ('·' → '*')
  EXPECT_EQ(kt.as_given, "2.2   oz\u00b7in/A");      // trimmed, otherwise as written
  EXPECT_NEAR(Parsed("2.2oz*in/A").value_si, 0.0155354144, 1e-15);  // NIST SP 811 Appendix B; no space
  EXPECT_NEAR(Parsed("1.6 V / krpm").value_si, 0.015278874536821955, 1e-15);  // physics; spaces in the unit
  EXPECT_NEAR(Parsed("1.6e0 V/krpm").value_si, 0.015278874536821955, 1e-15);  // physics; exponent notation
}

TEST(ParseMotorConstant, UnknownUnitsListWhatIsAccepted) {
  // common practice (nothing is guessed): a wrong case or a missing operator is not accepted
  for (const char* text : {"2.2 ozin/A", "2.2 OZ*IN/A", "1.6 V/KRPM", "2.2 oz*in"}) {
    const MotorConstantParse parsed = ParseMotorConstant(text);
    EXPECT_FALSE(parsed.constant.has_value()) << text;
    EXPECT_NE(parsed.error.find("unknown unit"), std::string::npos) << parsed.error;
    EXPECT_NE(parsed.error.find("oz*in/A"), std::string::npos) << parsed.error;
    EXPECT_NE(parsed.error.find("V/krpm"), std::string::npos) << parsed.error;
    EXPECT_NE(parsed.error.find("rpm/V"), std::string::npos) << parsed.error;
  }
  EXPECT_NE(ParseMotorConstant("2.2 ozin/A").error.find("'ozin/A'"), std::string::npos);
}

TEST(ParseMotorConstant, MalformedNumbersAreRefused) {
  // common practice: a constant is a finite number followed by a unit
  EXPECT_NE(ParseMotorConstant("").error.find("got nothing"), std::string::npos);
  EXPECT_NE(ParseMotorConstant("oz*in/A").error.find("does not start with a number"), std::string::npos);
  EXPECT_NE(ParseMotorConstant("2.2").error.find("has no unit"), std::string::npos);
  EXPECT_NE(ParseMotorConstant("inf V/krpm").error.find("finite"), std::string::npos);
  EXPECT_NE(ParseMotorConstant("nan V/krpm").error.find("finite"), std::string::npos);
  EXPECT_NE(ParseMotorConstant("2,2 oz*in/A").error.find("decimal separator"), std::string::npos);
  EXPECT_FALSE(ParseMotorConstant("2.2 oz*in/A junk").constant.has_value());
}

TEST(CompoundUnitTable, EverySpellingLooksUpWithItsKind) {
  for (ConstantKind kind :
       {ConstantKind::kTorqueConstant, ConstantKind::kBackEmfConstant, ConstantKind::kSpeedConstant}) {
    const std::vector<std::string> spellings = AcceptedCompoundUnits(kind);
    ASSERT_FALSE(spellings.empty());
    EXPECT_EQ(spellings.front(), SiUnitOf(kind));  // physics: the SI spelling comes first, factor 1
    EXPECT_EQ(FactorOf(spellings.front().c_str(), kind), 1.0);
    for (const std::string& spelling : spellings) {
      const std::optional<CompoundConversion> conversion = LookUpCompoundUnit(spelling);
      ASSERT_TRUE(conversion.has_value()) << spelling;  // every row resolves in the unit table
      EXPECT_EQ(conversion->kind, kind) << spelling;
      EXPECT_GT(conversion->factor_to_si, 0.0) << spelling;
    }
  }
}

TEST(CompoundUnitTable, DistinctFactorsDropSynonyms) {
  // NIST SP 811: N·m/A, mN·m/A, ozf·in/A, kgf·cm/A and lbf·in/A are five different sizes
  const std::vector<CompoundUnitFactor> torque = DistinctCompoundUnits(ConstantKind::kTorqueConstant);
  ASSERT_EQ(torque.size(), 5u);
  EXPECT_EQ(torque[0].spelling, "N*m/A");
  EXPECT_EQ(torque[1].spelling, "mN*m/A");
  EXPECT_EQ(torque[2].spelling, "oz*in/A");
  EXPECT_EQ(torque[3].spelling, "kgf*cm/A");
  EXPECT_EQ(torque[4].spelling, "lbf*in/A");
  // physics: V/krpm and mV/rpm are the same size, so three distinct back-EMF units
  const std::vector<CompoundUnitFactor> back_emf = DistinctCompoundUnits(ConstantKind::kBackEmfConstant);
  ASSERT_EQ(back_emf.size(), 3u);
  EXPECT_EQ(back_emf[2].spelling, "V/krpm");
  EXPECT_EQ(DistinctCompoundUnits(ConstantKind::kSpeedConstant).size(), 3u);  // physics: rad/s, rpm, krpm
}

TEST(ConstantKinds, NamesAndSiUnits) {
  EXPECT_EQ(SiUnitOf(ConstantKind::kTorqueConstant), "N*m/A");      // physics (SI)
  EXPECT_EQ(SiUnitOf(ConstantKind::kBackEmfConstant), "V*s/rad");   // physics (SI)
  EXPECT_EQ(SiUnitOf(ConstantKind::kSpeedConstant), "(rad/s)/V");   // physics (SI)
  EXPECT_EQ(ConstantKindName(ConstantKind::kTorqueConstant), "torque constant");  // common practice (trade name)
  EXPECT_EQ(ConstantKindName(ConstantKind::kSpeedConstant), "speed constant");    // common practice (trade name)
}

}  // namespace
}  // namespace coilspin::units

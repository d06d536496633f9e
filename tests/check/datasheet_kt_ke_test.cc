// Kt/Ke of datasheet figures: pairs built from physics (an ideal machine has
// Kt = Ke in SI), written in datasheet units with NIST SP 811 Appendix B factors,
// then mis-stated by a brushless convention or a unit slip.

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

#include "src/check/kt_ke_consistency.h"
#include "src/check/unit_slips.h"

namespace coilspin::check {
namespace {

const double kPiFromCosine = std::acos(-1.0);         // physics (definition: cos π = −1)
constexpr double kOunceForceInch_N_m = 7.061552e-3;    // NIST SP 811 Appendix B
constexpr double kTrueConstant_SI = 0.02;              // Ke = 0.02 V·s/rad ⇒ Kt = 0.02 N·m/A (physics)

std::string Written(double value, const char* unit) {
  char buffer[64];
  std::snprintf(buffer, sizeof buffer, "%.10g %s", value, unit);
  return buffer;
}

// Datasheet spellings of an SI constant (NIST SP 811 Appendix B; physics: 1 krpm = 1000·2π/60 rad/s).
std::string InOunceInchPerAmpere(double kt_SI) { return Written(kt_SI / kOunceForceInch_N_m, "oz*in/A"); }
std::string InVoltPerKrpm(double ke_SI) { return Written(ke_SI * 1000.0 * 2.0 * kPiFromCosine / 60.0, "V/krpm"); }

units::MotorConstant Constant(const std::string& text) {
  const units::MotorConstantParse parsed = units::ParseMotorConstant(text);
  EXPECT_TRUE(parsed.constant.has_value()) << text << ": " << parsed.error;
  return parsed.constant.value_or(units::MotorConstant{});
}

DatasheetKtKe Check(const std::string& kt, const std::string& ke, double tolerance = 0.05) {
  return CheckDatasheetKtKe(Constant(kt), Constant(ke), tolerance);
}

TEST(DatasheetKtKe, AnIdealMachineWrittenInDatasheetUnitsAgrees) {
  // physics: Kt = Ke = 0.02 in SI; 2.832238579 oz·in/A and 2.094395102 V/krpm
  EXPECT_EQ(InOunceInchPerAmpere(kTrueConstant_SI), "2.832238579 oz*in/A");
  EXPECT_EQ(InVoltPerKrpm(kTrueConstant_SI), "2.094395102 V/krpm");
  const DatasheetKtKe d = Check(InOunceInchPerAmpere(kTrueConstant_SI), InVoltPerKrpm(kTrueConstant_SI));
  EXPECT_NEAR(d.torque_constant_N_m_per_A, 0.02, 1e-11);
  EXPECT_NEAR(d.back_emf_constant_V_s_per_rad, 0.02, 1e-11);
  EXPECT_NEAR(d.kt_over_ke, 1.0, 1e-9);
  EXPECT_EQ(d.verdict, "consistent");
  EXPECT_FALSE(d.cause.has_value());
  EXPECT_NE(d.explanation.find("within 1 \u00b1 0.05"), std::string::npos) << d.explanation;
}

TEST(DatasheetKtKe, SpeedConstantStandsForKe) {
  // physics: Ke = 0.02 V·s/rad ⇔ Kv = 1/Ke = 50 (rad/s)/V = 50·60/(2π) = 477.4648293 rpm/V
  const DatasheetKtKe d = Check("0.02 N*m/A", Written(50.0 * 60.0 / (2.0 * kPiFromCosine), "rpm/V"));
  EXPECT_NEAR(d.back_emf_constant_V_s_per_rad, 0.02, 1e-11);
  EXPECT_EQ(d.verdict, "consistent");
}

TEST(DatasheetKtKe, ModestMismatchWithNoKnownCause) {
  // physics: 6 % off is outside 1 ± 0.05 and 8 % from the nearest convention factor (2/√3)
  const DatasheetKtKe d = Check("0.0212 N*m/A", "0.02 V*s/rad");
  EXPECT_NEAR(d.kt_over_ke, 1.06, 1e-12);
  EXPECT_EQ(d.verdict, "inconsistent");
  EXPECT_FALSE(d.cause.has_value());
  EXPECT_NE(d.explanation.find("matches no"), std::string::npos) << d.explanation;
  // The tolerance is the user's (docs/methods.md §5): 1.06 is consistent within 1 ± 0.1.
  EXPECT_EQ(Check("0.0212 N*m/A", "0.02 V*s/rad", 0.1).verdict, "consistent");
}

TEST(DatasheetKtKe, LineToLinePeakKeAgainstPerPhaseKtIsFactorSqrtThree) {
  // references.md (brushless conventions): Ke_LL,pk = √3·k_ph; the per-phase Kt is k_ph.
  const double k_ph = kTrueConstant_SI;
  const DatasheetKtKe d = Check(InOunceInchPerAmpere(k_ph), InVoltPerKrpm(std::sqrt(3.0) * k_ph));
  EXPECT_NEAR(d.kt_over_ke, 1.0 / std::sqrt(3.0), 1e-9);
  EXPECT_EQ(d.verdict, "inconsistent");
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_EQ(d.cause->factor.kind, MismatchKind::kWindingConvention);
  EXPECT_EQ(d.cause->factor.name, "1/\u221a3");
  EXPECT_NE(d.explanation.find("Ke quoted line-to-line in peak volts"), std::string::npos) << d.explanation;
  EXPECT_NE(d.explanation.find("Kt is per phase"), std::string::npos) << d.explanation;
  EXPECT_NE(d.explanation.find("factor \u221a3"), std::string::npos) << d.explanation;
}

TEST(DatasheetKtKe, RmsKtAgainstLineToLineRmsKeIsFactorSqrtThree) {
  // references.md: Kt per A rms = √3·Ke_LL,rms (the usual servo datasheet pair)
  const double ke_line_rms = kTrueConstant_SI;
  const DatasheetKtKe d = Check(Written(std::sqrt(3.0) * ke_line_rms, "N*m/A"), InVoltPerKrpm(ke_line_rms));
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_EQ(d.cause->factor.name, "\u221a3");
  EXPECT_NE(d.cause->factor.explanation.find("per ampere rms"), std::string::npos);
}

TEST(DatasheetKtKe, PeakKtAgainstLineToLinePeakKeIsRootThreeOverTwo) {
  // references.md: Kt per A peak = (√3/2)·Ke_LL,pk
  const DatasheetKtKe d = Check(Written(std::sqrt(3.0) / 2.0 * 0.03, "N*m/A"), "0.03 V*s/rad");
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_EQ(d.cause->factor.name, "\u221a3/2");
}

TEST(DatasheetKtKe, MilliNewtonMetresReadAsNewtonMetresIsAUnitSlip) {
  // NIST SP 811 4.3: 0.02 N·m/A = 20 mN·m/A; written "20 N*m/A" it is 1000 times too large
  const DatasheetKtKe d = Check("20 N*m/A", InVoltPerKrpm(kTrueConstant_SI));
  EXPECT_NEAR(d.kt_over_ke, 1000.0, 1e-6);
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_EQ(d.cause->factor.kind, MismatchKind::kUnitSlip);
  EXPECT_EQ(d.cause->factor.name, "1000");
  EXPECT_NE(d.explanation.find("torque constant looks like mN*m/A written as N*m/A"), std::string::npos)
      << d.explanation;
}

TEST(DatasheetKtKe, PerRpmReadAsPerRadianPerSecondIsAUnitSlip) {
  // physics: 0.02 V·s/rad = 0.02·2π/60 = 0.002094395 V/rpm; written as V·s/rad, Kt/Ke = 60/(2π)
  const DatasheetKtKe d = Check("0.02 N*m/A", Written(0.02 * 2.0 * kPiFromCosine / 60.0, "V*s/rad"));
  EXPECT_NEAR(d.kt_over_ke, 60.0 / (2.0 * kPiFromCosine), 1e-8);
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_EQ(d.cause->factor.kind, MismatchKind::kUnitSlip);
  EXPECT_NE(d.cause->factor.explanation.find("back-EMF constant looks like V/rpm written as V*s/rad"),
            std::string::npos)
      << d.cause->factor.explanation;
  // 60/(2π) = 9.549 is also within 5 % of 10: the decimal slip is listed too (physics: 10/9.549 = 1.047).
  ASSERT_EQ(d.cause->also.size(), 1u);
  EXPECT_EQ(d.cause->also[0].name, "10");
  EXPECT_NE(d.explanation.find("Also within the tolerance"), std::string::npos);
}

TEST(DatasheetKtKe, OunceInchFigureReadAsNewtonMetresIsAUnitSlip) {
  // NIST SP 811 Appendix B: the oz·in/A figure taken as N·m/A is 1/7.061552e-3 = 141.6 times too large
  const DatasheetKtKe d = Check(Written(0.02 / kOunceForceInch_N_m, "N*m/A"), "0.02 V*s/rad");
  EXPECT_NEAR(d.kt_over_ke, 1.0 / kOunceForceInch_N_m, 1e-6);
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_NE(d.cause->factor.explanation.find("oz*in/A written as N*m/A"), std::string::npos);
}

TEST(DatasheetKtKe, SpeedConstantInRpmReadAsRadiansPerSecondIsAUnitSlip) {
  // physics: Kv = 477.46 rpm/V (Ke = 0.02 V·s/rad) written as (rad/s)/V makes Ke 2π/60 too small
  const DatasheetKtKe d = Check("0.02 N*m/A", Written(50.0 * 60.0 / (2.0 * kPiFromCosine), "(rad/s)/V"));
  EXPECT_NEAR(d.kt_over_ke, 60.0 / (2.0 * kPiFromCosine), 1e-8);
  ASSERT_TRUE(d.cause.has_value());
  EXPECT_NE(d.cause->factor.explanation.find("speed constant looks like rpm/V written as (rad/s)/V"),
            std::string::npos)
      << d.cause->factor.explanation;
}

TEST(UnitSlips, OnlyUnitsOfTheFiguresKindAreTried) {
  // NIST SP 811: from N·m/A the other torque units differ by 1000, 141.6 and 10.20;
  // from V/krpm the other back-EMF units by 104.7 and 1000 (physics: 2π/60·1000, kilo)
  const std::vector<MismatchFactor> slips = UnitSlipFactors(Constant("1 N*m/A"), Constant("1 V/krpm"));
  auto has = [&slips](double value) {
    for (const MismatchFactor& s : slips)
      if (std::fabs(s.kt_over_ke / value - 1.0) < 1e-9) return true;
    return false;
  };
  EXPECT_TRUE(has(1000.0));                              // mN·m/A as N·m/A; V/rpm as V/krpm; 10^3
  EXPECT_TRUE(has(1.0 / kOunceForceInch_N_m));           // oz·in/A as N·m/A
  EXPECT_TRUE(has(1.0 / 9.80665e-2));                    // kgf·cm/A as N·m/A (NIST SP 811 Appendix B)
  EXPECT_TRUE(has(1000.0 * 2.0 * kPiFromCosine / 60.0));  // V·s/rad as V/krpm: Ke 104.7 times too small
  EXPECT_FALSE(has(kOunceForceInch_N_m));                // N·m/A as oz·in/A: the figure was given in N·m/A
  EXPECT_TRUE(has(1e-6) && has(1e6));                    // decimal slips, micro to mega
}

TEST(DatasheetKtKe, MisuseIsAProgrammerError) {
  // common practice: kinds and signs are validated by the caller (the CLI), then asserted here
  EXPECT_THROW(Check("1.6 V/krpm", "1.6 V/krpm"), std::invalid_argument);
  EXPECT_THROW(Check("0.02 N*m/A", "0.02 N*m/A"), std::invalid_argument);
  EXPECT_THROW(Check("-0.02 N*m/A", "0.02 V*s/rad"), std::invalid_argument);
  EXPECT_THROW(Check("0.02 N*m/A", "0.02 V*s/rad", 1.0), std::invalid_argument);
}

}  // namespace
}  // namespace coilspin::check

// A datasheet checked against itself (src/verify/sheet_consistency.h). The
// sheets are built from one ideal motor by physics (the relations of
// docs/methods.md §6 with Kt = Ke in SI), written in datasheet units (NIST SP
// 811; 1 rpm = 2π/60 rad/s), then spoilt by one known cause: a unit slip, a
// brushless winding convention, a figure printed for another voltage.

#include "src/verify/sheet_consistency.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <string>

#include "src/verify/datasheet_file.h"

namespace coilspin::verify {
namespace {

const double kPiFromCosine = std::acos(-1.0);            // physics (definition: cos π = −1)
const double kRpm = 2.0 * kPiFromCosine / 60.0;           // rad/s per rpm (physics)
const double kSqrt3 = std::sqrt(3.0);                     // star winding, line-to-line over phase

// The motor (invented): R, Kt = Ke (SI), J, L, no-load current, at V.
constexpr double kR = 2.3, kK = 0.0285, kJ = 1.2e-6, kL = 0.5e-3, kI0 = 0.1, kV = 12.0;

std::string Figure(double value, const char* unit) {
  char text[64];
  std::snprintf(text, sizeof text, "%.6g %s", value, unit);
  return text;
}

struct Sheet {
  double ke_written_si = kK;        // back-EMF constant as printed (SI)
  std::string kt_text = Figure(kK * 1e3, "mN*m/A");
  double no_load_speed_at_V = kV;   // the voltage its no-load speed is printed for

  std::string Toml() const {
    const double no_load_speed = (no_load_speed_at_V - kR * kI0) / kK;  // ω0 = (V − R·I0)/Ke
    const double efficiency = std::pow(1.0 - std::sqrt(kI0 * kR / kV), 2.0);  // (1 − √(I0/I_stall))², Vb = 0
    std::string t = "[datasheet]\nlabel = \"built from physics\"\nrated_voltage = \"12 V\"\n[spec]\n";
    t += "resistance = { nominal = \"" + Figure(kR, "ohm") + "\", tolerance = \"8 %\" }\n";
    t += "inductance = { nominal = \"" + Figure(kL * 1e3, "mH") + "\", tolerance = \"10 %\" }\n";
    t += "torque_constant = { nominal = \"" + kt_text + "\", tolerance = \"5 %\" }\n";
    t += "back_emf_constant = { nominal = \"" + Figure(ke_written_si * 1e3 * kRpm, "V/krpm") +
         "\", tolerance = \"5 %\" }\n";
    t += "inertia = { nominal = \"" + Figure(kJ * 1e7, "g*cm^2") + "\", tolerance = \"10 %\" }\n";
    t += "stall_torque = { nominal = \"" + Figure(kK * kV / kR, "N*m") + "\", tolerance = \"10 %\" }\n";
    t += "stall_current = { nominal = \"" + Figure(kV / kR, "A") + "\", tolerance = \"10 %\" }\n";
    t += "no_load_speed = { nominal = \"" + Figure(no_load_speed / kRpm, "rpm") + "\", tolerance = \"10 %\" }\n";
    t += "no_load_current = { nominal = \"" + Figure(kI0, "A") + "\", tolerance = \"20 %\" }\n";
    t += "motor_constant = { nominal = \"" + Figure(kK / std::sqrt(kR) * 1e3, "mN*m/sqrt(W)") +
         "\", tolerance = \"10 %\" }\n";
    t += "mechanical_time_constant = { nominal = \"" + Figure(kR * kJ / (kK * kK) * 1e3, "ms") +
         "\", tolerance = \"10 %\" }\n";
    t += "electrical_time_constant = { nominal = \"" + Figure(kL / kR * 1e3, "ms") + "\", tolerance = \"10 %\" }\n";
    t += "max_output_power = { nominal = \"" + Figure(std::pow(kV - kR * kI0, 2.0) / (4.0 * kR), "W") +
         "\", tolerance = \"10 %\" }\n";
    t += "peak_efficiency = { nominal = \"" + Figure(100.0 * efficiency, "%") + "\", tolerance = \"5 %\" }\n";
    return t;
  }
};

std::vector<RelationCheck> Checked(const Sheet& s) { return CheckSheet(ParseDatasheet(s.Toml(), "sheet.toml")); }

const RelationCheck* Relation(const std::vector<RelationCheck>& checks, const std::string& stated) {
  for (const RelationCheck& c : checks)
    if (c.lines.front() == stated) return &c;
  return nullptr;
}

TEST(SheetConsistency, ASheetBuiltFromOneMotorIsConsistent) {
  const std::vector<RelationCheck> checks = Checked(Sheet{});
  // Every relation of sheet_relations.h whose lines the sheet states.
  for (const char* stated : {"torque_constant", "stall_torque", "stall_current", "no_load_speed", "motor_constant",
                             "mechanical_time_constant", "electrical_time_constant", "max_output_power",
                             "peak_efficiency"}) {
    const RelationCheck* c = Relation(checks, stated);
    ASSERT_NE(c, nullptr) << stated;
    EXPECT_TRUE(c->consistent) << c->relation;
    EXPECT_NEAR(c->mismatch, 0.0, 1e-5) << c->relation;  // physics: the figures satisfy it (6 digits printed)
    EXPECT_LE(c->predicted_low, c->predicted) << c->relation;
    EXPECT_GE(c->predicted_high, c->predicted) << c->relation;
  }
  EXPECT_EQ(Relation(checks, "stall_torque")->relation, "stall_torque = Kt*V/R");
  EXPECT_EQ(Relation(checks, "no_load_speed")->relation, "no_load_speed = (V - R*I0)/Ke");
}

TEST(SheetConsistency, RangeOverTheToleranceBoxIsTheCornersOfAMonotonicRelation) {
  // physics: Kt·V/R is largest at the highest Kt and lowest R: 0.0285·1.05·12/(2.3·0.92)
  const std::vector<RelationCheck> checks = Checked(Sheet{});  // kept: c points into it
  const RelationCheck* c = Relation(checks, "stall_torque");
  ASSERT_NE(c, nullptr);
  EXPECT_NEAR(c->predicted_high, kK * 1.05 * kV / (kR * 0.92), 1e-12);
  EXPECT_NEAR(c->predicted_low, kK * 0.95 * kV / (kR * 1.08), 1e-12);
}

TEST(SheetConsistency, AUnitSlipIsNamedOnTheLineThatHasIt) {
  Sheet s;
  s.kt_text = Figure(kK * 1e3, "N*m/A");  // 28.5 printed in N·m/A where mN·m/A was meant
  const std::vector<RelationCheck> checks = Checked(s);
  for (const char* stated : {"torque_constant", "stall_torque", "motor_constant", "mechanical_time_constant"}) {
    const RelationCheck* c = Relation(checks, stated);
    ASSERT_NE(c, nullptr) << stated;
    EXPECT_FALSE(c->consistent) << c->relation;
    ASSERT_EQ(c->explained_by.size(), 1u) << c->relation;
    const Explanation& e = c->explained_by.front();
    EXPECT_EQ(e.line, "torque_constant");
    EXPECT_EQ(e.cause, Explanation::Cause::kUnitSlip);
    EXPECT_EQ(e.written_unit, "N*m/A");
    EXPECT_EQ(e.meant_unit, "mN*m/A");
    EXPECT_NEAR(e.printed_over_meant, 1e3, 1e-9);  // NIST SP 811 4.3: milli
  }
  EXPECT_NEAR(Relation(checks, "torque_constant")->mismatch, 999.0, 5e-3);  // 1000× too large (6 digits printed)
  EXPECT_TRUE(Relation(checks, "torque_constant")->explained_by.front().whole_sheet);
  EXPECT_TRUE(Relation(checks, "no_load_speed")->consistent);              // Kt plays no part in it
}

TEST(SheetConsistency, AWindingConventionIsNamedOnTheBackEmfConstant) {
  Sheet s;
  s.ke_written_si = kSqrt3 * kK;  // Ke quoted line-to-line in peak volts while Kt is per phase
  const std::vector<RelationCheck> checks = Checked(s);
  for (const char* stated : {"torque_constant", "no_load_speed", "mechanical_time_constant"}) {
    const RelationCheck* c = Relation(checks, stated);
    ASSERT_NE(c, nullptr) << stated;
    EXPECT_FALSE(c->consistent) << c->relation;
    ASSERT_EQ(c->explained_by.size(), 1u) << c->relation;
    const Explanation& e = c->explained_by.front();
    EXPECT_EQ(e.line, "back_emf_constant");
    EXPECT_EQ(e.cause, Explanation::Cause::kWindingConvention);
    EXPECT_NEAR(e.convention.kt_over_ke, 1.0 / kSqrt3, 1e-12);  // physics: Kt/Ke = k_ph/(√3·k_ph)
    EXPECT_NE(e.convention.explanation.find("line-to-line in peak volts"), std::string::npos);
    EXPECT_NEAR(e.printed_over_meant, kSqrt3, 1e-12);
    EXPECT_TRUE(e.whole_sheet);
  }
  EXPECT_TRUE(Relation(checks, "stall_torque")->consistent);
}

TEST(SheetConsistency, ANoLoadSpeedPrintedForAnotherVoltageIsNamed) {
  Sheet s;
  s.no_load_speed_at_V = 24.0;  // the 24 V version's figure on the 12 V sheet
  const std::vector<RelationCheck> checks = Checked(s);
  const RelationCheck* c = Relation(checks, "no_load_speed");
  ASSERT_NE(c, nullptr);
  EXPECT_FALSE(c->consistent);
  EXPECT_NEAR(c->mismatch, (24.0 - kR * kI0) / (kV - kR * kI0) - 1.0, 1e-5);  // physics
  ASSERT_EQ(c->explained_by.size(), 1u);
  EXPECT_EQ(c->explained_by[0].line, "no_load_speed");
  EXPECT_EQ(c->explained_by[0].cause, Explanation::Cause::kAnotherVoltage);
  EXPECT_EQ(c->explained_by[0].voltage_V, 24.0);
  EXPECT_TRUE(c->explained_by[0].whole_sheet);
  for (const RelationCheck& other : checks)
    if (&other != c) EXPECT_TRUE(other.consistent) << other.relation;
}

TEST(SheetConsistency, WithinTheTolerancesAConventionIsIndistinguishableFromANearbyError) {
  Sheet s;
  s.ke_written_si = 1.3 * kK;  // 30 % off, 6 % from √(3/2): the ± 5 % lines cannot tell them apart
  const std::vector<RelationCheck> checks = Checked(s);  // kept: c points into it
  const RelationCheck* c = Relation(checks, "torque_constant");
  ASSERT_NE(c, nullptr);
  EXPECT_FALSE(c->consistent);
  ASSERT_FALSE(c->explained_by.empty());
  EXPECT_EQ(c->explained_by.front().cause, Explanation::Cause::kWindingConvention);
  EXPECT_NEAR(c->explained_by.front().convention.kt_over_ke, std::sqrt(2.0 / 3.0), 1e-12);
}

TEST(SheetConsistency, AFaultNoKnownCauseGivesIsExplainedByNoOneLine) {
  // R printed 30 % high: no unit or decimal slip of R, and no other single line, mends the sheet.
  const std::string toml = Sheet{}.Toml();
  const std::string r = "resistance = { nominal = \"" + Figure(kR, "ohm") + "\"";
  std::string spoilt = toml;
  spoilt.replace(spoilt.find(r), r.size(), "resistance = { nominal = \"" + Figure(1.3 * kR, "ohm") + "\"");
  const std::vector<RelationCheck> checks = CheckSheet(ParseDatasheet(spoilt, "r.toml"));
  int inconsistent = 0;
  for (const RelationCheck& c : checks) {
    if (c.consistent) continue;
    ++inconsistent;
    for (const Explanation& e : c.explained_by) EXPECT_FALSE(e.whole_sheet) << c.relation << ": " << e.line;
  }
  EXPECT_GE(inconsistent, 3);
}

TEST(SheetConsistency, AnOpenBandCannotBoundARelation) {
  const Datasheet sheet = ParseDatasheet(R"([datasheet]
rated_voltage = "12 V"
[spec]
resistance = { max = "2.5 ohm" }
torque_constant = { nominal = "28.5 mN*m/A", tolerance = "5 %" }
stall_torque = { min = "0.12 N*m" }
)", "open.toml");
  EXPECT_TRUE(CheckSheet(sheet).empty());  // R has no lower limit: Kt·V/R is unbounded above
}

}  // namespace
}  // namespace coilspin::verify

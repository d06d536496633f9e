// One motor against a datasheet (src/verify/motor_check.h), on motors whose
// truth is known: simulated benches (tests/free_shaft/free_shaft_bench.h, the
// forward model checked against SciPy in tests/model) fitted by the joint fit,
// and datasheets built around the truth or around the fit's own interval.
// Derived lines are re-evaluated at the sheet's rated voltage by the delta
// method the fit uses (src/result/derived_intervals.h): at the fit's own
// voltage they must equal the fit's derived entries exactly.

#include "src/verify/motor_check.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

#include "free_shaft/free_shaft_bench.h"
#include "src/model/derived_quantities.h"
#include "src/result/derived_intervals.h"

namespace coilspin::verify {
namespace {

constexpr double kInfinity = std::numeric_limits<double>::infinity();
constexpr double kTopVoltage = 12.0;

// The truth (invented; an ideal machine, Kt = Ke in SI).
const model::MotorParameters& Truth() {
  static const model::MotorParameters m = testing::IdealMotor(2.0, 1.5e-3, 0.03, 2e-5, 2e-5, 3e-3, 0.5);
  return m;
}

MotorEstimate Fit(bool spin_down, std::optional<double> reference_temperature_degC = std::nullopt,
                  std::optional<double> known_inertia = std::nullopt) {
  testing::BenchOptions o;
  o.spin_down = spin_down;
  joint::MotorFitOptions options;
  options.at_voltage_V = kTopVoltage;
  options.known_inertia_kg_m2 = known_inertia;
  if (reference_temperature_degC) {
    options.locked_rotor.winding_temperature_degC = 25.0;  // the simulation's winding temperature
    options.locked_rotor.reference_temperature_degC = reference_temperature_degC;
  }
  return joint::FitMotor(testing::SimulateBench(Truth(), kTopVoltage, o), options);
}

const MotorEstimate& FullBench() {
  static const MotorEstimate e = Fit(true);
  return e;
}

SpecLine Line(const char* key, double low, double high, std::optional<double> nominal = std::nullopt) {
  SpecLine line;
  line.spec = FindSpecKey(key);
  EXPECT_NE(line.spec, nullptr) << key;
  line.key = key;
  line.band = {low, high};
  line.nominal = nominal;
  return line;
}

Datasheet Sheet(std::vector<SpecLine> lines, double rated_V = kTopVoltage) {
  Datasheet sheet;
  sheet.file = "sheet.toml";
  sheet.rated_voltage_V = rated_V;
  sheet.lines = std::move(lines);
  return sheet;
}

const LineCheck& Only(const MotorCheck& m) {
  EXPECT_EQ(m.lines.size(), 1u);
  return m.lines.front();
}

LineCheck CheckOne(const SpecLine& line, const MotorEstimate& e = FullBench(), double rated_V = kTopVoltage) {
  return Only(CheckMotor(Sheet({line}, rated_V), e, "m.json"));
}

TEST(MotorCheck, TruthInsideTheBandsPasses) {
  const model::MotorParameters& t = Truth();
  std::vector<SpecLine> lines = {
      Line("resistance", 0.95 * t.resistance_ohm, 1.05 * t.resistance_ohm),
      Line("back_emf_constant", 0.95 * 0.03, 1.05 * 0.03),
      Line("torque_constant", 0.95 * 0.03, 1.05 * 0.03),
      Line("inertia", 0.9 * t.inertia_kg_m2, 1.1 * t.inertia_kg_m2),
      // Kv = 1/Ke in SI: 33.33 rad/(s·V) = 318.3 rpm/V
      Line("speed_constant", 0.95 / 0.03, 1.05 / 0.03),
      // stall torque Kt·(V − Vb)/R at 12 V (physics)
      Line("stall_torque", 0.9 * 0.03 * 11.5 / 2.0, 1.1 * 0.03 * 11.5 / 2.0),
  };
  const MotorCheck m = CheckMotor(Sheet(lines), FullBench(), "m.json");
  for (const LineCheck& c : m.lines) {
    EXPECT_EQ(c.decision.verdict, Verdict::kPass) << c.key;
    ASSERT_TRUE(c.value.has_value()) << c.key;
    EXPECT_LE(c.ci_low, *c.value);
    EXPECT_GE(c.ci_high, *c.value);
    EXPECT_FALSE(c.tests.empty()) << c.key;
  }
  EXPECT_EQ(m.Worst(), Verdict::kPass);
  EXPECT_TRUE(AllPass({m}));
  EXPECT_TRUE(m.lines[2].rests_on_kt_equal_to_ke);  // no torque column: Kt taken equal to Ke
}

TEST(MotorCheck, ABandThatExcludesTheTruthFails) {
  const double r = Truth().resistance_ohm;
  const LineCheck c = CheckOne(Line("resistance", 1.3 * r, 1.5 * r));
  EXPECT_EQ(c.decision.verdict, Verdict::kFail);
  EXPECT_FALSE(AllPass({CheckMotor(Sheet({Line("resistance", 1.3 * r, 1.5 * r)}), FullBench(), "m.json")}));
}

TEST(MotorCheck, AnIntervalStraddlingAnEdgeIsInconclusiveAndSaysHowMuchNarrower) {
  const QuantityEstimate* r = FullBench().Find("resistance");
  ASSERT_NE(r, nullptr);
  const double half = r->ci_high - r->value;
  // The lower edge halfway between the value and the interval's lower end.
  const LineCheck c = CheckOne(Line("resistance", r->value - 0.5 * half, kInfinity));
  EXPECT_EQ(c.decision.verdict, Verdict::kInconclusive);
  EXPECT_EQ(c.decision.would_be, Verdict::kPass);
  EXPECT_NEAR(c.decision.narrowing_needed, 0.5, 1e-9);
  // The same edge beyond the value: the value points to a fail.
  const LineCheck beyond = CheckOne(Line("resistance", r->value + 0.5 * half, kInfinity));
  EXPECT_EQ(beyond.decision.verdict, Verdict::kInconclusive);
  EXPECT_EQ(beyond.decision.would_be, Verdict::kFail);
}

TEST(MotorCheck, OneSidedAndAsymmetricBands) {
  const double torque = 0.03 * 11.5 / 2.0;  // physics: Kt·(V − Vb)/R of the truth at 12 V
  EXPECT_EQ(CheckOne(Line("stall_torque", 0.8 * torque, kInfinity)).decision.verdict, Verdict::kPass);
  EXPECT_EQ(CheckOne(Line("stall_torque", -kInfinity, 0.8 * torque)).decision.verdict, Verdict::kFail);
  EXPECT_EQ(CheckOne(Line("stall_torque", 1.2 * torque, kInfinity)).decision.verdict, Verdict::kFail);
  // no-load speed −10 % +5 % around the fit's own value: passes; shifted up by 12 % it fails.
  const double speed = model::NoLoadSpeed(result::ValuesOf(FullBench()), kTopVoltage);
  EXPECT_EQ(CheckOne(Line("no_load_speed", 0.9 * speed, 1.05 * speed)).decision.verdict, Verdict::kPass);
  EXPECT_EQ(CheckOne(Line("no_load_speed", 1.12 * 0.9 * speed, 1.12 * 1.05 * speed)).decision.verdict,
            Verdict::kFail);
}

TEST(MotorCheck, DerivedLinesAtTheFitsVoltageAreTheFitsDerivedEntries) {
  for (const char* key : {"stall_torque", "no_load_speed", "no_load_current", "max_output_power",
                          "mechanical_time_constant", "motor_constant"}) {
    const LineCheck c = CheckOne(Line(key, -kInfinity, kInfinity));
    const QuantityEstimate* d = nullptr;
    for (const QuantityEstimate& q : FullBench().derived)
      if (q.key == key) d = &q;
    ASSERT_NE(d, nullptr) << key;
    ASSERT_TRUE(c.value.has_value()) << key;
    EXPECT_EQ(*c.value, d->value) << key;  // the same delta method on the same covariance
    EXPECT_EQ(c.ci_low, d->ci_low) << key;
    EXPECT_EQ(c.ci_high, d->ci_high) << key;
  }
  // The speed constant is compared in SI: 1/Ke rad/(s·V), the result's speed_constant_si.
  const LineCheck kv = CheckOne(Line("speed_constant", -kInfinity, kInfinity));
  EXPECT_NEAR(*kv.value, 1.0 / FullBench().Find("back_emf_constant")->value, 1e-12);
  EXPECT_EQ(kv.unit, "rad/(s*V)");
}

TEST(MotorCheck, DerivedLinesFollowTheRatedVoltage) {
  // physics: at 6 V the no-load speed is the model's at 6 V, not the fit's at 12 V.
  const LineCheck c = CheckOne(Line("no_load_speed", -kInfinity, kInfinity), FullBench(), 6.0);
  EXPECT_NEAR(*c.value, model::NoLoadSpeed(result::ValuesOf(FullBench()), 6.0), 1e-9);
  EXPECT_EQ(*c.at_voltage_V, 6.0);
  const double truth_6V = (0.03 * 5.5 / 2.0 - 3e-3) / (0.03 * 0.03 / 2.0 + 2e-5);  // docs/methods.md §6
  EXPECT_LE(c.ci_low, truth_6V);
  EXPECT_GE(c.ci_high, truth_6V);
}

TEST(MotorCheck, WhatTheLogsDoNotDetermineIsNotTestedWithTheReason) {
  static const MotorEstimate no_coast = Fit(false);  // locked-rotor and no-load only
  const MotorCheck m = CheckMotor(
      Sheet({Line("inertia", 1e-5, 3e-5), Line("mechanical_time_constant", 0.01, 0.1), Line("inductance", 1e-3, 2e-3)}),
      no_coast, "m.json");
  for (const LineCheck& c : m.lines) {
    EXPECT_EQ(c.decision.verdict, Verdict::kNotTested) << c.key;
    EXPECT_EQ(c.not_tested, LineCheck::NotTested::kNotDetermined) << c.key;
    ASSERT_FALSE(c.missing.empty()) << c.key;
    EXPECT_FALSE(c.value.has_value());
  }
  EXPECT_EQ(m.lines[0].missing.front().first, "inertia");
  EXPECT_NE(m.lines[0].missing.front().second.find("spin-down"), std::string::npos) << m.lines[0].missing.front().second;
  EXPECT_EQ(m.lines[1].missing.front().first, "inertia");  // τm = R·J/(Kt·Ke) needs J
  EXPECT_EQ(m.Worst(), Verdict::kNotTested);
  EXPECT_FALSE(AllPass({m}));
}

TEST(MotorCheck, AGivenValueIsNotTested) {
  static const MotorEstimate given = Fit(true, std::nullopt, 2e-5);
  const LineCheck c = CheckOne(Line("inertia", 1e-5, 3e-5), given);
  EXPECT_EQ(c.decision.verdict, Verdict::kNotTested);
  EXPECT_EQ(c.not_tested, LineCheck::NotTested::kGiven);
}

TEST(MotorCheck, ResistanceIsCarriedToTheSheetsTemperature) {
  static const MotorEstimate at_25 = Fit(false, 25.0);
  const QuantityEstimate* r = at_25.Find("resistance");
  ASSERT_NE(r, nullptr);
  ASSERT_TRUE(r->at_temperature_degC.has_value());
  Datasheet sheet = Sheet({Line("resistance", -kInfinity, kInfinity), Line("stall_current", -kInfinity, kInfinity)});
  sheet.reference_temperature_degC = 75.0;
  const MotorCheck m = CheckMotor(sheet, at_25, "m.json");
  // IEC 60028 copper: R(75) = R(25)·(234.5 + 75)/(234.5 + 25)
  const double factor = (234.5 + 75.0) / (234.5 + 25.0);
  EXPECT_NEAR(*m.lines[0].value, r->value * factor, 1e-12);
  EXPECT_NEAR(m.lines[0].ci_high - m.lines[0].ci_low, (r->ci_high - r->ci_low) * factor, 1e-12);
  EXPECT_EQ(*m.lines[0].at_temperature_degC, 75.0);
  // The stall current follows: (V − Vb)/R with the carried R (physics).
  const model::ParameterValues v = result::ValuesOf(at_25);
  EXPECT_NEAR(*m.lines[1].value, (kTopVoltage - v.at("brush_drop")) / (r->value * factor), 1e-9);
  // Without a temperature in the result, R is compared as fitted and that is said.
  Datasheet no_temperature_result = sheet;
  const LineCheck unknown = CheckOne(Line("resistance", -kInfinity, kInfinity));
  EXPECT_FALSE(unknown.temperature_unknown);  // the sheet states none
  const MotorCheck flagged = CheckMotor(no_temperature_result, FullBench(), "m.json");
  EXPECT_TRUE(flagged.lines[0].temperature_unknown);
  EXPECT_EQ(*flagged.lines[0].value, FullBench().Find("resistance")->value);
}

}  // namespace
}  // namespace coilspin::verify

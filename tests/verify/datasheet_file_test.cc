// The datasheet file (src/verify/datasheet_file.h): bands from each way a
// sheet states a tolerance, figures in datasheet units converted to SI (NIST
// SP 811 factors, typed in from its Appendix B), and every bad sheet of issue
// 13 refused with the file, line and key.

#include "src/verify/datasheet_file.h"

#include <gtest/gtest.h>

#include <cmath>
#include <string>

#include "src/ingest/input_error.h"

namespace coilspin::verify {
namespace {

const double kPiFromCosine = std::acos(-1.0);  // physics (definition: cos π = −1)
constexpr double kOunceForceInch_N_m = 7.061552e-3;  // NIST SP 811 Appendix B (ozf·in)

const char* const kContractSheet = R"([datasheet]
label = "supplier X, type 12-40"
rated_voltage = "12 V"
[spec]
resistance       = { nominal = "2.3 ohm", tolerance = "8 %" }
torque_constant  = { nominal = "28.5 mN*m/A", tolerance = "5 %" }
no_load_speed    = { nominal = "4000 rpm", minus = "10 %", plus = "5 %" }
stall_torque     = { min = "0.12 N*m" }
inertia          = { nominal = "12 g*cm^2", tolerance = "0.2 g*cm^2" }
)";

TEST(DatasheetFile, TheInterfaceContractsExample) {
  const Datasheet sheet = ParseDatasheet(kContractSheet, "sheet.toml");
  EXPECT_EQ(sheet.label, "supplier X, type 12-40");
  EXPECT_EQ(sheet.rated_voltage_V, 12.0);
  EXPECT_FALSE(sheet.reference_temperature_degC.has_value());
  ASSERT_EQ(sheet.lines.size(), 5u);
  // The file's order, not the TOML table's sorted order.
  EXPECT_EQ(sheet.lines[0].key, "resistance");
  EXPECT_EQ(sheet.lines[4].key, "inertia");
  EXPECT_EQ(sheet.lines[0].line, 5);
  // 2.3 ohm ± 8 % (the contract's band [2.116, 2.484])
  EXPECT_NEAR(sheet.lines[0].band.low, 2.116, 1e-12);
  EXPECT_NEAR(sheet.lines[0].band.high, 2.484, 1e-12);
  // 28.5 mN·m/A ± 5 % (NIST SP 811 4.3: milli)
  EXPECT_NEAR(*sheet.Find("torque_constant")->nominal, 0.0285, 1e-15);
  EXPECT_NEAR(sheet.Find("torque_constant")->band.high, 0.029925, 1e-12);
  EXPECT_EQ(sheet.Find("torque_constant")->unit, "mN*m/A");
  // 4000 rpm −10 % +5 % (physics: rpm = 2π/60 rad/s)
  const double rpm = 2.0 * kPiFromCosine / 60.0;
  EXPECT_NEAR(sheet.Find("no_load_speed")->band.low, 3600.0 * rpm, 1e-9);
  EXPECT_NEAR(sheet.Find("no_load_speed")->band.high, 4200.0 * rpm, 1e-9);
  // min only: open above
  EXPECT_EQ(sheet.Find("stall_torque")->band.low, 0.12);
  EXPECT_FALSE(sheet.Find("stall_torque")->band.HasHigh());
  EXPECT_FALSE(sheet.Find("stall_torque")->nominal.has_value());
  // 12 g·cm² ± 0.2 g·cm² (NIST SP 811 4.3: g = 1e-3 kg, cm = 1e-2 m)
  EXPECT_NEAR(sheet.Find("inertia")->band.low, 11.8e-7, 1e-18);
  EXPECT_NEAR(sheet.Find("inertia")->band.high, 12.2e-7, 1e-18);
}

TEST(DatasheetFile, DatasheetSpellingsAndTemperature) {
  const Datasheet sheet = ParseDatasheet(R"([datasheet]
rated_voltage = "24 V"
reference_temperature = "298.15 K"
[spec]
torque_constant = { nominal = "4.0 oz-in/A", tolerance = "10 %" }
speed_constant = { nominal = "340 rpm/V", minus = "5 %", plus = "0 %" }
peak_efficiency = { min = 0.7 }
stall_torque = { nominal = "3.5 kgf·cm", max = "4 kgf·cm" }
)", "us.toml");
  EXPECT_NEAR(*sheet.reference_temperature_degC, 25.0, 1e-12);  // NIST SP 811 4.2.1.1: t = T − 273.15
  EXPECT_NEAR(*sheet.Find("torque_constant")->nominal, 4.0 * kOunceForceInch_N_m, 1e-15);
  EXPECT_NEAR(sheet.Find("speed_constant")->band.high, 340.0 * 2.0 * kPiFromCosine / 60.0, 1e-12);
  EXPECT_EQ(sheet.Find("peak_efficiency")->band.low, 0.7);  // a dimensionless line may be a bare number
  EXPECT_NEAR(*sheet.Find("stall_torque")->nominal, 3.5 * 9.80665e-2, 1e-15);  // NIST SP 811 App. B: kgf
  EXPECT_FALSE(sheet.Find("stall_torque")->band.HasLow());
}

// The error's file, line and message; fails the test when there is none.
InputError ErrorOf(const std::string& spec_lines) {
  try {
    ParseDatasheet("[datasheet]\nrated_voltage = \"12 V\"\n[spec]\n" + spec_lines, "bad.toml");
  } catch (const InputError& e) {
    return e;
  }
  ADD_FAILURE() << "accepted: " << spec_lines;
  return InputError(InputErrorKind::kBadDatasheet, "", 0, 0, "");
}

void ExpectRefused(const std::string& spec_lines, long line, const std::string& key, const std::string& says) {
  const InputError e = ErrorOf(spec_lines);
  EXPECT_EQ(e.kind(), InputErrorKind::kBadDatasheet);
  EXPECT_EQ(e.file(), "bad.toml");
  EXPECT_EQ(e.line(), line) << e.what();
  EXPECT_NE(e.message().find("'" + key + "'"), std::string::npos) << e.what();
  EXPECT_NE(e.message().find(says), std::string::npos) << e.what();
}

TEST(DatasheetFile, BadSheetsOfIssue13NameFileLineAndKey) {
  // unknown key
  ExpectRefused("resistance = { nominal = \"2 ohm\", tolerance = \"5 %\" }\nrotor_colour = { nominal = \"1\" }\n", 5,
                "spec.rotor_colour", "not a line coilspin can verify");
  // unit of the wrong dimension
  ExpectRefused("resistance = { nominal = \"2.3 mH\", tolerance = \"8 %\" }\n", 4, "spec.resistance.nominal",
                "'mH' is a unit of inductance, not of resistance");
  // missing nominal
  ExpectRefused("resistance = { tolerance = \"8 %\" }\n", 4, "spec.resistance", "missing nominal");
  ExpectRefused("resistance = { }\n", 4, "spec.resistance", "missing nominal");
  // negative tolerance
  ExpectRefused("resistance = { nominal = \"2.3 ohm\", tolerance = \"-8 %\" }\n", 4, "spec.resistance.tolerance",
                "must not be negative");
  ExpectRefused("no_load_speed = { nominal = \"4000 rpm\", minus = \"-10 %\", plus = \"5 %\" }\n", 4,
                "spec.no_load_speed.minus", "must not be negative");
}

TEST(DatasheetFile, OtherMistakesAreRefusedToo) {
  ExpectRefused("resistance = { nominal = \"2.3\", tolerance = \"8 %\" }\n", 4, "spec.resistance.nominal", "no unit");
  ExpectRefused("resistance = { nominal = \"2.3 furlong\", tolerance = \"8 %\" }\n", 4, "spec.resistance.nominal",
                "unknown unit 'furlong'");
  ExpectRefused("resistance = { nominal = \"2.3 ohm\" }\n", 4, "spec.resistance", "a nominal alone");
  ExpectRefused("resistance = { nominal = \"2.3 ohm\", tolerance = \"8 %\", plus = \"1 %\" }\n", 4, "spec.resistance",
                "not both");
  ExpectRefused("stall_torque = { min = \"0.2 N*m\", max = \"0.1 N*m\" }\n", 4, "spec.stall_torque", "empty");
  ExpectRefused("resistance = { nominal = \"2.3 ohm\", tolerance = \"8 %\", typical = \"2 ohm\" }\n", 4,
                "spec.resistance.typical", "unknown key");
  ExpectRefused("resistance = \"2.3 ohm\"\n", 4, "spec.resistance", "expected a table");
  ExpectRefused("resistance = { nominal = 2.3, tolerance = \"8 %\" }\n", 4, "spec.resistance.nominal",
                "expected a string");
}

TEST(DatasheetFile, TheHeadIsChecked) {
  const auto refused = [](const std::string& text, const std::string& says) {
    try {
      ParseDatasheet(text, "head.toml");
      ADD_FAILURE() << "accepted: " << text;
    } catch (const InputError& e) {
      EXPECT_EQ(e.kind(), InputErrorKind::kBadDatasheet);
      EXPECT_NE(e.message().find(says), std::string::npos) << e.what();
    }
  };
  const std::string spec = "[spec]\nresistance = { nominal = \"2 ohm\", tolerance = \"5 %\" }\n";
  refused(spec, "'datasheet': missing");
  refused("[datasheet]\nlabel = \"x\"\n" + spec, "'datasheet.rated_voltage': missing");
  refused("[datasheet]\nrated_voltage = \"12 rpm\"\n" + spec, "not of voltage");
  refused("[datasheet]\nrated_voltage = \"-12 V\"\n" + spec, "must be positive");
  refused("[datasheet]\nrated_voltage = \"12 V\"\nvoltage = 3\n" + spec, "'datasheet.voltage': unknown key");
  refused("[datasheet]\nrated_voltage = \"12 V\"\n", "'spec': missing");
  refused("[datasheet]\nrated_voltage = \"12 V\"\nreference_temperature = \"-300 degC\"\n" + spec, "copper");
  refused("[datasheet\n", "");  // not TOML: the parser's message, with the line
}

TEST(DatasheetFile, AMissingFileCannotBeOpened) {
  try {
    LoadDatasheet("/nonexistent/sheet.toml");
    ADD_FAILURE();
  } catch (const InputError& e) {
    EXPECT_EQ(e.kind(), InputErrorKind::kCannotOpen);
  }
}

}  // namespace
}  // namespace coilspin::verify

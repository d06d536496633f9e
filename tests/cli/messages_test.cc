// End-to-end: inputs that used to get a misleading answer now get a message
// that says what is wrong and what to do (issue 10, "Messages"), each with exit
// status 2 and, where there is a file, its name (and line and column).

#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

// A locked-rotor log of two plateaus, 24 rows, lines joined by `line_end`.
std::string PlateauLog(const std::string& line_end, const std::string& temperature_header = "") {
  std::string text = "time [s],voltage [V],current [A]" + (temperature_header.empty() ? "" : "," + temperature_header) +
                     line_end;
  for (int k = 0; k < 24; ++k) {
    const double volts = k < 12 ? 2.0 : 4.0;
    text += std::to_string(k * 0.001) + "," + std::to_string(volts) + "," +
            std::to_string(volts / 2.2 + 0.001 * (k % 3)) + (temperature_header.empty() ? "" : ",23") + line_end;
  }
  return text;
}

class Messages : public ::testing::Test {
 protected:
  Messages() : folder_("messages") {}
  const std::filesystem::path& dir() const { return folder_.path(); }
  ScratchFolder folder_;
};

TEST_F(Messages, ALogGivenWhereTheSessionFileGoesIsNamedAsSuch) {
  folder_.Write("log.csv", PlateauLog("\n"));
  const RunResult r = RunCoilspin("fit log.csv", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("log.csv: this looks like a bench log (CSV), not a session file (TOML)"), std::string::npos)
      << r.err;
  EXPECT_NE(r.err.find("--locked-rotor log.csv"), std::string::npos) << r.err;
}

TEST_F(Messages, AMisspeltOptionIsNamedWithTheNearestOne) {
  folder_.Write("log.csv", PlateauLog("\n"));
  const RunResult r = RunCoilspin("fit --locked-rotor log.csv --colum voltage=U_mot", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("unknown option --colum for coilspin fit (did you mean --column?)"), std::string::npos)
      << r.err;
  EXPECT_EQ(r.err.find("File does not exist"), std::string::npos) << r.err;
  const RunResult far = RunCoilspin("simulate locked-rotor --out x.csv --resistance 1 --inductance 1 --banana 3", dir());
  EXPECT_EQ(far.status, 2);
  EXPECT_NE(far.err.find("unknown option --banana for coilspin simulate; coilspin simulate --help lists its options"),
            std::string::npos)
      << far.err;
}

TEST_F(Messages, ANegativeResistanceGetsAShortMessage) {
  const RunResult r = RunCoilspin("simulate locked-rotor --out x.csv --resistance -3.1 --inductance 1e-3", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("--resistance: must be a positive number, got '-3.1'"), std::string::npos) << r.err;
  EXPECT_LT(r.err.size(), 200u) << r.err;  // CLI11's own check printed DBL_MAX in 309 digits
  const RunResult nan = RunCoilspin("simulate locked-rotor --out x.csv --resistance nan --inductance 1e-3", dir());
  EXPECT_EQ(nan.status, 2);
  EXPECT_NE(nan.err.find("--resistance: must be a positive number, got 'nan'"), std::string::npos) << nan.err;
  const RunResult cold = RunCoilspin("fit --locked-rotor x.csv --winding-temperature -300", dir());
  EXPECT_EQ(cold.status, 2);
  EXPECT_NE(cold.err.find("--winding-temperature: must be a temperature in degC above -234.5"), std::string::npos)
      << cold.err;
}

TEST_F(Messages, ASpeedConstantWhoseBackEmfConstantOverflowsIsBadInput) {
  // Ke = 1/Kv = 60/(2π·1e-308) V*s/rad is beyond the largest double (physics; IEEE 754 range).
  const RunResult r = RunCoilspin("consistency --kt '1 N*m/A' --kv '1e-308 rpm/V'", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("--kv '1e-308 rpm/V' is too small: Ke = 1/Kv in V*s/rad is beyond the range of a double"),
            std::string::npos)
      << r.err;
  EXPECT_EQ(r.out, "");
  const RunResult ratio = RunCoilspin("consistency --kt '1e300 N*m/A' --ke '1e-300 V*s/rad'", dir());
  EXPECT_EQ(ratio.status, 2);
  EXPECT_NE(ratio.err.find("Kt/Ke of '1e300 N*m/A' and '1e-300 V*s/rad' is beyond the range of a double"),
            std::string::npos)
      << ratio.err;
}

TEST_F(Messages, CarriageReturnLineEndsAreLineEnds) {
  // Classic Mac OS ends lines with CR alone; the log reads as the LF one does.
  folder_.Write("cr.csv", PlateauLog("\r"));
  folder_.Write("lf.csv", PlateauLog("\n"));
  const RunResult cr = RunCoilspin("fit --locked-rotor cr.csv --json cr.json --quiet", dir());
  ASSERT_EQ(cr.status, 0) << cr.err;
  ASSERT_EQ(RunCoilspin("fit --locked-rotor lf.csv --json lf.json --quiet", dir()).status, 0);
  const auto a = nlohmann::json::parse(Slurp(dir() / "cr.json"));
  const auto b = nlohmann::json::parse(Slurp(dir() / "lf.json"));
  EXPECT_EQ(a["parameters"], b["parameters"]);
  EXPECT_EQ(a["tests"][0]["samples"], 24);
  // Lines are counted as such: a bad cell on the 3rd line is reported there.
  folder_.Write("cr_bad.csv", "time [s],voltage [V],current [A]\r0,1,2\r0.001,x,2\r");
  const RunResult bad = RunCoilspin("fit --locked-rotor cr_bad.csv", dir());
  EXPECT_EQ(bad.status, 2);
  EXPECT_NE(bad.err.find("cr_bad.csv:3:2: cell 'x'"), std::string::npos) << bad.err;
}

TEST_F(Messages, AWindows1252DegreeSignIsDegreesCelsius) {
  // 0xB0 is '°' in Windows-1252 and ISO 8859-1 (docs/file-formats.md, "Text").
  folder_.Write("latin1.csv", PlateauLog("\n", "temperature [\xb0" "C]"));
  const RunResult r = RunCoilspin("fit --locked-rotor latin1.csv --json t.json --quiet", dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(Slurp(dir() / "t.json"));
  EXPECT_EQ(j["parameters"]["resistance"]["at_temperature_degC"], 23.0);
  // A byte that is no unit in either encoding is named, with the encoding.
  folder_.Write("bad.csv", PlateauLog("\n", "temperature [\xb1" "C]"));
  const RunResult bad = RunCoilspin("fit --locked-rotor bad.csv", dir());
  EXPECT_EQ(bad.status, 2);
  EXPECT_NE(bad.err.find("bad.csv:1:4: unknown unit"), std::string::npos) << bad.err;
  EXPECT_NE(bad.err.find("it holds byte 0xB1, which is not UTF-8"), std::string::npos) << bad.err;
}

TEST_F(Messages, ProgressGoesToStderrAndNeverToStdout) {
  folder_.Write("log.csv", PlateauLog("\n"));
  const RunResult table = RunCoilspin("fit --locked-rotor log.csv", dir());
  ASSERT_EQ(table.status, 0) << table.err;
  EXPECT_EQ(table.out.find("coilspin: "), std::string::npos) << table.out;
  const RunResult quiet = RunCoilspin("fit --locked-rotor log.csv --quiet --json q.json", dir());
  ASSERT_EQ(quiet.status, 0) << quiet.err;
  EXPECT_EQ(quiet.err, "");
  EXPECT_EQ(quiet.out, "");
}

}  // namespace
}  // namespace coilspin::testing

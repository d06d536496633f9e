// End to end: `coilspin verify`, `coilspin fit --datasheet` and
// `coilspin fit SESSION... --out-dir DIR` as a buyer runs them, on the demo's
// invented lot (datasets-demo/lot: six motors made by `coilspin simulate`,
// one with a weak magnet) and on a lot of ten motors simulated here. Exit
// statuses from the interface contract (0 every line passes, 1 a line fails,
// is inconclusive or is not tested, 2 bad input); every result and
// verification file written is checked against its schema
// (tests/tools/validate_result.py).

#include <gtest/gtest.h>

#include <cstdio>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

namespace fs = std::filesystem;

const std::string kLot = std::string(COILSPIN_DEMO_DIR) + "/lot";
const std::string kSheetRevA = std::string(COILSPIN_DEMO_DIR) + "/datasheet.toml";
const std::string kSheetRevB = kLot + "/datasheet.toml";

std::string Quoted(const std::string& path) { return "'" + path + "'"; }

std::string LotSessions() {
  std::string sessions;
  for (int serial = 101; serial <= 106; ++serial) sessions += " " + Quoted(kLot + "/motor-0" + std::to_string(serial) + ".toml");
  return sessions;
}

void ExpectValidVerification(const fs::path& path) {
  const std::string command = std::string(COILSPIN_PYTHON) + " '" + COILSPIN_TEST_SOURCE_DIR +
                              "/tools/validate_result.py' '" + COILSPIN_TEST_SOURCE_DIR +
                              "/../docs/verification-format-1.schema.json' '" + path.string() + "' 2>&1";
  std::string report;
  FILE* pipe = popen(command.c_str(), "r");
  ASSERT_NE(pipe, nullptr);
  char buffer[4096];
  while (std::fgets(buffer, sizeof buffer, pipe)) report += buffer;
  EXPECT_EQ(pclose(pipe), 0) << report;
}

// The demo lot fitted once per test binary run into `folder`.
void FitDemoLot(const ScratchFolder& folder) {
  const RunResult r = RunCoilspin("fit" + LotSessions() + " --out-dir results", folder.path());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.err.find("6 motors on"), std::string::npos) << r.err;  // progress on stderr
  EXPECT_NE(r.err.find("[6/6]"), std::string::npos) << r.err;
  for (int serial = 101; serial <= 106; ++serial) {
    const fs::path result = folder.path() / "results" / ("motor-0" + std::to_string(serial) + ".json");
    ASSERT_TRUE(fs::exists(result)) << result;
    ExpectValidResultFile(result);
  }
}

TEST(VerifyCommand, TheDemoLotAgainstTheCorrectedSheet) {
  ScratchFolder folder("verify_lot");
  FitDemoLot(folder);
  const RunResult r = RunCoilspin("verify --datasheet " + Quoted(kSheetRevB) +
                                      " results/*.json --json lot.json --csv lot.csv",
                                  folder.path());
  EXPECT_EQ(r.status, 1) << r.err;  // the weak magnet fails
  EXPECT_NE(r.out.find("5 of 6 pass every line"), std::string::npos) << r.out;
  EXPECT_NE(r.err.find("motor-0104.json: datasheet line torque_constant: fail"), std::string::npos) << r.err;
  ExpectValidVerification(folder.path() / "lot.json");
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "lot.json"));
  EXPECT_EQ(j["format"], "coilspin.verification/1");
  EXPECT_EQ(j["datasheet"]["rated_voltage"], 6.0);
  EXPECT_EQ(j["motors"].size(), 6u);
  EXPECT_EQ(j["lot"]["motors"], 6);
  EXPECT_EQ(j["lot"]["motors_passing"], 5);
  for (const auto& m : j["motors"]) {
    const bool weak = m["result"].get<std::string>().find("motor-0104") != std::string::npos;
    EXPECT_EQ(m["verdict"], weak ? "fail" : "pass") << m["result"];
    // invented truth (make-lot-logs.sh): Ke 0.0181 against 21 mN·m/A ± 5 %
    EXPECT_EQ(m["lines"]["torque_constant"]["verdict"], weak ? "fail" : "pass") << m["result"];
  }
  for (const char* line : {"torque_constant", "speed_constant", "no_load_speed", "stall_torque"}) {
    const auto& outliers = j["lot"]["lines"][line]["outliers"];
    ASSERT_EQ(outliers.size(), 1u) << line;
    EXPECT_NE(outliers[0].get<std::string>().find("motor-0104"), std::string::npos) << line;
    EXPECT_EQ(j["lot"]["lines"][line]["fail"], 1) << line;
  }
  EXPECT_TRUE(j["lot"]["lines"]["resistance"]["outliers"].empty());
  // CSV: the comment lines, a header, one row per motor and line.
  const std::string csv = Slurp(folder.path() / "lot.csv");
  std::size_t rows = 0;
  for (char c : csv) rows += c == '\n';
  EXPECT_EQ(rows, 2u + 1u + 6u * j["motors"][0]["lines"].size());
  EXPECT_NE(csv.find("result,label,confidence,line,unit,band_low,band_high,value,ci_low,ci_high,verdict,robust_z,note"),
            std::string::npos);
}

TEST(VerifyCommand, OneGoodMotorPassesEveryLineAndExitsZero) {
  ScratchFolder folder("verify_one");
  const RunResult fit = RunCoilspin("fit " + Quoted(kLot + "/motor-0101.toml") + " --quiet --json m.json", folder.path());
  ASSERT_EQ(fit.status, 0) << fit.err;
  const RunResult r = RunCoilspin("verify --datasheet " + Quoted(kSheetRevB) + " m.json --json v.json", folder.path());
  EXPECT_EQ(r.status, 0) << r.out << r.err;
  EXPECT_NE(r.out.find("verification of DR-2 serial 0101"), std::string::npos) << r.out;
  ExpectValidVerification(folder.path() / "v.json");
}

TEST(VerifyCommand, FitWithTheDatasheetNamesTheLinePrintedForAnotherVoltage) {
  ScratchFolder folder("fit_datasheet");
  const RunResult r = RunCoilspin(
      "fit " + Quoted(kLot + "/motor-0101.toml") + " --datasheet " + Quoted(kSheetRevA) + " --json m.json", folder.path());
  EXPECT_EQ(r.status, 1) << r.err;  // rev. A's no-load speed is the 12 V figure
  EXPECT_NE(r.err.find("datasheet line no_load_speed: fail"), std::string::npos) << r.err;
  EXPECT_NE(r.out.find("INCONSISTENT  no_load_speed"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("no_load_speed fits a rated voltage of 12 V, not the sheet's 6 V"), std::string::npos) << r.out;
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "m.json"));  // schema-checked by RunCoilspin
  ASSERT_TRUE(j.contains("verification"));
  EXPECT_EQ(j["verification"]["verdict"], "fail");
  EXPECT_EQ(j["verification"]["lines"]["no_load_speed"]["verdict"], "fail");
  EXPECT_EQ(j["verification"]["lines"]["resistance"]["verdict"], "pass");
  bool named = false;
  for (const auto& c : j["verification"]["datasheet_consistency"])
    for (const auto& e : c["explained_by"])
      named = named || (e["line"] == "no_load_speed" && e["cause"] == "another-voltage" && e["at_voltage"] == 12.0);
  EXPECT_TRUE(named);
}

TEST(VerifyCommand, BadDatasheetsExitTwoNamingFileLineAndKey) {
  ScratchFolder folder("verify_bad_sheet");
  const RunResult fit = RunCoilspin("fit " + Quoted(kLot + "/motor-0101.toml") + " --quiet --json m.json", folder.path());
  ASSERT_EQ(fit.status, 0) << fit.err;
  const std::string head = "[datasheet]\nrated_voltage = \"6 V\"\n[spec]\n";
  const struct {
    const char* name;
    std::string spec;
    const char* says;
  } cases[] = {
      {"unknown_key.toml", "resistance = { nominal = \"1.4 ohm\", tolerance = \"8 %\" }\nwinding_colour = { nominal = \"2 V\", tolerance = \"1 %\" }\n",
       "unknown_key.toml:5:1: 'spec.winding_colour'"},
      {"wrong_dimension.toml", "resistance = { nominal = \"1.4 mH\", tolerance = \"8 %\" }\n",
       "wrong_dimension.toml:4:26: 'spec.resistance.nominal': 'mH' is a unit of inductance"},
      {"no_nominal.toml", "resistance = { tolerance = \"8 %\" }\n", "no_nominal.toml:4:14: 'spec.resistance': missing nominal"},
      {"negative.toml", "resistance = { nominal = \"1.4 ohm\", tolerance = \"-8 %\" }\n",
       "negative.toml:4:49: 'spec.resistance.tolerance': a tolerance must not be negative"},
  };
  for (const auto& c : cases) {
    folder.Write(c.name, head + c.spec);
    const RunResult verify = RunCoilspin(std::string("verify --datasheet ") + c.name + " m.json --json out.json", folder.path());
    EXPECT_EQ(verify.status, 2) << c.name << "\n" << verify.err;
    EXPECT_NE(verify.err.find(c.says), std::string::npos) << verify.err;
    EXPECT_FALSE(fs::exists(folder.path() / "out.json")) << c.name;  // nothing written
    const RunResult fitted = RunCoilspin("fit " + Quoted(kLot + "/motor-0101.toml") + " --datasheet " + c.name +
                                             " --json fitted.json",
                                         folder.path());
    EXPECT_EQ(fitted.status, 2) << c.name;  // the sheet is read before the fit
    EXPECT_FALSE(fs::exists(folder.path() / "fitted.json")) << c.name;
  }
  // A result file that is not one: exit 2, nothing written.
  folder.Write("not-a-result.json", "{\"format\": \"something else\"}");
  const RunResult bad_result =
      RunCoilspin("verify --datasheet " + Quoted(kSheetRevB) + " not-a-result.json --json out.json", folder.path());
  EXPECT_EQ(bad_result.status, 2);
  EXPECT_FALSE(fs::exists(folder.path() / "out.json"));
}

TEST(BatchFit, AFailedMotorIsReportedAndTheOthersGoOn) {
  ScratchFolder folder("batch_failure");
  folder.Write("broken.toml", "[[test]]\nkind = \"no-load\"\nfile = \"missing.csv\"\n");
  const RunResult r = RunCoilspin("fit " + Quoted(kLot + "/motor-0101.toml") + " broken.toml " +
                                      Quoted(kLot + "/motor-0102.toml") + " --out-dir out",
                                  folder.path());
  EXPECT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.err.find("broken.toml: FAILED:"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("missing.csv"), std::string::npos) << r.err;
  EXPECT_TRUE(fs::exists(folder.path() / "out" / "motor-0101.json"));
  EXPECT_TRUE(fs::exists(folder.path() / "out" / "motor-0102.json"));
  EXPECT_FALSE(fs::exists(folder.path() / "out" / "broken.json"));
  // Every motor with bad input: nothing written, exit 2.
  const RunResult all_bad = RunCoilspin("fit broken.toml --out-dir out2", folder.path());
  EXPECT_EQ(all_bad.status, 2) << all_bad.err;
}

TEST(BatchFit, WithADatasheetEachResultIsVerifiedAndTheLotPrinted) {
  ScratchFolder folder("batch_datasheet");
  const RunResult r = RunCoilspin("fit " + Quoted(kLot + "/motor-0101.toml") + " " + Quoted(kLot + "/motor-0104.toml") +
                                      " --out-dir out --datasheet " + Quoted(kSheetRevB),
                                  folder.path());
  EXPECT_EQ(r.status, 1) << r.err;  // 0104's weak magnet
  EXPECT_NE(r.out.find("lot of 2 motors"), std::string::npos) << r.out;
  EXPECT_NE(r.err.find("datasheet line torque_constant: fail"), std::string::npos) << r.err;
  for (const char* name : {"motor-0101.json", "motor-0104.json"}) {
    const fs::path result = folder.path() / "out" / name;
    ExpectValidResultFile(result);
    const auto j = nlohmann::json::parse(Slurp(result));
    EXPECT_EQ(j["verification"]["verdict"], std::string(name) == "motor-0101.json" ? "pass" : "fail") << name;
  }
}

TEST(BatchFit, UsageMistakesExitTwoBeforeAnyFit) {
  ScratchFolder folder("batch_usage");
  const std::string a = Quoted(kLot + "/motor-0101.toml"), b = Quoted(kLot + "/motor-0102.toml");
  const RunResult several = RunCoilspin("fit " + a + " " + b, folder.path());
  EXPECT_EQ(several.status, 2);
  EXPECT_NE(several.err.find("--out-dir"), std::string::npos) << several.err;
  EXPECT_EQ(RunCoilspin("fit " + a + " --out-dir out --json x.json", folder.path()).status, 2);
  fs::create_directories(folder.path() / "other");
  fs::copy_file(kLot + "/motor-0101.toml", folder.path() / "other" / "motor-0101.toml");
  const RunResult clash = RunCoilspin("fit " + a + " other/motor-0101.toml --out-dir out", folder.path());
  EXPECT_EQ(clash.status, 2);
  EXPECT_NE(clash.err.find("the same result motor-0101.json"), std::string::npos) << clash.err;
  EXPECT_FALSE(fs::exists(folder.path() / "out"));
}

// Ten motors of one type, one with a weak magnet, simulated, fitted and verified.
TEST(VerifyCommand, ALotOfTenSimulatedMotorsWithOneOutlier) {
  ScratchFolder folder("lot_of_ten");
  std::string sessions;
  for (int k = 1; k <= 10; ++k) {
    const std::string name = "m" + std::to_string(k);
    // invented spread: R ± 1.5 %, Ke ± 1 %; motor 7's magnet 15 % weak
    const double r = 2.0 * (1.0 + 0.003 * ((k * 7) % 11 - 5));
    const double ke = (k == 7 ? 0.85 : 1.0) * 0.03 * (1.0 + 0.002 * ((k * 5) % 11 - 5));
    const std::string motor = "--resistance " + std::to_string(r) + " --inductance 1.5e-3 --brush-drop 0.5";
    const std::string mechanics = " --back-emf-constant " + std::to_string(ke) +
                                  " --inertia 2e-5 --viscous-friction 2e-5 --coulomb-friction 3e-3";
    const std::string seed = " --seed " + std::to_string(10 * k);
    ASSERT_EQ(RunCoilspin("simulate locked-rotor --out " + name + "-lr.csv " + motor +
                              " --levels 3,6,9,-4 --hold 0.2 --sample-period 2e-3 --voltage-noise 0.003"
                              " --current-noise 0.004" + seed, folder.path()).status, 0);
    ASSERT_EQ(RunCoilspin("simulate no-load --out " + name + "-nl.csv " + motor + mechanics +
                              " --levels 4,8,12 --sample-period 5e-3 --voltage-noise 0.003 --current-noise 0.002"
                              " --speed-noise 0.3" + seed + "1", folder.path()).status, 0);
    folder.Write(name + ".toml", "[motor]\nlabel = \"unit " + std::to_string(k) + "\"\n[[test]]\nkind = \"locked-rotor\"\n"
                 "file = \"" + name + "-lr.csv\"\n[[test]]\nkind = \"no-load\"\nfile = \"" + name + "-nl.csv\"\n");
    sessions += " " + name + ".toml";
  }
  const RunResult fit = RunCoilspin("fit" + sessions + " --out-dir results", folder.path());
  ASSERT_EQ(fit.status, 0) << fit.err;
  folder.Write("sheet.toml", "[datasheet]\nrated_voltage = \"12 V\"\n[spec]\n"
               "resistance = { nominal = \"2 ohm\", tolerance = \"5 %\" }\n"
               "back_emf_constant = { nominal = \"0.03 V*s/rad\", tolerance = \"5 %\" }\n"
               "inertia = { nominal = \"200 g*cm^2\", tolerance = \"10 %\" }\n");
  std::string results;
  for (int k = 1; k <= 10; ++k) results += " results/m" + std::to_string(k) + ".json";
  const RunResult r = RunCoilspin("verify --datasheet sheet.toml" + results + " --json lot.json", folder.path());
  EXPECT_EQ(r.status, 1);
  ExpectValidVerification(folder.path() / "lot.json");
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "lot.json"));
  const auto& ke = j["lot"]["lines"]["back_emf_constant"];
  ASSERT_EQ(ke["outliers"].size(), 1u) << ke;
  EXPECT_EQ(ke["outliers"][0], "results/m7.json");
  EXPECT_EQ(ke["fail"], 1);
  EXPECT_EQ(ke["pass"], 9);
  EXPECT_EQ(ke["measured"], 10);
  EXPECT_TRUE(j["lot"]["lines"]["resistance"]["outliers"].empty());
  EXPECT_EQ(j["lot"]["lines"]["resistance"]["pass"], 10);
  // No spin-down: the inertia is not tested, on every motor, with the fit's reason.
  EXPECT_EQ(j["lot"]["lines"]["inertia"]["not_tested"], 10);
  EXPECT_NE(j["motors"][0]["lines"]["inertia"]["note"].get<std::string>().find("spin-down"), std::string::npos);
}

}  // namespace
}  // namespace coilspin::testing

// End-to-end: the coilspin binary as a user runs it. A good run writes the
// result file and table; every bad-input class exits 2 with a message naming
// file, line and column, and leaves an existing result file untouched
// (docs/file-formats.md; exit codes from the interface contract).
// The logs are made by `coilspin simulate` from known parameters.

#include <gtest/gtest.h>

#include <nlohmann/json.hpp>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

constexpr double kTrueResistance_ohm = 2.2;
constexpr double kTrueInductance_H = 1.5e-3;

class FitCommand : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    folder_ = new ScratchFolder("fit");
    const std::string motor = "--resistance 2.2 --inductance 1.5e-3 --voltage-noise 0.002 --current-noise 0.002";
    ASSERT_EQ(RunCoilspin("simulate locked-rotor --out plateaus.csv --levels 1,2,3,4,-2,-3 --hold 0.3 " + motor,
                          folder_->path()).status, 0);
    // A scope capture in mV and ms, current column named I_shunt with no unit.
    ASSERT_EQ(RunCoilspin("simulate locked-rotor --out scope.csv --step 0:5 --before 1e-3 --after 8e-3 "
                          "--sample-period 5e-6 --time-unit ms --voltage-unit mV --header current=I_shunt "
                          "--supply-resistance 0.2 --seed 3 " + motor,
                          folder_->path()).status, 0);
  }
  static void TearDownTestSuite() { delete folder_; }
  const std::filesystem::path& dir() const { return folder_->path(); }
  static ScratchFolder* folder_;
};
ScratchFolder* FitCommand::folder_ = nullptr;

TEST_F(FitCommand, GoodRunWritesTableAndResultFile) {
  // Two logs with different headers: the session file maps the scope's column.
  folder_->Write("session.toml",
                 "[motor]\nlabel = \"test motor\"\n"
                 "[[test]]\nkind = \"locked-rotor\"\nfile = \"plateaus.csv\"\n"
                 "[[test]]\nkind = \"locked-rotor\"\nfile = \"scope.csv\"\n"
                 "columns = { current = \"I_shunt\" }\nunits = { current = \"A\" }\n");
  const RunResult r = RunCoilspin("fit session.toml --json result.json", dir());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.out.find("resistance"), std::string::npos);
  EXPECT_NE(r.out.find("ohm"), std::string::npos);
  const auto j = nlohmann::json::parse(Slurp(dir() / "result.json"));
  EXPECT_EQ(j["format"], "coilspin.result/2");
  const double r_ohm = j["parameters"]["resistance"]["value"];
  const double l_H = j["parameters"]["inductance"]["value"];
  EXPECT_NEAR(r_ohm, kTrueResistance_ohm, 0.01 * kTrueResistance_ohm);
  EXPECT_NEAR(l_H, kTrueInductance_H, 0.03 * kTrueInductance_H);
  EXPECT_EQ(j["parameters"]["resistance"]["unit"], "ohm");
  EXPECT_EQ(j["parameters"]["inductance"]["unit"], "H");
  EXPECT_TRUE(j["not_identified"].contains("inertia"));
  EXPECT_EQ(j["consistency"]["verdict"], "not-checked");
  EXPECT_EQ(j["tests"].size(), 2u);
}

TEST_F(FitCommand, ScopeLogInMillivoltsAndMillisecondsWithRenamedColumn) {
  // README's example: one capture, its current column named I_shunt with no unit.
  const RunResult r = RunCoilspin("fit --locked-rotor scope.csv --column current=I_shunt --unit current=A --json s.json", dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(Slurp(dir() / "s.json"));
  const double l_H = j["parameters"]["inductance"]["value"];
  EXPECT_NEAR(l_H, kTrueInductance_H, 0.03 * kTrueInductance_H);
}

TEST_F(FitCommand, SameInputGivesByteIdenticalResult) {
  ASSERT_EQ(RunCoilspin("fit --locked-rotor plateaus.csv --json a.json --quiet", dir()).status, 0);
  ASSERT_EQ(RunCoilspin("fit --locked-rotor plateaus.csv --json b.json --quiet", dir()).status, 0);
  EXPECT_EQ(Slurp(dir() / "a.json"), Slurp(dir() / "b.json"));
}

TEST_F(FitCommand, RequiredInductanceWithoutStepCaptureExitsOne) {
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --require inductance --json req.json", dir());
  EXPECT_EQ(r.status, 1);
  const auto j = nlohmann::json::parse(Slurp(dir() / "req.json"));  // still written, says why
  EXPECT_TRUE(j["not_identified"].contains("inductance"));
}

TEST_F(FitCommand, QuietExitOneStillSaysWhyOnStderr) {
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --require inductance --quiet", dir());
  EXPECT_EQ(r.status, 1);
  EXPECT_EQ(r.out, "");
  EXPECT_NE(r.err.find("coilspin: inductance not determined: needs a locked-rotor step capture"), std::string::npos)
      << r.err;
}

TEST_F(FitCommand, FreeShaftStepEndToEnd) {
  // simulate writes a step log of a known motor (Vb = 0); fit reads it back. The
  // issue's step-only bounds: R 2 %, Ke 1 %, J 5 %.
  ASSERT_EQ(RunCoilspin("simulate step --out s.csv --resistance 2 --inductance 1e-3 --back-emf-constant 0.03 "
                        "--inertia 2e-5 --viscous-friction 1e-5 --coulomb-friction 2e-3 --step 0:12 "
                        "--sample-period 5e-5 --after 0.15 --current-noise 0.002 --speed-noise 0.2 --seed 3",
                        dir()).status, 0);
  const RunResult r = RunCoilspin("fit --step s.csv --json step.json --quiet", dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(Slurp(dir() / "step.json"));
  EXPECT_NEAR(j["parameters"]["resistance"]["value"].get<double>(), 2.0, 0.02 * 2.0);
  EXPECT_NEAR(j["parameters"]["back_emf_constant"]["value"].get<double>(), 0.03, 0.01 * 0.03);
  EXPECT_NEAR(j["parameters"]["inertia"]["value"].get<double>(), 2e-5, 0.05 * 2e-5);
  EXPECT_EQ(j["tests"][0]["kind"], "step");
}

TEST_F(FitCommand, IntervalMethodAndRobustLossAreOptionsAndInTheResult) {
  ASSERT_EQ(RunCoilspin("fit --locked-rotor plateaus.csv --intervals bootstrap --replicates 30 --seed 5 "
                        "--json b1.json --quiet", dir()).status, 0);
  ASSERT_EQ(RunCoilspin("fit --locked-rotor plateaus.csv --intervals bootstrap --replicates 30 --seed 5 "
                        "--json b2.json --quiet", dir()).status, 0);
  EXPECT_EQ(Slurp(dir() / "b1.json"), Slurp(dir() / "b2.json"));  // fixed seed: byte-identical
  const auto b = nlohmann::json::parse(Slurp(dir() / "b1.json"));
  EXPECT_EQ(b["intervals"]["method"], "bootstrap");
  EXPECT_EQ(b["intervals"]["seed"], 5);
  EXPECT_EQ(b["intervals"]["replicates"].get<int>() + b["intervals"]["failed_replicates"].get<int>(), 30);
  ASSERT_EQ(RunCoilspin("fit --locked-rotor plateaus.csv --robust cauchy --json r.json --quiet", dir()).status, 0);
  const auto r = nlohmann::json::parse(Slurp(dir() / "r.json"));
  EXPECT_EQ(r["intervals"]["robust_loss"], "cauchy");
  EXPECT_EQ(r["intervals"]["method"], "wald");
  // A bootstrap option without the bootstrap is a usage error, not silently ignored.
  const RunResult bad = RunCoilspin("fit --locked-rotor plateaus.csv --replicates 30", dir());
  EXPECT_EQ(bad.status, 2);
  EXPECT_NE(bad.err.find("--intervals bootstrap"), std::string::npos) << bad.err;
  EXPECT_EQ(RunCoilspin("fit --locked-rotor plateaus.csv --intervals jackknife", dir()).status, 2);
}

struct BadInput {
  std::string name;
  std::string contents;
  std::string expected;  // a fragment of the message, including file:line where it applies
  std::string extra_arguments;
};

void PrintTo(const BadInput& b, std::ostream* os) { *os << b.name; }

class BadInputs : public FitCommand, public ::testing::WithParamInterface<BadInput> {};

TEST_P(BadInputs, ExitTwoNameTheLineAndLeaveTheResultFileAlone) {
  const BadInput& b = GetParam();
  const auto log = folder_->Write(b.name + ".csv", b.contents);
  const std::string previous = "{\"format\": \"coilspin.result/1\", \"previous\": true}\n";
  folder_->Write("kept.json", previous);
  const RunResult r =
      RunCoilspin("fit --locked-rotor " + log.filename().string() + " --json kept.json " + b.extra_arguments, dir());
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find(b.expected), std::string::npos) << r.err;
  EXPECT_EQ(r.out, "");
  EXPECT_EQ(Slurp(dir() / "kept.json"), previous);
}

const std::string kHeader = "time [s],voltage [V],current [A]\n";
std::string Rows(int n) {
  std::string text;
  for (int k = 0; k < n; ++k)
    text += std::to_string(k * 0.01) + "," + std::to_string(1.0 + (k / 10) * 0.5) + "," +
            std::to_string(0.4 + (k / 10) * 0.2) + "\n";
  return text;
}

INSTANTIATE_TEST_SUITE_P(
    EveryClass, BadInputs,
    ::testing::Values(
        BadInput{"empty", "", "empty.csv", ""},
        BadInput{"binary", std::string("time [s]\0\x01\x02", 11), "binary.csv", ""},
        BadInput{"no_header", "1,2,3\n4,5,6\n", "no_header.csv:1", ""},
        BadInput{"missing_column", "time [s],voltage [V]\n0,1\n0.1,2\n", "current", ""},
        BadInput{"unknown_unit", "time [s],voltage [kV],current [A]\n0,1,2\n", "unknown_unit.csv:1:2", ""},
        BadInput{"non_numeric", kHeader + "0,1,0.5\n0.01,abc,0.5\n", "non_numeric.csv:3:2", ""},
        BadInput{"not_finite", kHeader + "0,1,0.5\n0.01,nan,0.5\n", "not_finite.csv:3:2", ""},
        BadInput{"time_backwards", kHeader + "0,1,0.5\n0.02,1,0.5\n0.01,1,0.5\n", "time_backwards.csv:4", ""},
        BadInput{"truncated", kHeader + Rows(30) + "0.5,1", "truncated.csv:32", ""},
        BadInput{"too_few", kHeader + "0,1,0.5\n0.01,2,0.9\n", "too_few.csv", ""},
        BadInput{"constant", kHeader + std::string([] {
                   std::string t;
                   for (int k = 0; k < 50; ++k) t += std::to_string(k * 0.01) + ",1.0,0.5\n";
                   return t;
                 }()),
                 "constant.csv", ""},
        BadInput{"counts_without_cpr", "time [s],voltage [V],current [A],position [counts]\n0,1,0.5,0\n",
                 "counts_without_cpr.csv", ""},
        BadInput{"bad_column_map", kHeader + Rows(30), "--column", "--column current"},
        BadInput{"missing_file", kHeader + Rows(30), "no_such_file.csv", "--locked-rotor no_such_file.csv"}),
    [](const auto& info) { return info.param.name; });

}  // namespace
}  // namespace coilspin::testing

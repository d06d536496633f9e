// End-to-end: result files that cannot be damaged (src/output/atomic_file.h).
// Every output option (fit's --json and --out-dir, simulate's and export's
// --out, the --json of consistency and tune, verify's --json and --csv)
// refuses, with exit status 2 and before any work, a path that is not a regular
// file (FIFO, device, folder), an empty path and a folder that does not exist;
// `-` puts the output on stdout and nothing else.
// Whether a killed writer leaves the old file: tests/output/atomic_file_test.cc.

#include <gtest/gtest.h>
#include <sys/stat.h>

#include <nlohmann/json.hpp>

#include "cli/run_coilspin.h"
#include "result/fitted_results.h"

namespace coilspin::testing {
namespace {

class OutputFile : public ::testing::Test {
 protected:
  static void SetUpTestSuite() {
    folder_ = new ScratchFolder("output_file");
    ASSERT_EQ(RunCoilspin("simulate locked-rotor --out plateaus.csv --levels 1,2,3,-2 --hold 0.2 --resistance 2.2 "
                          "--inductance 1.5e-3 --voltage-noise 0.002 --current-noise 0.002",
                          folder_->path()).status, 0);
  }
  static void TearDownTestSuite() { delete folder_; }
  const std::filesystem::path& dir() const { return folder_->path(); }
  static ScratchFolder* folder_;
};
ScratchFolder* OutputFile::folder_ = nullptr;

TEST_F(OutputFile, AFifoIsRefusedAndLeftAFifo) {
  ASSERT_EQ(::mkfifo((dir() / "pipe.json").c_str(), 0644), 0);
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --json pipe.json", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("pipe.json: --json: it is a FIFO (named pipe), not a regular file"), std::string::npos) << r.err;
  EXPECT_EQ(r.out, "");  // refused before the fit: no table
  EXPECT_TRUE(std::filesystem::is_fifo(dir() / "pipe.json"));
  const RunResult simulate = RunCoilspin("simulate locked-rotor --out pipe.json --levels 1,2 --resistance 1 "
                                         "--inductance 1e-3", dir());
  EXPECT_EQ(simulate.status, 2);
  EXPECT_NE(simulate.err.find("pipe.json: --out: it is a FIFO"), std::string::npos) << simulate.err;
  EXPECT_TRUE(std::filesystem::is_fifo(dir() / "pipe.json"));
}

TEST_F(OutputFile, ADeviceIsRefused) {
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --json /dev/null", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("/dev/null: --json: it is a device, not a regular file"), std::string::npos) << r.err;
  const RunResult consistency = RunCoilspin("consistency --kt '15 mN*m/A' --ke '1.6 V/krpm' --json /dev/null", dir());
  EXPECT_EQ(consistency.status, 2);
  EXPECT_NE(consistency.err.find("/dev/null: --json: it is a device"), std::string::npos) << consistency.err;
}

TEST_F(OutputFile, AFolderIsRefused) {
  std::filesystem::create_directories(dir() / "results");
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --json results", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("results: --json: it is a folder, not a regular file"), std::string::npos) << r.err;
  EXPECT_TRUE(std::filesystem::is_directory(dir() / "results"));
}

TEST_F(OutputFile, AnEmptyPathIsRefused) {
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --json ''", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("--json: the output path is empty"), std::string::npos) << r.err;
  const RunResult simulate = RunCoilspin("simulate locked-rotor --out '' --levels 1,2 --resistance 1 --inductance 1e-3",
                                         dir());
  EXPECT_EQ(simulate.status, 2);
  EXPECT_NE(simulate.err.find("--out: the output path is empty"), std::string::npos) << simulate.err;
}

TEST_F(OutputFile, AMissingFolderIsFoundBeforeAnyLogIsRead) {
  // The log does not exist either: the folder is checked first, so that a long fit
  // never ends in "cannot write".
  const RunResult r = RunCoilspin("fit --locked-rotor no_such_log.csv --json missing/result.json", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("missing/result.json: --json: the folder 'missing' does not exist"), std::string::npos)
      << r.err;
  EXPECT_EQ(r.err.find("no_such_log.csv"), std::string::npos) << r.err;
}

TEST_F(OutputFile, DashWritesTheResultToStdoutInsteadOfTheTable) {
  const RunResult r = RunCoilspin("fit --locked-rotor plateaus.csv --json -", dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(r.out);  // stdout is the result file and nothing else
  EXPECT_EQ(j["format"], "coilspin.result/2");
  EXPECT_NEAR(j["parameters"]["resistance"]["value"].get<double>(), 2.2, 0.01 * 2.2);
  EXPECT_FALSE(std::filesystem::exists(dir() / "-"));
  const RunResult consistency = RunCoilspin("consistency --kt '15 mN*m/A' --ke '1.6 V/krpm' --json -", dir());
  // 1.6 V/krpm = 1.6/(1000·2π/60) = 0.01528 V*s/rad (physics), Kt/Ke = 0.98: consistent, exit 0.
  ASSERT_EQ(consistency.status, 0) << consistency.err;
  EXPECT_EQ(nlohmann::json::parse(consistency.out)["format"], "coilspin.consistency/1");
}

TEST_F(OutputFile, TheHandOffCommandsRefuseAFifoBeforeReadingTheirInput) {
  // The result file does not exist: the output path is checked first.
  ASSERT_EQ(::mkfifo((dir() / "handoff.fifo").c_str(), 0644), 0);
  const char* const commands[] = {
      "export no_such.json --format c-header --out handoff.fifo",
      "tune no_such.json --json handoff.fifo",
      "verify --datasheet plateaus.csv plateaus.csv --json handoff.fifo",
      "verify --datasheet plateaus.csv plateaus.csv --csv handoff.fifo",
  };
  for (const char* command : commands) {
    const RunResult r = RunCoilspin(command, dir());
    EXPECT_EQ(r.status, 2) << command;
    EXPECT_NE(r.err.find("handoff.fifo: --"), std::string::npos) << command << "\n" << r.err;
    EXPECT_NE(r.err.find("it is a FIFO (named pipe), not a regular file"), std::string::npos) << r.err;
    EXPECT_EQ(r.err.find("no_such.json"), std::string::npos) << r.err;
    EXPECT_TRUE(std::filesystem::is_fifo(dir() / "handoff.fifo"));
  }
}

TEST_F(OutputFile, TheHandOffCommandsRefuseAnEmptyPathAndAMissingFolder) {
  const std::string result = FittedResult(kBootstrapResult).string();
  const std::string sheet = std::string(COILSPIN_DEMO_DIR) + "/datasheet.toml";
  const std::pair<std::string, std::string> cases[] = {
      {"export '" + result + "' --format c-header --out ''", "--out: the output path is empty"},
      {"tune '" + result + "' --json ''", "--json: the output path is empty"},
      {"verify --datasheet '" + sheet + "' '" + result + "' --csv ''", "--csv: the output path is empty"},
      {"export '" + result + "' --format c-header --out missing/m.h", "missing/m.h: --out: the folder 'missing' does not exist"},
      {"verify --datasheet '" + sheet + "' '" + result + "' --json missing/v.json",
       "missing/v.json: --json: the folder 'missing' does not exist"},
      {"verify --datasheet '" + sheet + "' '" + result + "' --json - --csv -", "standard output takes one of them"},
  };
  for (const auto& [command, message] : cases) {
    const RunResult r = RunCoilspin(command, dir());
    EXPECT_EQ(r.status, 2) << command;
    EXPECT_NE(r.err.find(message), std::string::npos) << command << "\n" << r.err;
    EXPECT_EQ(r.out, "") << command;
  }
}

TEST_F(OutputFile, DashPutsAnExportOrAVerificationOnStdoutAndNothingElse) {
  const std::string result = FittedResult(kBootstrapResult).string();
  const RunResult header = RunCoilspin("export '" + result + "' --format c-header --out -", dir());
  ASSERT_EQ(header.status, 0) << header.err;
  EXPECT_EQ(header.out.rfind("//", 0), 0u) << header.out;  // the header itself, no "wrote ..." line
  EXPECT_EQ(header.out.find("wrote "), std::string::npos) << header.out;
  EXPECT_FALSE(std::filesystem::exists(dir() / "-"));
  const RunResult verify =
      RunCoilspin("verify --datasheet '" + std::string(COILSPIN_DEMO_DIR) + "/datasheet.toml' '" + result + "' --json -",
                  dir());
  ASSERT_TRUE(verify.status == 0 || verify.status == 1) << verify.err;  // a locked-rotor fit leaves lines untested
  EXPECT_EQ(nlohmann::json::parse(verify.out)["format"], "coilspin.verification/1");
}

TEST_F(OutputFile, ALotRefusesAResultPathThatIsNotARegularFileBeforeAnyFit) {
  std::filesystem::create_directories(dir() / "lot");
  ASSERT_EQ(::mkfifo((dir() / "lot" / "motor-a.json").c_str(), 0644), 0);
  folder_->Write("motor-a.toml", "[[test]]\nkind = \"locked-rotor\"\nfile = \"no_such.csv\"\n");
  const RunResult r = RunCoilspin("fit motor-a.toml --out-dir lot", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("lot/motor-a.json: --out-dir: it is a FIFO"), std::string::npos) << r.err;
  EXPECT_TRUE(std::filesystem::is_fifo(dir() / "lot" / "motor-a.json"));
  const RunResult empty = RunCoilspin("fit motor-a.toml --out-dir ''", dir());
  EXPECT_EQ(empty.status, 2);
  EXPECT_NE(empty.err.find("--out-dir: give a folder for the result files"), std::string::npos) << empty.err;
}

}  // namespace
}  // namespace coilspin::testing

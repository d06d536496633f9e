// End-to-end: `coilspin consistency` as a user runs it. Exit status 0 for a
// consistent pair, 1 for an inconsistent one (result file still written), 2 for
// bad input with a message saying what was expected and nothing written
// (src/cli/consistency_command.h; exit codes from the interface contract).
// The figures are built from physics: an ideal machine has Kt = Ke = 0.02 in SI,
// i.e. 2.832238579 oz·in/A (NIST SP 811 Appendix B) and 2.094395102 V/krpm.

#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

constexpr const char* kIdealKt = "--kt '2.832238579 oz*in/A'";  // 0.02 N·m/A, NIST SP 811 Appendix B
constexpr const char* kIdealKe = "--ke '2.094395102 V/krpm'";   // 0.02 V·s/rad, physics (2π/60 rad/s per rpm)

std::string Args(const std::string& kt, const std::string& ke, const std::string& rest = "") {
  return "consistency " + kt + " " + ke + (rest.empty() ? "" : " " + rest);
}

TEST(ConsistencyCommand, AgreeingPairExitsZeroAndWritesTheResult) {
  ScratchFolder folder("consistency_ok");
  const RunResult r = RunCoilspin(Args(kIdealKt, kIdealKe, "--json out.json"), folder.path());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.out.find("verdict: consistent"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("Kt = 0.02 N*m/A"), std::string::npos) << r.out;  // physics: the SI value
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "out.json"));
  EXPECT_EQ(j["format"], "coilspin.consistency/1");
  EXPECT_NEAR(j["kt"]["value"].get<double>(), 0.02, 1e-11);  // NIST SP 811 Appendix B
  EXPECT_EQ(j["kt"]["unit"], "N*m/A");
  EXPECT_EQ(j["kt"]["as_given"], "2.832238579 oz*in/A");
  EXPECT_NEAR(j["ke"]["value"].get<double>(), 0.02, 1e-11);  // physics: 1 krpm = 1000·2π/60 rad/s
  EXPECT_EQ(j["ke"]["unit"], "V*s/rad");
  EXPECT_NEAR(j["kt_over_ke"].get<double>(), 1.0, 1e-9);     // physics: Kt = Ke in SI
  EXPECT_EQ(j["tolerance"].get<double>(), 0.05);             // common practice: the stated default
  EXPECT_EQ(j["verdict"], "consistent");
  EXPECT_FALSE(j.contains("cause"));
}

TEST(ConsistencyCommand, SpeedConstantInsteadOfKe) {
  // physics: Kv = 1/Ke = 50 (rad/s)/V = 477.4648293 rpm/V, i.e. Ke = 60/(2π·Kv)
  ScratchFolder folder("consistency_kv");
  const RunResult r = RunCoilspin(Args(kIdealKt, "--kv '477.4648293 rpm/V'", "--json out.json"), folder.path());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "out.json"));
  EXPECT_NEAR(j["ke"]["value"].get<double>(), 0.02, 1e-10);
  EXPECT_EQ(j["ke"]["as_given"], "477.4648293 rpm/V");
}

TEST(ConsistencyCommand, DatasheetSpellingsWithHyphensDotsAndCapitalK) {
  // Issue 13: oz-in/A, N-m/A, mN.m/A and V/Krpm were refused; they are the same units as
  // oz*in/A (NIST SP 811 Appendix B), N*m/A, mN*m/A (NIST SP 811 4.3) and V/krpm (physics).
  ScratchFolder folder("consistency_spellings");
  for (const char* kt : {"--kt '2.832238579 oz-in/A'", "--kt '0.02 N-m/A'", "--kt '20 mN.m/A'"}) {
    const RunResult r = RunCoilspin(Args(kt, "--ke '2.094395102 V/Krpm'"), folder.path());
    EXPECT_EQ(r.status, 0) << kt << "\n" << r.err;
    EXPECT_NE(r.out.find("verdict: consistent"), std::string::npos) << r.out;
  }
}

TEST(ConsistencyCommand, LineToLineKeExitsOneAndNamesTheConvention) {
  // references.md (brushless conventions): Ke_LL,pk = √3·k_ph = 0.034641 V·s/rad = 3.627598728 V/krpm
  ScratchFolder folder("consistency_sqrt3");
  const RunResult r = RunCoilspin(Args(kIdealKt, "--ke '3.627598728 V/krpm'", "--json out.json"), folder.path());
  ASSERT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.out.find("verdict: inconsistent"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("Ke quoted line-to-line in peak volts"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("factor \u221a3"), std::string::npos) << r.out;
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "out.json"));
  EXPECT_NEAR(j["kt_over_ke"].get<double>(), 1.0 / std::sqrt(3.0), 1e-9);  // physics: 1/√3
  EXPECT_EQ(j["verdict"], "inconsistent");
  EXPECT_EQ(j["cause"]["kind"], "winding-convention");
  EXPECT_EQ(j["cause"]["name"], "1/\u221a3");
}

TEST(ConsistencyCommand, MilliNewtonMetresAsNewtonMetresExitsOne) {
  // NIST SP 811 4.3: 0.02 N·m/A = 20 mN·m/A; written as 20 N·m/A, Kt/Ke = 1000
  ScratchFolder folder("consistency_slip");
  const RunResult r = RunCoilspin(Args("--kt '20 N*m/A'", kIdealKe, "--tolerance 0.02"), folder.path());
  ASSERT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.out.find("mN*m/A written as N*m/A"), std::string::npos) << r.out;
  EXPECT_NE(r.out.find("tolerance: 1 \u00b1 0.02"), std::string::npos) << r.out;
}

TEST(ConsistencyCommand, BadInputExitsTwoAndWritesNothing) {
  ScratchFolder folder("consistency_bad");
  folder.Write("out.json", "previous result\n");
  const struct {
    std::string arguments;
    std::string expected;  // in the message: what was expected
  } cases[] = {
      // physics: V/krpm is voltage per speed, not torque per current
      {Args("--kt '1.6 V/krpm'", kIdealKe),
       "--kt expects a torque constant such as 2.2 oz*in/A or 15 mN*m/A, got 'V/krpm'"},
      {Args(kIdealKt, "--ke '850 rpm/V'"), "--ke expects a back-EMF constant"},
      {Args(kIdealKt, "--kv '1.6 V/krpm'"), "--kv expects a speed constant such as 850 rpm/V"},
      {Args("--kt '2.2 ozin/A'", kIdealKe), "unknown unit 'ozin/A'"},
      {Args("--kt 'oz*in/A'", kIdealKe), "does not start with a number"},
      {Args("--kt '-2.2 oz*in/A'", kIdealKe), "expects a positive torque constant"},
      {"consistency " + std::string(kIdealKt), "give the back-EMF constant with --ke"},
      {Args(kIdealKt, kIdealKe, "--kv '477 rpm/V'"), "give either --ke or --kv, not both"},
      {Args(kIdealKt, kIdealKe, "--tolerance 1.5"), "strictly between 0 and 1"},
      {Args(kIdealKt, kIdealKe, "--tolerance 0"), "strictly between 0 and 1"},
  };
  for (const auto& c : cases) {
    const RunResult r = RunCoilspin(c.arguments + " --json out.json", folder.path());
    EXPECT_EQ(r.status, 2) << c.arguments;  // interface contract: 2 = bad input
    EXPECT_NE(r.err.find(c.expected), std::string::npos) << c.arguments << "\n" << r.err;
    EXPECT_EQ(Slurp(folder.path() / "out.json"), "previous result\n") << c.arguments;  // nothing written
  }
  EXPECT_EQ(RunCoilspin("consistency " + std::string(kIdealKe), folder.path()).status, 2);  // --kt is required
}

}  // namespace
}  // namespace coilspin::testing

// End-to-end: `simulate` refuses a log beyond model::kMaxSimulatedSamples
// (10^7 samples) before it simulates anything, with exit status 2 and a message
// giving the figures and the options that set the length. Before: a tiny
// --sample-period or a long --hold ended in std::bad_alloc (an abort), and a
// free-shaft step of a large inertia ran on through gigabytes, its default
// duration being the motor's settling time.

#include <gtest/gtest.h>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

class SimulateCaps : public ::testing::Test {
 protected:
  SimulateCaps() : folder_("simulate_caps") {}
  const std::filesystem::path& dir() const { return folder_.path(); }
  ScratchFolder folder_;
};

const std::string kMotor = "--resistance 1 --inductance 1e-3";
const std::string kFreeShaft = kMotor + " --back-emf-constant 0.02 --inertia 1e-5";

TEST_F(SimulateCaps, ATinySamplePeriodIsRefused) {
  // 6e-3 s at 1e-12 s per sample: 6e9 samples (1e-3 s before the step, a settling time of 5e-3 s after it).
  const RunResult r =
      RunCoilspin("simulate step --out s.csv " + kFreeShaft + " --step 0:6 --after 5e-3 --sample-period 1e-12", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("the log would hold 6e+09 samples (0.006 s at 1e-12 s per sample), more than simulate writes "
                       "(10000000); ask for less: a shorter --after, --before or --settle, or a longer --sample-period"),
            std::string::npos)
      << r.err;
  EXPECT_FALSE(std::filesystem::exists(dir() / "s.csv"));
}

TEST_F(SimulateCaps, ALongHoldIsRefused) {
  const RunResult r = RunCoilspin("simulate locked-rotor --out p.csv " + kMotor + " --levels 1,2 --hold 1e9", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("the log would hold 2e+12 samples (2e+09 s at 0.001 s per sample)"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("fewer --levels, a shorter --hold, or a longer --sample-period"), std::string::npos) << r.err;
}

TEST_F(SimulateCaps, ALargeInertiaDoesNotRunAway) {
  // τ_m = J·R/Ke² = 1e2·1/0.02² = 2.5e5 s (physics); the default duration, 10 τ_m, is refused,
  // and the message says where that duration came from.
  const RunResult r = RunCoilspin("simulate step --out s.csv " + kMotor +
                                      " --back-emf-constant 0.02 --inertia 1e2 --step 0:6", dir());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("more than simulate writes (10000000)"), std::string::npos) << r.err;
  EXPECT_NE(r.err.find("(--after defaults to the settling time, 2.5e+06 s)"), std::string::npos) << r.err;
  // Given a duration, the same motor simulates.
  EXPECT_EQ(RunCoilspin("simulate step --out s.csv " + kMotor +
                            " --back-emf-constant 0.02 --inertia 1e2 --step 0:6 --after 0.5 --sample-period 1e-4",
                        dir()).status,
            0);
}

}  // namespace
}  // namespace coilspin::testing

// End-to-end: `coilspin simulate step` as a user runs it. The log's columns,
// its step instant and its sample period are read back from the CSV; options
// that do not apply to a kind exit 2 and write nothing (src/cli/simulate_command.h).

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <sstream>
#include <string>
#include <vector>

#include "cli/inapplicable_options.h"
#include "cli/run_coilspin.h"
#include "cli/simulated_csv.h"

namespace coilspin::testing {
namespace {

// The demo motor (datasets-demo/README.md), invented: τe = L/R = 0.82 mH/1.35 ohm ≈ 0.6 ms.
const std::string kMotor =
    "--resistance 1.35 --inductance 0.82e-3 --brush-drop 0.9 --back-emf-constant 0.021 --inertia 3.2e-5 "
    "--viscous-friction 1.1e-5 --coulomb-friction 4.5e-3";
// The CSV writer keeps 10 significant digits (src/output/bench_log_csv.h): times below 1 s to 1e-12 s.
constexpr double kTimeTolerance_s = 1e-12;

class SimulateStepCommand : public ::testing::Test {
 protected:
  SimulateStepCommand() : folder_("simulate_step") {}
  const std::filesystem::path& dir() const { return folder_.path(); }
  ScratchFolder folder_;
};

TEST_F(SimulateStepCommand, FromRestWritesTheColumnsAndStepsAtTheGivenInstant) {
  // src/model/simulate_step.h: samples at t_k = k·Δ, the step at round(before/Δ)·Δ = 2 ms (sample 100)
  const RunResult r = RunCoilspin(
      "simulate step --out step.csv --step 0:6 --before 2e-3 --after 0.05 --sample-period 2e-5 " + kMotor, dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const Csv csv = ReadCsv(dir() / "step.csv");
  EXPECT_EQ(csv.header, (std::vector<std::string>{"time [s]", "voltage [V]", "current [A]", "speed [rad/s]"}));
  ASSERT_EQ(csv.rows.size(), 100u + 2500u);
  ASSERT_FALSE(csv.comments.empty());
  EXPECT_NE(csv.comments.front().find("step 0 V -> 6 V at t = 0.002 s"), std::string::npos) << csv.comments.front();
  for (std::size_t k = 0; k < 100; ++k) {
    // physics: at rest with the supply at 0 V, without noise, everything is exactly 0
    EXPECT_EQ(csv.rows[k][1], 0.0) << "row " << k;
    EXPECT_EQ(csv.rows[k][2], 0.0) << "row " << k;
    EXPECT_EQ(csv.rows[k][3], 0.0) << "row " << k;
  }
  EXPECT_NEAR(csv.rows[100][0], 2e-3, kTimeTolerance_s);
  EXPECT_EQ(csv.rows[100][1], 6.0);  // physics: v = V_s − R_s·i with i = 0 at the step instant
  EXPECT_NEAR(csv.rows.back()[0], 2599 * 2e-5, kTimeTolerance_s);
  // handbook: di/dt = (V_1 − Vb)/L at i = ω = 0, so one sample later i ≈ (6 − 0.9)/0.82e-3·Δ, low by
  // about Δ/(2τe) ≈ 1.6 % (τe = L/R): within 3 %
  const double first_A = (6.0 - 0.9) / 0.82e-3 * 2e-5;
  EXPECT_NEAR(csv.rows[101][2], first_A, 0.03 * first_A);
}

TEST_F(SimulateStepCommand, EncoderLogsCountsInsteadOfSpeed) {
  const RunResult r = RunCoilspin(
      "simulate step --out enc.csv --step 0:6 --after 0.05 --cpr 500 --log-temperature " + kMotor, dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const Csv csv = ReadCsv(dir() / "enc.csv");
  EXPECT_EQ(csv.header, (std::vector<std::string>{"time [s]", "voltage [V]", "current [A]", "position [counts]",
                                                  "temperature [degC]"}));
  bool noted = false;
  for (const std::string& comment : csv.comments) noted = noted || comment == "encoder_cpr: 500";
  EXPECT_TRUE(noted);
  ASSERT_FALSE(csv.rows.empty());
  EXPECT_EQ(csv.rows.front()[3], 0.0);  // src/model/shaft_channels.h: zeroed at the start
  EXPECT_GT(csv.rows.back()[3], 0.0);
  EXPECT_EQ(csv.rows.back()[3], std::floor(csv.rows.back()[3]));  // whole counts
}

TEST_F(SimulateStepCommand, EncoderStartPhaseBringsTheFirstEdgeEarlier) {
  // src/model/shaft_channels.h: n = floor(θ·cpr/2π + φ); zeroed at the start either way, and the
  // shaft, turning the same path, passes its first edge after 1 − φ of a count instead of a whole one
  const std::string common = "simulate step --step 0:6 --after 0.05 --cpr 500 " + kMotor;
  ASSERT_EQ(RunCoilspin(common + " --out edge.csv", dir()).status, 0);
  const RunResult shifted = RunCoilspin(common + " --out shifted.csv --encoder-start-phase 0.9", dir());
  ASSERT_EQ(shifted.status, 0) << shifted.err;
  const Csv edge = ReadCsv(dir() / "edge.csv");
  const Csv moved = ReadCsv(dir() / "shifted.csv");
  ASSERT_EQ(edge.rows.size(), moved.rows.size());
  EXPECT_EQ(moved.rows.front()[3], 0.0);
  const auto first_count = [](const Csv& csv) {
    for (std::size_t k = 0; k < csv.rows.size(); ++k)
      if (csv.rows[k][3] != 0.0) return k;
    return csv.rows.size();
  };
  EXPECT_LT(first_count(moved), first_count(edge));
  // Everywhere the shifted reading is the edge reading or one count more.
  for (std::size_t k = 0; k < edge.rows.size(); ++k) {
    const double more = moved.rows[k][3] - edge.rows[k][3];
    EXPECT_TRUE(more == 0.0 || more == 1.0) << "row " << k << ": " << more;
  }
  const RunResult outside = RunCoilspin(common + " --out never.csv --encoder-start-phase 1", dir());
  EXPECT_EQ(outside.status, 2);
  EXPECT_NE(outside.err.find("must lie in [0, 1) of a count"), std::string::npos) << outside.err;
  EXPECT_FALSE(std::filesystem::exists(dir() / "never.csv"));
}

TEST_F(SimulateStepCommand, BetweenTwoLevelsStartsAfterTheUnloggedSettle) {
  // src/model/simulate_step.h: t counts from the unlogged start; the step comes `before` later
  const RunResult r = RunCoilspin(
      "simulate step --out levels.csv --step 3:6 --settle 0.5 --before 1e-3 --after 0.02 --sample-period 2e-5 " +
          kMotor,
      dir());
  ASSERT_EQ(r.status, 0) << r.err;
  const Csv csv = ReadCsv(dir() / "levels.csv");
  ASSERT_EQ(csv.rows.size(), 50u + 1000u);
  EXPECT_NEAR(csv.rows.front()[0], 0.5, kTimeTolerance_s);
  EXPECT_EQ(csv.rows[49][1], 3.0);   // no supply resistance: v = V_s
  EXPECT_EQ(csv.rows[50][1], 6.0);
  EXPECT_NEAR(csv.rows[50][0], 0.501, kTimeTolerance_s);
  EXPECT_GT(csv.rows.front()[3], 0.0) << "already turning at 3 V";
}

TEST_F(SimulateStepCommand, DefaultSamplePeriodResolvesTheElectricalTimeConstant) {
  // src/model/step_plan_defaults.h: Δ = min(20 µs, τe/10). The demo motor's τe ≈ 0.6 ms gives 20 µs;
  // a 0.1 mH, 1 ohm winding (τe = 0.1 ms) gives 10 µs
  ASSERT_EQ(RunCoilspin("simulate step --out slow.csv --step 0:6 --after 0.01 " + kMotor, dir()).status, 0);
  const Csv slow = ReadCsv(dir() / "slow.csv");
  ASSERT_GT(slow.rows.size(), 2u);
  EXPECT_NEAR(slow.rows[1][0] - slow.rows[0][0], 20e-6, kTimeTolerance_s);
  ASSERT_EQ(RunCoilspin("simulate step --out fast.csv --step 0:6 --after 0.01 --resistance 1 --inductance 1e-4 "
                        "--back-emf-constant 0.02 --inertia 1e-5",
                        dir())
                .status,
            0);
  const Csv fast = ReadCsv(dir() / "fast.csv");
  ASSERT_GT(fast.rows.size(), 2u);
  EXPECT_NEAR(fast.rows[1][0] - fast.rows[0][0], 10e-6, kTimeTolerance_s);
}

class InapplicableOptions : public SimulateStepCommand, public ::testing::WithParamInterface<Inapplicable> {};

TEST_P(InapplicableOptions, ExitTwoAndWriteNothing) {
  const Inapplicable& c = GetParam();
  const RunResult r = RunCoilspin("simulate " + c.arguments + " --out never.csv " + kMotor, dir());
  ExpectRefused(c, r, dir() / "never.csv");
}

INSTANTIATE_TEST_SUITE_P(
    Step, InapplicableOptions,
    ::testing::Values(
        Inapplicable{"levels", "step --step 0:6 --levels 2,4", "--levels applies to locked-rotor plateaus"},
        Inapplicable{"hold", "step --step 0:6 --hold 1", "a step's hold is --after"},
        Inapplicable{"supply", "step --step 0:6 --supply 6", "--supply applies to spin-down only"},
        Inapplicable{"brake", "step --step 0:6 --brake-resistance 1", "--brake-resistance applies to spin-down"},
        Inapplicable{"torque", "step --step 0:6 --log-torque", "--log-torque applies to locked-rotor plateaus"},
        Inapplicable{"heating", "step --step 0:6 --heating-per-plateau 0.3", "--heating-per-plateau applies"},
        Inapplicable{"settle_from_rest", "step --step 0:6 --settle 1", "--settle applies to a step from a non-zero"},
        Inapplicable{"settle_no_load", "no-load --levels 2,4 --settle 1", "--settle applies to step only"},
        Inapplicable{"before_no_load", "no-load --levels 2,4 --before 1e-3", "--before applies to step captures"},
        Inapplicable{"after_plateaus", "locked-rotor --levels 2,4 --after 1e-2", "--after applies to step captures"},
        Inapplicable{"temperature_capture", "locked-rotor --step 0:4 --log-temperature",
                     "--log-temperature applies to locked-rotor plateaus, no-load and step"},
        Inapplicable{"cpr_locked", "locked-rotor --levels 2,4 --cpr 500", "applies to no-load, spin-down and step"},
        Inapplicable{"phase_without_encoder", "step --step 0:6 --encoder-start-phase 0.5", "needs an encoder (--cpr)"},
        Inapplicable{"no_levels", "step --after 0.01", "step needs --step FROM:TO"},
        Inapplicable{"bad_levels", "step --step 0:6V", "--step expects FROM:TO volts"},
        Inapplicable{"unknown_kind", "steps --step 0:6", "locked-rotor, no-load, spin-down or step"}),
    [](const ::testing::TestParamInfo<Inapplicable>& info) { return info.param.name; });

}  // namespace
}  // namespace coilspin::testing

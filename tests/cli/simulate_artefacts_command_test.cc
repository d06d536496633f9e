// End-to-end: a real rig's artefacts through `coilspin simulate`
// (src/cli/simulate_artefact_options.h): the options reach the log, read back
// from the CSV against their definitions (docs/bench-artefacts.md); options
// that do not apply exit 2 and write nothing; very high logging rates work.

#include <gtest/gtest.h>

#include <cmath>
#include <cstddef>
#include <string>
#include <vector>

#include "cli/inapplicable_options.h"
#include "cli/run_coilspin.h"
#include "cli/simulated_csv.h"

namespace coilspin::testing {
namespace {

// The demo motor (datasets-demo/README.md), invented.
const std::string kMotor =
    "--resistance 1.35 --inductance 0.82e-3 --brush-drop 0.9 --back-emf-constant 0.021 --inertia 3.2e-5 "
    "--viscous-friction 1.1e-5 --coulomb-friction 4.5e-3";
// The CSV writer keeps 10 significant digits (src/output/bench_log_csv.h).
constexpr double kWriterRelative = 1e-9;
constexpr double kStandardErrors = 4.0;  // common practice, as tests/model/sensor_chain_test.cc

class SimulateArtefactsCommand : public ::testing::Test {
 protected:
  SimulateArtefactsCommand() : folder_("simulate_artefacts") {}
  const std::filesystem::path& dir() const { return folder_.path(); }
  Csv Simulate(const std::string& arguments, const std::string& file) {
    const RunResult r = RunCoilspin("simulate " + arguments + " --out " + file + " " + kMotor, dir());
    EXPECT_EQ(r.status, 0) << r.err;
    return ReadCsv(dir() / file);
  }
  ScratchFolder folder_;
};

TEST_F(SimulateArtefactsCommand, HelpListsEveryArtefactWithItsUnit) {
  const RunResult r = RunCoilspin("simulate --help", dir());
  ASSERT_EQ(r.status, 0) << r.err;
  for (const char* text :
       {"--voltage-noise-correlation", "--current-noise-correlation", "--speed-noise-correlation",
        "--torque-noise-correlation", "--voltage-offset", "sensor [V]", "--current-offset", "sensor [A]",
        "--speed-offset", "sensor [rad/s]", "--torque-offset", "sensor [N*m]", "--speed-dropout-rate",
        "--current-spike-rate", "--spike-size", "full scales", "--speed-lsb", "--torque-lsb", "--ripple-segments",
        "--ripple-amplitude", "--ripple-phase", "[rad]", "--warm-up", "rise [K]", "--warm-up-time",
        "time constant [s]", "--drag", "[N*m*s^2/rad^2]", "--friction-wander", "sigma [N*m]",
        "--friction-wander-time", "correlation time [s]"}) {
    EXPECT_NE(r.out.find(text), std::string::npos) << text;
  }
}

TEST_F(SimulateArtefactsCommand, CurrentOffsetIsAddedToEveryReading) {
  // definition (docs/bench-artefacts.md): reading = x + o
  const std::string plan = "no-load --levels 3,6 --hold 0.3";
  const Csv plain = Simulate(plan, "plain.csv");
  const Csv offset = Simulate(plan + " --current-offset 0.0125", "offset.csv");
  ASSERT_EQ(plain.header[2], "current [A]");
  ASSERT_EQ(plain.rows.size(), offset.rows.size());
  for (std::size_t k = 0; k < plain.rows.size(); ++k) {
    const double expected = plain.rows[k][2] + 0.0125;
    ASSERT_NEAR(offset.rows[k][2], expected, kWriterRelative * std::abs(expected) + 1e-15) << "row " << k;
  }
}

TEST_F(SimulateArtefactsCommand, WarmUpIsLoggedInTheTemperatureColumn) {
  // closed form: θ_w(t) = θ_w0 + ΔT·(1 − e^(−t/τ_th)), plus the heating per plateau
  const Csv csv = Simulate(
      "locked-rotor --levels 2,3 --hold 2 --temperature 24 --warm-up 8 --warm-up-time 3 --heating-per-plateau 0.5 "
      "--log-temperature",
      "warm.csv");
  ASSERT_EQ(csv.header.back(), "temperature [degC]");
  ASSERT_EQ(csv.rows.size(), 4000u);
  for (std::size_t k = 0; k < csv.rows.size(); ++k) {
    const double t_s = csv.rows[k][0];
    const double expected = 24.0 + 8.0 * (1.0 - std::exp(-t_s / 3.0)) + (k < 2000 ? 0.0 : 0.5);
    ASSERT_NEAR(csv.rows[k].back(), expected, kWriterRelative * expected) << "row " << k;
  }
}

TEST_F(SimulateArtefactsCommand, TachometerDropoutsReadZeroAtTheRequestedRate) {
  const Csv csv = Simulate("no-load --levels 3,6 --hold 2 --speed-noise 0.3 --speed-noise-correlation 0.9 "
                           "--speed-dropout-rate 0.005 --seed 4",
                           "dropouts.csv");
  ASSERT_EQ(csv.header[3], "speed [rad/s]");
  int zeros = 0;
  for (const auto& row : csv.rows) zeros += row[3] == 0.0 ? 1 : 0;
  // binomial: mean n·p, SD √(n·p·(1 − p)) (the noisy speed itself is never exactly 0 here)
  const double n = static_cast<double>(csv.rows.size()), p = 0.005;
  EXPECT_NEAR(zeros, n * p, kStandardErrors * std::sqrt(n * p * (1.0 - p)));
}

TEST_F(SimulateArtefactsCommand, RippleRidesOnTheCurrentAtSevenTimesTheShaftAngle) {
  // definition: i_logged = i·(1 + a·cos(N·θ + φ0)), θ the motor shaft angle (logged exactly here)
  const std::string plan = "no-load --levels 6 --hold 0.5 --sample-period 1e-4 --log-speed-and-position";
  const Csv plain = Simulate(plan, "plain.csv");
  const Csv rippled = Simulate(plan + " --ripple-segments 7 --ripple-amplitude 0.02 --ripple-phase 1", "ripple.csv");
  ASSERT_EQ(rippled.header[4], "position [rad]");
  for (std::size_t k = 0; k < plain.rows.size(); ++k) {
    const double expected = plain.rows[k][2] * (1.0 + 0.02 * std::cos(7.0 * rippled.rows[k][4] + 1.0));
    ASSERT_NEAR(rippled.rows[k][2], expected, 2.0 * kWriterRelative * std::abs(expected) + 1e-15) << "row " << k;
  }
}

TEST_F(SimulateArtefactsCommand, SpinDownAt40kSamplesPerSecond) {
  // issue 9: a spin-down logged at 40 kS/s, 20 times a usual logger's rate
  const Csv csv = Simulate("spin-down --supply 6 --run 0.5 --coast 2 --sample-period 25e-6 --speed-noise 0.3 "
                           "--current-noise 0.002 --current-offset 0.01 --current-lsb 0.01",
                           "fast.csv");
  ASSERT_EQ(csv.rows.size(), 100000u);
  EXPECT_NEAR(csv.rows[1][0] - csv.rows[0][0], 25e-6, 1e-15);
  // the open-circuit coast reads the offset, quantised to the ADC step: 0.01 A (the offset
  // plus noise of σ = 0.002 A stays within half a step of 0.01 A except at 4σ-ish excursions)
  int at_offset = 0, coast = 0;
  for (std::size_t k = 20000; k < csv.rows.size(); ++k, ++coast) at_offset += csv.rows[k][2] == 0.01 ? 1 : 0;
  EXPECT_GT(at_offset, 0.98 * coast);
}

class InapplicableArtefacts : public SimulateArtefactsCommand, public ::testing::WithParamInterface<Inapplicable> {};

TEST_P(InapplicableArtefacts, ExitTwoAndWriteNothing) {
  const Inapplicable& c = GetParam();
  const RunResult r = RunCoilspin("simulate " + c.arguments + " --out never.csv " + kMotor, dir());
  ExpectRefused(c, r, dir() / "never.csv");
}

INSTANTIATE_TEST_SUITE_P(
    Artefacts, InapplicableArtefacts,
    ::testing::Values(
        Inapplicable{"ripple_locked", "locked-rotor --levels 2 --ripple-segments 7 --ripple-amplitude 0.01",
                     "--ripple-segments applies to no-load, spin-down and step only"},
        Inapplicable{"drag_locked", "locked-rotor --levels 2 --drag 1e-8", "--drag applies to no-load"},
        Inapplicable{"wander_locked", "locked-rotor --levels 2 --friction-wander 1e-4 --friction-wander-time 1",
                     "--friction-wander applies to no-load"},
        Inapplicable{"speed_offset_encoder", "no-load --levels 3 --cpr 500 --speed-offset 1",
                     "--speed-offset needs a speed column"},
        Inapplicable{"speed_lsb_locked", "locked-rotor --levels 2 --speed-lsb 0.1", "--speed-lsb needs a speed column"},
        Inapplicable{"torque_offset", "locked-rotor --levels 2 --torque-offset 0.01",
                     "--torque-offset needs a torque column"},
        Inapplicable{"current_offset_no_current", "spin-down --supply 6 --no-coast-current --current-offset 0.01",
                     "--current-offset needs a current column"},
        Inapplicable{"correlation_without_noise", "no-load --levels 3 --current-noise-correlation 0.9",
                     "give --current-noise"},
        Inapplicable{"correlation_one", "no-load --levels 3 --current-noise 0.01 --current-noise-correlation 1",
                     "must lie in (-1, 1)"},
        Inapplicable{"warm_up_alone", "locked-rotor --levels 2 --warm-up 5", "--warm-up needs --warm-up-time"},
        Inapplicable{"ripple_half", "no-load --levels 3 --ripple-amplitude 0.01",
                     "--ripple-amplitude needs --ripple-segments"},
        Inapplicable{"spike_rate_alone", "no-load --levels 3 --current-spike-rate 0.001", "needs --spike-size"},
        Inapplicable{"spike_size_alone", "no-load --levels 3 --spike-size 0.5", "--spike-size needs a spike rate"},
        Inapplicable{"dropout_rate_above_one", "no-load --levels 3 --speed-dropout-rate 2", "--speed-dropout-rate"}),
    [](const ::testing::TestParamInfo<Inapplicable>& info) { return info.param.name; });

}  // namespace
}  // namespace coilspin::testing

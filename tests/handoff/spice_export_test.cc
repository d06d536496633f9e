// `coilspin export --format spice` run in ngspice (Debian package ngspice), batch
// mode, on the demo motor:
//   - a supply step from rest, free shaft: the speed V(shaft) and the supply
//     current at the end agree with coilspin's own no-load speed and current at
//     that voltage (the result's `derived`, src/model/derived_quantities) to 1 %;
//   - the shaft held at 0 V (locked), a supply step: the current rises as
//     i(t) = (V − Vb)/R·(1 − e^(−t/τe)) (physics: the winding is an R–L circuit
//     behind the brush drop), so i(τe) = (1 − e^−1)·(V − Vb)/R to 1 %, with τe
//     and (V − Vb)/R the result's electrical_time_constant and stall_current.

#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <regex>

#include "reference/python_reference.h"
#include "result/fitted_results.h"

namespace coilspin::testing {
namespace {

// The transient runs a little past the instant measured: a .meas AT the very last time
// point is "out of interval" whenever the last step lands a rounding short of it.
constexpr double kRunPastMeasurement = 1.01;

bool NgspiceAvailable() { return std::system("ngspice --version >/dev/null 2>&1") == 0; }

// The value of `.meas` result `name` in ngspice's batch output.
double Measured(const std::string& output, const std::string& name) {
  std::smatch m;
  if (!std::regex_search(output, m, std::regex(name + R"(\s*=\s*([-+0-9.eE]+))"))) {
    ADD_FAILURE() << "no " << name << " in ngspice output:\n" << output;
    return NAN;
  }
  return std::stod(m[1]);
}

class SpiceExport : public ::testing::Test {
 protected:
  void SetUp() override {
    result_ = FittedResult(kDemoResult);
    json_ = nlohmann::json::parse(Slurp(result_));
    const RunResult r = RunCoilspin("export '" + result_.string() + "' --format spice --out motor.cir", folder_.path());
    ASSERT_EQ(r.status, 0) << r.err;
    subcircuit_ = Slurp(folder_.path() / "motor.cir");
  }
  std::string RunDeck(const std::string& deck) {
    folder_.Write("deck.cir", deck);
    return test_support::RunCapture("cd '" + folder_.path().string() + "' && ngspice -b deck.cir 2>&1");
  }
  double Derived(const char* key) { return json_["derived"][key]["value"].get<double>(); }

  ScratchFolder folder_{"spice"};
  std::filesystem::path result_;
  nlohmann::json json_;
  std::string subcircuit_;
};

TEST_F(SpiceExport, FirstLineIsTheSubcircuitWithItsThreePins) {
  EXPECT_EQ(subcircuit_.substr(0, subcircuit_.find('\n')), ".subckt dome_rotator_DR_2 p n shaft");
  EXPECT_NE(subcircuit_.find("tanh(V(shaft)/0.01)"), std::string::npos);  // smoothed Coulomb friction, width named
  EXPECT_NE(subcircuit_.find("* sgn(x) is smoothed as tanh(x/w)"), std::string::npos);
  EXPECT_NE(subcircuit_.find(".ends dome_rotator_DR_2"), std::string::npos);
}

TEST_F(SpiceExport, NoLoadSpeedAndCurrentMatchCoilspinsModel) {
  if (!NgspiceAvailable()) GTEST_SKIP() << "ngspice (Debian package) not installed";
  const double v = json_["derived"]["no_load_speed"]["at_voltage"];
  const double settle_s = 20.0 * Derived("mechanical_time_constant");  // e^-20 of the transient left
  char deck[1024];
  std::snprintf(deck, sizeof deck,
                "no-load step of the exported motor\n"
                ".include motor.cir\n"
                "V_supply sup 0 PWL(0 0 1e-3 0 1.001e-3 %.17g)\n"
                "X_motor sup 0 shaft dome_rotator_DR_2\n"
                ".tran 1e-4 %.17g 0 1e-3\n"
                ".meas tran speed_end FIND V(shaft) AT=%.17g\n"
                ".meas tran current_end FIND I(V_supply) AT=%.17g\n"
                ".end\n",
                v, kRunPastMeasurement * settle_s, settle_s, settle_s);
  const std::string output = RunDeck(deck);
  const double speed = Measured(output, "speed_end");
  const double current = -Measured(output, "current_end");  // I(V_supply) flows into its + pin
  EXPECT_NEAR(speed, Derived("no_load_speed"), 0.01 * Derived("no_load_speed")) << output;
  EXPECT_NEAR(current, Derived("no_load_current"), 0.01 * Derived("no_load_current")) << output;
}

TEST_F(SpiceExport, LockedShaftCurrentRisesWithTheElectricalTimeConstant) {
  if (!NgspiceAvailable()) GTEST_SKIP() << "ngspice (Debian package) not installed";
  const double v = json_["derived"]["stall_current"]["at_voltage"];
  const double tau_e = Derived("electrical_time_constant");
  const double start = 1e-4;
  char deck[1024];
  std::snprintf(deck, sizeof deck,
                "locked-shaft step of the exported motor\n"
                ".include motor.cir\n"
                "V_supply sup 0 PWL(0 0 %.17g 0 %.17g %.17g)\n"
                "X_motor sup 0 shaft dome_rotator_DR_2\n"
                "V_lock shaft 0 DC 0\n"
                ".tran %.17g %.17g 0 %.17g\n"
                ".meas tran current_tau FIND I(V_supply) AT=%.17g\n"
                ".meas tran current_end FIND I(V_supply) AT=%.17g\n"
                ".end\n",
                start, start + 1e-9, v, tau_e / 1000, start + 12 * tau_e, tau_e / 500, start + tau_e,
                start + 12 * tau_e);
  const std::string output = RunDeck(deck);
  const double stall = Derived("stall_current");
  EXPECT_NEAR(-Measured(output, "current_end"), stall, 0.01 * stall) << output;
  const double at_tau = (1.0 - std::exp(-1.0)) * stall;
  EXPECT_NEAR(-Measured(output, "current_tau"), at_tau, 0.01 * at_tau) << output;
}

}  // namespace
}  // namespace coilspin::testing

// End to end on logs that real rigs write and that coilspin once refused or
// misread (issue 9): a long flat run before a coast with coloured tachometer
// noise, a current sensor with a zero offset quantised to its ADC step, a coast
// logged at 40 kS/s, plateaus read through a 10 mV ADC, a locked-rotor step
// capture under coloured noise. Each log is made by `coilspin simulate` from
// known parameters; the checks are against those parameters (the truth) and
// the sample where the simulator switched the supply off.
// Also the exit status of point 7 of the issue: a test that contributed nothing,
// a --require'd ratio or derived quantity that is missing (1), an unknown key (2).

#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

// A motor with a flywheel: B/J = 0.05 /s, Tc/J = 10 rad/s^2, about 190 rad/s at 6 V,
// a coast of (J/B)·ln(1 + B·ω₀/Tc) ≈ 13 s (physics: the coast's closed form).
const std::string kFlywheel =
    " --resistance 2 --inductance 1e-3 --back-emf-constant 0.03 --inertia 2e-4 --viscous-friction 1e-5"
    " --coulomb-friction 2e-3";
constexpr double kFlywheelViscousOverInertia_per_s = 1e-5 / 2e-4;
constexpr double kFlywheelCoulombOverInertia_rad_s2 = 2e-3 / 2e-4;
// The same motor without the flywheel: a coast of about 1.3 s.
const std::string kBare =
    " --resistance 2 --inductance 1e-3 --back-emf-constant 0.03 --inertia 2e-5 --viscous-friction 1e-5"
    " --coulomb-friction 2e-3";
constexpr double kBareViscousOverInertia_per_s = 1e-5 / 2e-5;
constexpr double kBareCoulombOverInertia_rad_s2 = 2e-3 / 2e-5;
// The issue's recovery bounds: B 8 %, Tc 6 %, R 1 %, L 3 %; and no estimate beyond
// 4 standard errors of the truth (issue 9, point 8).
constexpr double kViscousBound = 0.08;
constexpr double kCoulombBound = 0.06;
constexpr double kResistanceBound = 0.01;
constexpr double kInductanceBound = 0.03;
constexpr double kMaxStandardErrors = 4.0;

class RealRigLogs : public ::testing::Test {
 protected:
  static void SetUpTestSuite() { folder_ = new ScratchFolder("real_rig"); }
  static void TearDownTestSuite() { delete folder_; }
  const std::filesystem::path& dir() const { return folder_->path(); }
  void Simulate(const std::string& arguments) const {
    const RunResult r = RunCoilspin("simulate " + arguments, dir());
    ASSERT_EQ(r.status, 0) << r.err;
  }
  nlohmann::json Fit(const std::string& arguments, const std::string& result, int expected_status = 0) const {
    const RunResult r = RunCoilspin("fit " + arguments + " --json " + result + " --quiet", dir());
    EXPECT_EQ(r.status, expected_status) << r.err;
    return nlohmann::json::parse(Slurp(dir() / result));
  }
  static ScratchFolder* folder_;
};
ScratchFolder* RealRigLogs::folder_ = nullptr;

void ExpectNear(const nlohmann::json& entry, double truth, double relative_bound, const std::string& what) {
  const double value = entry["value"];
  const double se = entry["std_error"];
  EXPECT_NEAR(value, truth, relative_bound * truth) << what;
  EXPECT_LE(std::abs(value - truth), kMaxStandardErrors * se) << what << ": " << value << " +- " << se;
}

bool AnyWarningContains(const nlohmann::json& j, const std::string& text) {
  for (const auto& w : j["warnings"])
    if (w.get<std::string>().find(text) != std::string::npos) return true;
  return false;
}

// Power off at "coast from sample N (current fell to zero)", N 1-based.
void ExpectCoastFromCurrent(const nlohmann::json& test, long truth_sample) {
  const std::string method = test["method"];
  const std::string from = "coast from sample ";
  ASSERT_EQ(method.rfind(from, 0), 0u) << method;
  const long sample = std::stol(method.substr(from.size()));
  EXPECT_LE(std::abs(sample - truth_sample), 1) << method;
  EXPECT_NE(method.find("(current fell to zero)"), std::string::npos) << method;
  EXPECT_TRUE(test["contributed"].get<bool>());
}

TEST_F(RealRigLogs, FlatRunBeforeACoastWithColouredTachometerNoise) {
  // 6 s at 6 V logged at 50 Hz before the supply is cut (sample 301), then the coast;
  // tachometer noise with lag-1 correlation 0.9 (issue 9: refused as "no coast").
  Simulate("spin-down --out flat.csv" + kFlywheel + " --supply 6 --run 6 --sample-period 0.02 --speed-noise 0.05 "
           "--speed-noise-correlation 0.9 --voltage-noise 0.01 --voltage-noise-correlation 0.9 "
           "--current-noise 0.002 --seed 4");
  const auto j = Fit("--spin-down flat.csv", "flat.json");
  ExpectCoastFromCurrent(j["tests"][0], 301);
  ExpectNear(j["ratios"]["viscous_over_inertia"], kFlywheelViscousOverInertia_per_s, kViscousBound, "B/J");
  ExpectNear(j["ratios"]["coulomb_over_inertia"], kFlywheelCoulombOverInertia_rad_s2, kCoulombBound, "Tc/J");
  EXPECT_FALSE(AnyWarningContains(j, "current flows during the coast"));
}

TEST_F(RealRigLogs, CurrentSensorWithAZeroOffsetQuantisedToItsStep) {
  // The sensor reads 0.01 A at zero current, in steps of 0.01 A (issue 9: σ came out
  // as 3e-12 A, power off was missed by seconds and every coast "braked").
  Simulate("spin-down --out offset.csv" + kFlywheel + " --supply 6 --run 3 --sample-period 0.01 --speed-noise 0.05 "
           "--voltage-noise 0.005 --current-noise 0.002 --current-offset 0.01 --current-lsb 0.01 --seed 5");
  const auto j = Fit("--spin-down offset.csv", "offset.json");
  ExpectCoastFromCurrent(j["tests"][0], 301);
  EXPECT_FALSE(AnyWarningContains(j, "current flows during the coast"));
  // The zero reading seen in the coast: the offset, to within a reading step.
  EXPECT_NEAR(j["sensor_offsets"]["current"]["value"].get<double>(), 0.01, 0.01);
  ExpectNear(j["ratios"]["viscous_over_inertia"], kFlywheelViscousOverInertia_per_s, kViscousBound, "B/J");
  ExpectNear(j["ratios"]["coulomb_over_inertia"], kFlywheelCoulombOverInertia_rad_s2, kCoulombBound, "Tc/J");
}

TEST_F(RealRigLogs, CoastLoggedAt40kSamplesPerSecond) {
  // 20 times a usual logger's rate (issue 9: refused as "no coast").
  Simulate("spin-down --out fast.csv" + kBare + " --supply 6 --run 0.5 --sample-period 25e-6 --speed-noise 0.3 "
           "--voltage-noise 0.01 --current-noise 0.002 --current-offset 0.01 --current-lsb 0.01 --seed 6");
  const auto j = Fit("--spin-down fast.csv", "fast.json");
  ExpectCoastFromCurrent(j["tests"][0], 20001);
  ExpectNear(j["ratios"]["viscous_over_inertia"], kBareViscousOverInertia_per_s, kViscousBound, "B/J");
  ExpectNear(j["ratios"]["coulomb_over_inertia"], kBareCoulombOverInertia_rad_s2, kCoulombBound, "Tc/J");
}

TEST_F(RealRigLogs, PlateausReadThroughA10mVAdc) {
  // Voltage readings in 10 mV steps and current in 1 mA steps, noise below a step:
  // every level is still a plateau (they were trimmed to their first sample, since
  // a reading one step off the level's mean lay beyond 4 σ ≈ 0) and R comes out within 1 %.
  Simulate("locked-rotor --out adc.csv --resistance 2.2 --inductance 1e-3 --levels 1,2,3,4,-2,-3 --hold 0.3 "
           "--voltage-noise 0.002 --current-noise 0.0005 --voltage-lsb 0.01 --current-lsb 0.001 --seed 7");
  const auto j = Fit("--locked-rotor adc.csv", "adc.json");
  const std::string method = j["tests"][0]["method"];
  EXPECT_EQ(method.rfind("plateaus: 6 settled levels", 0), 0u) << method;
  ExpectNear(j["parameters"]["resistance"], 2.2, kResistanceBound, "R");
}

TEST_F(RealRigLogs, StepCaptureUnderColouredNoiseIsAStep) {
  // Both channels with lag-1 noise correlation 0.9 (issue 9: taken for "plateaus:
  // 2 settled levels" and L lost).
  Simulate("locked-rotor --out capture.csv --resistance 2 --inductance 1e-3 --step 0:5 --before 1e-3 --after 8e-3 "
           "--sample-period 5e-6 --voltage-noise 0.005 --voltage-noise-correlation 0.9 --current-noise 0.005 "
           "--current-noise-correlation 0.9 --seed 8");
  const auto j = Fit("--locked-rotor capture.csv", "capture.json");
  const std::string method = j["tests"][0]["method"];
  EXPECT_EQ(method.rfind("step capture", 0), 0u) << method;
  ExpectNear(j["parameters"]["inductance"], 1e-3, kInductanceBound, "L");
  ExpectNear(j["parameters"]["resistance"], 2.0, kResistanceBound, "R");
}

TEST_F(RealRigLogs, OneCurrentSensorsZeroSeenInTheCoastCorrectsEveryLog) {
  // One bench, one current probe reading 0.03 A at zero current (1 % of a 3 A range):
  // the spin-down's open-circuit coast shows it, and it corrects the no-load plateaus
  // (which never rest) and the locked-rotor plateaus (issue 9, point 3).
  const std::string sensor = " --current-noise 0.003 --current-offset 0.03";
  Simulate("spin-down --out sd.csv" + kBare + " --supply 6 --run 0.5 --speed-noise 0.2 --voltage-noise 0.005" +
           sensor + " --seed 11");
  // Each level held 1 s, some 20 mechanical time constants (a level held only the
  // simulator's default of 10 leaves about 1 % of its step in the settled mean, since
  // only the first quarter is dropped: a hold rule for the user, docs/methods.md).
  Simulate("no-load --out nl.csv" + kBare + " --levels 2,4,6,8,10 --hold 1 --speed-noise 0.2 --voltage-noise 0.005" +
           sensor + " --seed 12");
  Simulate("locked-rotor --out lr.csv" + kBare + " --levels 1,2,3,4 --hold 0.3 --voltage-noise 0.002" + sensor +
           " --seed 13");
  const std::string logs = "--spin-down sd.csv --no-load nl.csv --locked-rotor lr.csv";
  const auto one = Fit(logs, "one.json");
  ExpectNear(one["sensor_offsets"]["current"], 0.03, 0.01, "i_z");
  ExpectNear(one["parameters"]["resistance"], 2.0, kResistanceBound, "R");
  ExpectNear(one["parameters"]["viscous_friction"], 1e-5, kViscousBound, "B");
  ExpectNear(one["parameters"]["coulomb_friction"], 2e-3, kCoulombBound, "Tc");
  EXPECT_EQ(one["settings"]["current_sensors"], "one");

  // The session says the sensors differ: no log corrects another, i_z is not
  // estimated, and every current-dependent parameter names the assumption.
  folder_->Write("per-log.toml",
                 "[bench]\ncurrent_sensors = \"per-log\"\n"
                 "[[test]]\nkind = \"spin-down\"\nfile = \"sd.csv\"\n"
                 "[[test]]\nkind = \"no-load\"\nfile = \"nl.csv\"\n"
                 "[[test]]\nkind = \"locked-rotor\"\nfile = \"lr.csv\"\n");
  const auto separate = Fit("per-log.toml", "per-log.json");
  EXPECT_FALSE(separate["sensor_offsets"].contains("current"));
  EXPECT_EQ(separate["settings"]["current_sensors"], "per-log");
  for (const char* key : {"resistance", "viscous_friction", "coulomb_friction"}) {
    bool named = false;
    for (const auto& a : separate["parameters"][key]["assumes"])
      named = named || a.get<std::string>().find("sensors differ") != std::string::npos;
    EXPECT_TRUE(named) << key;
  }
  // A misspelt value is bad input naming the line.
  folder_->Write("bad-sensors.toml", "[bench]\ncurrent_sensors = \"two\"\n[[test]]\nkind = \"spin-down\"\n"
                                     "file = \"sd.csv\"\n");
  const RunResult bad = RunCoilspin("fit bad-sensors.toml", dir());
  EXPECT_EQ(bad.status, 2);
  EXPECT_NE(bad.err.find("bad-sensors.toml:2"), std::string::npos) << bad.err;
}

TEST_F(RealRigLogs, SpinDownWithoutACoastExitsOneAndSaysWhichRule) {
  // The log ends 10 samples after the supply is cut: no coast a fit can use.
  Simulate("spin-down --out short.csv" + kBare + " --supply 6 --run 0.5 --coast 0.01 --seed 9");
  const RunResult r = RunCoilspin("fit --spin-down short.csv --json short.json", dir());
  EXPECT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.err.find("short.csv: the spin-down log contributed nothing"), std::string::npos) << r.err;
  const auto j = nlohmann::json::parse(Slurp(dir() / "short.json"));
  EXPECT_FALSE(j["tests"][0]["contributed"].get<bool>());
  EXPECT_TRUE(AnyWarningContains(j, "no coast: ")) << j["warnings"];
}

TEST_F(RealRigLogs, RequiredRatioOrDerivedQuantityMissingExitsOneUnknownKeyExitsTwo) {
  Simulate("locked-rotor --out lr.csv --resistance 2 --inductance 1e-3 --levels 1,2,3 --hold 0.3 "
           "--voltage-noise 0.002 --current-noise 0.002 --seed 10");
  // A ratio of the mechanical tests, from a locked-rotor log alone: missing.
  RunResult r = RunCoilspin("fit --locked-rotor lr.csv --require viscous_over_inertia --quiet", dir());
  EXPECT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.err.find("viscous_over_inertia"), std::string::npos) << r.err;
  // A derived quantity that needs Ke: missing.
  r = RunCoilspin("fit --locked-rotor lr.csv --require no_load_speed --quiet", dir());
  EXPECT_EQ(r.status, 1) << r.err;
  EXPECT_NE(r.err.find("no_load_speed"), std::string::npos) << r.err;
  // A key coilspin does not know: bad input, before any log is read.
  r = RunCoilspin("fit --locked-rotor lr.csv --require resistence --quiet", dir());
  EXPECT_EQ(r.status, 2) << r.err;
  EXPECT_NE(r.err.find("resistence"), std::string::npos) << r.err;
  // What is there passes.
  r = RunCoilspin("fit --locked-rotor lr.csv --require resistance --quiet", dir());
  EXPECT_EQ(r.status, 0) << r.err;
}

}  // namespace
}  // namespace coilspin::testing

// Controller tuning (src/tune): the design rules at cases whose answer is known
// in closed form, and `coilspin tune` end to end on the demo motor, checked by
// tests/handoff/tune_check.py against the textbook rules (Skogestad 2003 SIMC;
// pole–zero cancellation), SciPy's frequency response and closed-loop steps.

#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>

#include "reference/python_reference.h"
#include "result/fitted_results.h"
#include "src/result/result_reader.h"
#include "src/tune/cascade_design.h"
#include "src/tune/loop_margins.h"
#include "src/tune/tuning.h"

namespace coilspin::testing {
namespace {

model::MotorParameters Motor() {
  model::MotorParameters p;
  p.resistance_ohm = 1.35;
  p.inductance_H = 0.82e-3;
  p.back_emf_constant_V_s_per_rad = 0.021;
  p.torque_constant_N_m_per_A = 0.021;
  p.inertia_kg_m2 = 3.2e-5;
  p.viscous_friction_N_m_s_per_rad = 1.1e-5;
  return p;
}

TEST(CascadeDesign, CurrentLoopCancelsTheWindingPole) {
  const model::MotorParameters p = Motor();
  const double wc = 2.0 * M_PI * 1000.0;
  const tune::PiGains g = tune::CurrentLoopGains(p, wc);
  EXPECT_DOUBLE_EQ(g.kp, p.inductance_H * wc);
  EXPECT_DOUBLE_EQ(g.ki / g.kp, p.resistance_ohm / p.inductance_H);  // PI zero on the pole R/L
  // Default: 5/τe (the rule named in cascade_design.h).
  EXPECT_DOUBLE_EQ(tune::DefaultCurrentBandwidth_rad_s(p), 5.0 * p.resistance_ohm / p.inductance_H);
}

TEST(CascadeDesign, WithoutBackEmfTheCurrentLoopIsAnIntegratorWithNinetyDegrees) {
  // With Ke → 0 the open loop is exactly ωc/s: crossover ωc, margin 90° (physics of the cancellation).
  model::MotorParameters p = Motor();
  p.back_emf_constant_V_s_per_rad = 1e-12;
  const double wc = 3000.0;
  const auto m = tune::CurrentLoopMargin(p, tune::CurrentLoopGains(p, wc), wc);
  ASSERT_TRUE(m);
  EXPECT_NEAR(m->crossover_rad_s, wc, 1e-6 * wc);
  EXPECT_NEAR(m->phase_margin_deg, 90.0, 1e-6);
}

TEST(CascadeDesign, SpeedLoopIsSimcIntegratingWhenThereIsNoFriction) {
  // Skogestad 2003 (from memory), integrating process k'·e^(−θs)/s: Kc = 1/(k'(τc + θ)), τI = 4(τc + θ),
  // here k' = Kt/J and θ = 1/(2ωc) (half rule on the current loop's lag).
  model::MotorParameters p = Motor();
  p.viscous_friction_N_m_s_per_rad = 0.0;
  const double wc = 4000.0, ws = 400.0;
  const double theta = 0.5 / wc, tauc = 1.0 / ws;
  const tune::PiGains g = tune::SpeedLoopGains(p, wc, ws);
  const double kc = 1.0 / (p.torque_constant_N_m_per_A / p.inertia_kg_m2 * (tauc + theta));
  EXPECT_NEAR(g.kp, kc, 1e-12 * kc);
  EXPECT_NEAR(g.ki, kc / (4.0 * (tauc + theta)), 1e-12 * kc / (tauc + theta));
  const auto m = tune::SpeedLoopMargin(p, tune::CurrentLoopGains(p, wc), g, ws);
  ASSERT_TRUE(m);  // found through the −180° the PI and the integrating shaft start at
  EXPECT_GT(m->phase_margin_deg, 30.0);
  EXPECT_LT(m->phase_margin_deg, 90.0);
}

TEST(CascadeDesign, SlowMechanicsGiveTheFirstOrderRuleWithItsOwnIntegralTime) {
  // Heavy friction: τ1' = J/B + θ is below 4(τc + θ), so τI = τ1' (Skogestad 2003).
  model::MotorParameters p = Motor();
  p.viscous_friction_N_m_s_per_rad = 1e-2;  // J/B = 3.2 ms
  const double wc = 4000.0, ws = 100.0;
  const double theta = 0.5 / wc, tauc = 1.0 / ws, tau1 = p.inertia_kg_m2 / p.viscous_friction_N_m_s_per_rad + theta;
  ASSERT_LT(tau1, 4.0 * (tauc + theta));
  const tune::PiGains g = tune::SpeedLoopGains(p, wc, ws);
  const double kc = tau1 / (p.torque_constant_N_m_per_A / p.viscous_friction_N_m_s_per_rad * (tauc + theta));
  EXPECT_NEAR(g.kp, kc, 1e-12 * kc);
  EXPECT_NEAR(g.kp / g.ki, tau1, 1e-12 * tau1);
}

TEST(TuneGainIntervals, CurrentGainsScaleTheirParametersIntervals) {
  // kp = L·ωc with ωc fixed: se(kp) = ωc·se(L) exactly (delta method of a linear function).
  const auto path = FittedResult(kDemoResult);
  const MotorEstimate e = result::ReadResultFile(path.string()).estimate;
  const result::ModelParameters p = result::ModelParametersOf(e);
  ASSERT_TRUE(p.complete());
  tune::TuningRequest request;
  request.current_bandwidth_rad_s = 5000.0;
  const tune::Tuning t = tune::TuneCascade(e, p, request);
  EXPECT_NEAR(t.current.kp.std_error, 5000.0 * e.Find("inductance")->std_error, 1e-6 * t.current.kp.std_error);
  EXPECT_NEAR(t.current.ki.std_error, 5000.0 * e.Find("resistance")->std_error, 1e-6 * t.current.ki.std_error);
  EXPECT_LT(t.current.kp.ci_low, t.current.kp.value);
  EXPECT_GT(t.current.kp.ci_high, t.current.kp.value);
  EXPECT_GT(t.speed.kp.std_error, 0.0);
}

TEST(TuneCommand, GainsMarginsAndStepsAgreeWithTheTextbookAndSciPy) {
  if (!test_support::SciPyAvailable()) GTEST_SKIP() << "SciPy (python3-scipy) not available at " << COILSPIN_PYTHON;
  ScratchFolder folder("tune");
  const auto result = FittedResult(kDemoResult);
  const RunResult r = RunCoilspin("tune '" + result.string() + "' --json tuning.json", folder.path());
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_NE(r.out.find("phase margin"), std::string::npos) << r.out;
  const auto tuning = nlohmann::json::parse(Slurp(folder.path() / "tuning.json"));
  EXPECT_EQ(tuning["format"], "coilspin.tuning/1");
  EXPECT_EQ(tuning["current_loop"]["kp"]["unit"], "V/A");
  const std::string output = test_support::RunCapture(
      std::string(COILSPIN_PYTHON) + " '" + COILSPIN_TEST_SOURCE_DIR + "/handoff/tune_check.py' '" + result.string() +
      "' '" + (folder.path() / "tuning.json").string() + "' 2>&1; echo \"exit $?\"");
  EXPECT_NE(output.find("exit 0"), std::string::npos) << output;
  // Given bandwidths, the same checks.
  ASSERT_EQ(RunCoilspin("tune '" + result.string() + "' --current-bandwidth 800 --speed-bandwidth 40 --json given.json "
                        "--quiet",
                        folder.path())
                .status,
            0);
  const auto given = nlohmann::json::parse(Slurp(folder.path() / "given.json"));
  EXPECT_EQ(given["current_loop"]["bandwidth_hz"], 800.0);
  EXPECT_EQ(given["current_loop"]["bandwidth_basis"], "given");
  const std::string again = test_support::RunCapture(
      std::string(COILSPIN_PYTHON) + " '" + COILSPIN_TEST_SOURCE_DIR + "/handoff/tune_check.py' '" + result.string() +
      "' '" + (folder.path() / "given.json").string() + "' 2>&1; echo \"exit $?\"");
  EXPECT_NE(again.find("exit 0"), std::string::npos) << again;
}

TEST(TuneCommand, MissingParametersAreExitOneAndBadBandwidthsExitTwo) {
  ScratchFolder folder("tune_errors");
  RunResult r = RunCoilspin("tune '" + FittedResult(kBootstrapResult).string() + "' --json t.json", folder.path());
  EXPECT_EQ(r.status, 1);
  EXPECT_NE(r.err.find("inertia"), std::string::npos) << r.err;
  EXPECT_FALSE(std::filesystem::exists(folder.path() / "t.json"));
  r = RunCoilspin("tune '" + FittedResult(kDemoResult).string() + "' --current-bandwidth 100 --speed-bandwidth 200",
                  folder.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("below the current loop's"), std::string::npos) << r.err;
  EXPECT_EQ(RunCoilspin("tune '" + FittedResult(kDemoResult).string() + "' --current-bandwidth -5", folder.path()).status,
            2);
}

}  // namespace
}  // namespace coilspin::testing

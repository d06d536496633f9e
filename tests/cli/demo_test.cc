// The demo recovers the invented truth it was made from (datasets-demo/README.md):
// R = 1.35 ohm at 20 degC, i.e. 1.35·(234.5 + 25)/(234.5 + 20) at 25 degC
// (copper law, IEC 60028 constant); L = 0.82 mH; Vb = 0.9 V;
// Ke = Kt = 0.021 V·s/rad, J = 3.2e-5 kg·m², B = 1.1e-5 N·m·s/rad, Tc = 4.5e-3 N·m.
// Demo data is invented, so this checks the demo, not the method (tests/locked_rotor,
// tests/free_shaft and the coverage benchmark do that). One fixed bench of seven
// parameters: each 95 % interval misses its truth 5 % of the time by design, so the
// check asks for the truth within 3 standard errors (a 0.3 % miss per parameter for a
// normal estimate; statistics: normal tail), which a wrong estimate still fails.

#include <gtest/gtest.h>

#include <cmath>

#include <nlohmann/json.hpp>

#include "cli/run_coilspin.h"

namespace coilspin::testing {
namespace {

TEST(Demo, RecoversTheInventedMotorWithinThreeStandardErrors) {
  ScratchFolder folder("demo");
  const RunResult r = RunCoilspin("demo --json demo.json", folder.path());
  ASSERT_EQ(r.status, 0) << r.err;
  const auto j = nlohmann::json::parse(Slurp(folder.path() / "demo.json"));
  const struct {
    const char* key;
    double truth;
  } truths[] = {{"resistance", 1.35 * (234.5 + 25.0) / (234.5 + 20.0)},
                {"inductance", 0.82e-3},
                {"brush_drop", 0.9},
                {"back_emf_constant", 0.021},
                {"inertia", 3.2e-5},
                {"viscous_friction", 1.1e-5},
                {"coulomb_friction", 4.5e-3}};
  for (const auto& t : truths) {
    const auto& p = j["parameters"][t.key];
    EXPECT_LE(std::fabs(p["value"].get<double>() - t.truth), 3.0 * p["std_error"].get<double>()) << t.key;
  }
  EXPECT_EQ(j["motor"]["label"], "dome rotator DR-2");
  EXPECT_EQ(j["tests"][1]["file"], "locked-rotor-step.csv");
  EXPECT_EQ(j["parameters"]["torque_constant"]["basis"], "equal-to-Ke");
  EXPECT_EQ(j["consistency"]["verdict"], "not-checked");
  EXPECT_EQ(j["torque_speed"]["points"].size(), 11u);
}

}  // namespace
}  // namespace coilspin::testing

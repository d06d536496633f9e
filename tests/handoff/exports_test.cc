// `coilspin export` end to end on real result files (tests/result/fitted_results.h):
// the state-space model against SciPy (tests/handoff/state_space_check.py), the
// C++ header compiled by the system compiler into a program that prints its
// values, the torque–speed CSV against the result, and the exit status of each
// failure (docs/exports.md; exit codes from the interface contract).

#include <gtest/gtest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <sstream>

#include "reference/python_reference.h"
#include "result/fitted_results.h"

namespace coilspin::testing {
namespace {

nlohmann::json ParseFile(const std::filesystem::path& path) { return nlohmann::json::parse(Slurp(path)); }

class Exports : public ::testing::Test {
 protected:
  RunResult Export(const std::filesystem::path& result, const std::string& format, const std::string& out) {
    return RunCoilspin("export '" + result.string() + "' --format " + format + " --out " + out, folder_.path());
  }
  ScratchFolder folder_{"exports"};
};

TEST_F(Exports, StateSpaceMatricesAreTheModelsEquations) {
  const auto result = FittedResult(kDemoResult);
  ASSERT_EQ(Export(result, "state-space", "ss.json").status, 0);
  const auto ss = ParseFile(folder_.path() / "ss.json");
  const auto j = ParseFile(result);
  const auto p = [&](const char* key) { return j["parameters"][key]["value"].get<double>(); };
  // docs/methods.md §1: L di/dt = v − R i − Ke ω − Vb sgn(i);  J dω/dt = Kt i − B ω − Tc sgn(ω) − τ_load.
  EXPECT_EQ(ss["format"], "coilspin.state-space/1");
  EXPECT_DOUBLE_EQ(ss["A"][0][0].get<double>(), -p("resistance") / p("inductance"));
  EXPECT_DOUBLE_EQ(ss["A"][0][1].get<double>(), -p("back_emf_constant") / p("inductance"));
  EXPECT_DOUBLE_EQ(ss["A"][1][0].get<double>(), p("torque_constant") / p("inertia"));
  EXPECT_DOUBLE_EQ(ss["A"][1][1].get<double>(), -p("viscous_friction") / p("inertia"));
  EXPECT_DOUBLE_EQ(ss["B"][0][0].get<double>(), 1.0 / p("inductance"));
  EXPECT_DOUBLE_EQ(ss["B"][1][1].get<double>(), -1.0 / p("inertia"));
  EXPECT_EQ(ss["offsets"]["brush_drop"]["value"].get<double>(), p("brush_drop"));
  EXPECT_EQ(ss["offsets"]["coulomb_friction"]["value"].get<double>(), p("coulomb_friction"));
}

TEST_F(Exports, StateSpaceStepAgreesWithSciPy) {
  if (!test_support::SciPyAvailable()) GTEST_SKIP() << "SciPy (python3-scipy) not available at " << COILSPIN_PYTHON;
  const auto result = FittedResult(kDemoResult);
  ASSERT_EQ(Export(result, "state-space", "ss.json").status, 0);
  const std::string command = std::string(COILSPIN_PYTHON) + " '" + COILSPIN_TEST_SOURCE_DIR +
                              "/handoff/state_space_check.py' '" + result.string() + "' '" +
                              (folder_.path() / "ss.json").string() + "' 2>&1; echo \"exit $?\"";
  const std::string output = test_support::RunCapture(command);
  EXPECT_NE(output.find("exit 0"), std::string::npos) << output;
}

TEST_F(Exports, CHeaderCompilesAndHoldsTheResultsValues) {
  const auto result = FittedResult(kDemoResult);
  ASSERT_EQ(Export(result, "c-header", "motor.h").status, 0);
  folder_.Write("print.cc",
                "#include <cstdio>\n#include \"motor.h\"\n"
                "static_assert(dome_rotator_DR_2::resistance_ohm > 0.0, \"constexpr\");\n"
                "int main() {\n"
                "  std::printf(\"%.17g %.17g %.17g %.17g %.17g %.17g\\n\", dome_rotator_DR_2::resistance_ohm,\n"
                "              dome_rotator_DR_2::torque_constant_N_m_per_A, dome_rotator_DR_2::inertia_kg_m2,\n"
                "              dome_rotator_DR_2::speed_constant_si_rad_per_s_V,\n"
                "              dome_rotator_DR_2::no_load_speed_rad_per_s, dome_rotator_DR_2::at_voltage_V);\n"
                "}\n");
  const std::string build = test_support::RunCapture("cd '" + folder_.path().string() + "' && '" +
                                                     COILSPIN_CXX_COMPILER +
                                                     "' -std=c++17 -Wall -Wextra -Werror print.cc -o print 2>&1; "
                                                     "echo \"exit $?\"");
  ASSERT_NE(build.find("exit 0"), std::string::npos) << build << Slurp(folder_.path() / "motor.h");
  std::istringstream printed(test_support::RunCapture("'" + (folder_.path() / "print").string() + "'"));
  const auto j = ParseFile(result);
  for (const double expected :
       {j["parameters"]["resistance"]["value"].get<double>(), j["parameters"]["torque_constant"]["value"].get<double>(),
        j["parameters"]["inertia"]["value"].get<double>(), j["derived"]["speed_constant_si"]["value"].get<double>(),
        j["derived"]["no_load_speed"]["value"].get<double>(), j["derived"]["no_load_speed"]["at_voltage"].get<double>()}) {
    double value = NAN;
    printed >> value;
    EXPECT_EQ(value, expected);  // every digit: the header holds the result's doubles
  }
}

TEST_F(Exports, TorqueSpeedCsvIsTheLineWithItsBand) {
  const auto result = FittedResult(kDemoResult);
  ASSERT_EQ(Export(result, "csv", "line.csv").status, 0);
  const auto j = ParseFile(result);
  const auto p = [&](const char* key) { return j["parameters"][key]["value"].get<double>(); };
  std::istringstream csv(Slurp(folder_.path() / "line.csv"));
  std::string line;
  while (std::getline(csv, line) && line[0] == '#') {
  }
  EXPECT_EQ(line, "speed [rad/s],torque [N*m],torque_low [N*m],torque_high [N*m]");
  const double v = j["torque_speed"]["at_voltage"];
  std::size_t rows = 0;
  while (std::getline(csv, line)) {
    double speed, torque, low, high;
    ASSERT_EQ(std::sscanf(line.c_str(), "%lf,%lf,%lf,%lf", &speed, &torque, &low, &high), 4) << line;
    const auto& point = j["torque_speed"]["points"][rows++];
    EXPECT_EQ(speed, point["speed"].get<double>());
    EXPECT_EQ(torque, point["torque"].get<double>());
    EXPECT_LT(low, torque);
    EXPECT_GT(high, torque);
    // docs/methods.md §6: τ(ω) = Kt·(V − Vb − Ke·ω)/R − B·ω − Tc.
    const double line_torque = p("torque_constant") * (v - p("brush_drop") - p("back_emf_constant") * speed) /
                                   p("resistance") -
                               p("viscous_friction") * speed - p("coulomb_friction");
    EXPECT_NEAR(torque, line_torque, 1e-12);
  }
  EXPECT_EQ(rows, j["torque_speed"]["points"].size());
}

TEST_F(Exports, AFormat1ResultExportsToo) {
  const std::string v1 = std::string(COILSPIN_TEST_SOURCE_DIR) + "/result/data/demo-format-1.json";
  const RunResult r = Export(v1, "state-space", "ss1.json");
  ASSERT_EQ(r.status, 0) << r.err;
  EXPECT_EQ(ParseFile(folder_.path() / "ss1.json")["source"]["format"], "coilspin.result/1");
}

TEST_F(Exports, WhatTheResultCannotGiveIsExitOneAndNothingWritten) {
  // Plateaus alone determine R and Vb but not L, Ke, J: no dynamic model.
  const auto result = FittedResult(kBootstrapResult);
  const RunResult r = Export(result, "spice", "none.cir");
  EXPECT_EQ(r.status, 1);
  EXPECT_NE(r.err.find("inductance: needs a locked-rotor step capture"), std::string::npos) << r.err;
  EXPECT_FALSE(std::filesystem::exists(folder_.path() / "none.cir"));
  // The header holds what there is.
  EXPECT_EQ(Export(result, "c-header", "some.h").status, 0);
}

TEST_F(Exports, BadInputIsExitTwo) {
  folder_.Write("broken.json", "{\"format\": \"coilspin.result/2\",\n \"confidence\": }\n");
  RunResult r = Export(folder_.path() / "broken.json", "spice", "x.cir");
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("broken.json:2:16: not a JSON file"), std::string::npos) << r.err;
  r = Export(folder_.path() / "missing.json", "spice", "x.cir");
  EXPECT_EQ(r.status, 2);
  EXPECT_NE(r.err.find("missing.json"), std::string::npos) << r.err;
  r = Export(FittedResult(kDemoResult), "verilog", "x.v");
  EXPECT_EQ(r.status, 2);
  r = RunCoilspin("export '" + FittedResult(kDemoResult).string() + "' --format spice --out x.cir --name '1 bad'",
                  folder_.path());
  EXPECT_EQ(r.status, 2);
  EXPECT_FALSE(std::filesystem::exists(folder_.path() / "x.cir"));
}

}  // namespace
}  // namespace coilspin::testing

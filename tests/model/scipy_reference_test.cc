// Checks against SciPy, an outside reference (python3-scipy from Debian):
// tests/reference/scipy_step_fit.py fits the zero-order-hold step model with
// scipy.optimize.least_squares, tests/reference/scipy_locked_rotor_sim.py
// integrates the locked-rotor ODE with scipy.integrate.solve_ivp. Skipped,
// with a message naming SciPy, when COILSPIN_PYTHON cannot import it.

#include <gtest/gtest.h>
#include <stdlib.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <string>
#include <vector>

#include "src/model/simulate_locked_rotor.h"
#include "src/output/bench_log_csv.h"

namespace coilspin::model {
namespace {

namespace fs = std::filesystem;

constexpr double kStandardErrors = 4.0;  // common practice: a fixed seed, a 4-SE band

std::string Quoted(const std::string& text) { return "'" + text + "'"; }

std::string Number(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.17g", value);
  return buffer;
}

bool SciPyAvailable() {
  const std::string python = COILSPIN_PYTHON;
  if (python.empty()) return false;
  const std::string probe = Quoted(python) + " -c 'import scipy.optimize, scipy.integrate' >/dev/null 2>&1";
  return std::system(probe.c_str()) == 0;
}

class SciPyReferenceTest : public ::testing::Test {
 protected:
  void SetUp() override {
    if (!SciPyAvailable()) {
      GTEST_SKIP() << "SciPy (python3-scipy) is not importable by " << COILSPIN_PYTHON
                   << "; install python3-scipy to run this outside-reference check";
    }
    std::string pattern = (fs::temp_directory_path() / "coilspin-scipy-XXXXXX").string();
    ASSERT_NE(::mkdtemp(pattern.data()), nullptr);
    dir_ = pattern;
  }
  void TearDown() override {
    if (!dir_.empty()) fs::remove_all(dir_);
  }

  // Runs tests/reference/<script> with `arguments`; returns its stdout, *status its exit status.
  std::string RunScript(const std::string& script, const std::string& arguments, int* status) {
    const fs::path out = dir_ / "stdout.txt";
    const fs::path err = dir_ / "stderr.txt";
    const std::string command = Quoted(COILSPIN_PYTHON) + " " +
                                Quoted(std::string(COILSPIN_TEST_SOURCE_DIR) + "/reference/" + script) +
                                " " + arguments + " >" + Quoted(out.string()) + " 2>" +
                                Quoted(err.string());
    *status = std::system(command.c_str());
    std::ifstream in(out);
    std::ostringstream text;
    text << in.rdbuf();
    std::ifstream in_err(err);
    std::ostringstream error_text;
    error_text << in_err.rdbuf();
    last_stderr_ = error_text.str();
    return text.str();
  }

  fs::path dir_;
  std::string last_stderr_;
};

// The number after `"field":` inside the object that follows `"key":` (or at the top level
// when key is empty). Enough for the flat JSON the script prints.
double JsonNumber(const std::string& json, const std::string& key, const std::string& field) {
  std::size_t at = 0;
  if (!key.empty()) {
    at = json.find("\"" + key + "\"");
    if (at == std::string::npos) throw std::runtime_error("no key " + key + " in " + json);
  }
  at = json.find("\"" + field + "\"", at);
  if (at == std::string::npos) throw std::runtime_error("no field " + field + " in " + json);
  at = json.find(':', at);
  return std::stod(json.substr(at + 1));
}

MotorParameters StepMotor() {
  MotorParameters motor;
  motor.resistance_ohm = 2.2;
  motor.inductance_H = 1.5e-3;
  motor.brush_drop_V = 0.4;
  return motor;
}

StepPlan TwelveVoltStep() {
  StepPlan plan;
  plan.supply_before_V = 0.0;
  plan.supply_after_V = 12.0;
  plan.before_s = 0.5e-3;
  plan.after_s = 10e-3;
  plan.sample_period_s = 10e-6;
  return plan;
}

std::string StepFitArguments(const fs::path& log, const MotorParameters& motor) {
  // starting values 20 % off the truth
  return Quoted(log.string()) + " --brush-drop " + Number(motor.brush_drop_V) + " --resistance " +
         Number(1.2 * motor.resistance_ohm) + " --inductance " + Number(0.8 * motor.inductance_H);
}

TEST_F(SciPyReferenceTest, StepFitRecoversTheTruthFromAnExactLog) {
  // physics: with an ideal supply (R_s = 0) the logged v is piecewise constant between
  // samples, so the zero-order-hold model the script fits is exact; SciPy least_squares
  // must return the simulated R and L, and a residual at the CSV's 10-digit rounding.
  const MotorParameters motor = StepMotor();
  const SampledLog log = SimulateLockedRotorStep(motor, TwelveVoltStep(), BenchConditions{});
  const fs::path path = dir_ / "step.csv";
  output::WriteBenchLogCsv(log, path.string(), output::CsvStyle{});
  int status = 0;
  const std::string json = RunScript("scipy_step_fit.py", StepFitArguments(path, motor), &status);
  ASSERT_EQ(status, 0) << last_stderr_ << json;
  constexpr double kExactRelativeTolerance = 1e-7;
  EXPECT_NEAR(JsonNumber(json, "resistance", "value"), motor.resistance_ohm,
              kExactRelativeTolerance * motor.resistance_ohm);
  EXPECT_NEAR(JsonNumber(json, "inductance", "value"), motor.inductance_H,
              kExactRelativeTolerance * motor.inductance_H);
  EXPECT_NEAR(JsonNumber(json, "initial_current", "value"), 0.0, 1e-9);
  EXPECT_EQ(JsonNumber(json, "", "dof"), static_cast<double>(log.time_s.size() - 3));
  EXPECT_LT(JsonNumber(json, "", "rss"), 1e-15);
}

TEST_F(SciPyReferenceTest, StepFitOnASaggingSupplyBiasesOnlyTheInductance) {
  // physics (by hand): with v_k = V − R_s·i_k logged, the true recursion is
  // i_{k+1} = a_t·i_k + (1 − a_t)·(V − Vb)/(R + R_s), a_t = e^(−Δ(R + R_s)/L). The
  // zero-order-hold model on v_k reproduces it exactly with the true R and
  // a' = e^(−Δ·R/L') = (a_t + ρ)/(1 + ρ), ρ = R_s/R, so the fit returns
  // L' = −Δ·R/ln(a'), about L·(1 + Δ·R_s/(2L)): the bench does not match the
  // fitter's model by construction.
  const MotorParameters motor = StepMotor();
  BenchConditions bench;
  bench.supply_resistance_ohm = 0.3;
  const StepPlan plan = TwelveVoltStep();
  const SampledLog log = SimulateLockedRotorStep(motor, plan, bench);
  const fs::path path = dir_ / "sag.csv";
  output::WriteBenchLogCsv(log, path.string(), output::CsvStyle{});
  int status = 0;
  const std::string json = RunScript("scipy_step_fit.py", StepFitArguments(path, motor), &status);
  ASSERT_EQ(status, 0) << last_stderr_ << json;
  const double r_ohm = motor.resistance_ohm, l_H = motor.inductance_H;
  const double rho = bench.supply_resistance_ohm / r_ohm;
  const double a_true = std::exp(-plan.sample_period_s * (r_ohm + bench.supply_resistance_ohm) / l_H);
  const double l_zoh_H = -plan.sample_period_s * r_ohm / std::log((a_true + rho) / (1.0 + rho));
  constexpr double kExactRelativeTolerance = 1e-7;
  EXPECT_NEAR(JsonNumber(json, "resistance", "value"), r_ohm, kExactRelativeTolerance * r_ohm);
  EXPECT_NEAR(JsonNumber(json, "inductance", "value"), l_zoh_H, kExactRelativeTolerance * l_H);
  EXPECT_GT(l_zoh_H / l_H - 1.0, 0.9 * plan.sample_period_s * bench.supply_resistance_ohm / (2.0 * l_H));
}

TEST_F(SciPyReferenceTest, StepFitStatisticsMatchTheCurrentNoise) {
  // With white current noise of σ on an exact model: estimates within 4 standard errors of the
  // truth, and s² = RSS/(N − 3) ≈ σ² with relative SE √(2/dof) (common practice: χ²_dof/dof).
  const MotorParameters motor = StepMotor();
  BenchConditions bench;
  bench.current_noise_sigma_A = 0.02;
  bench.seed = 11;
  const SampledLog log = SimulateLockedRotorStep(motor, TwelveVoltStep(), bench);
  const fs::path path = dir_ / "noisy.csv";
  output::WriteBenchLogCsv(log, path.string(), output::CsvStyle{});
  int status = 0;
  const std::string json = RunScript("scipy_step_fit.py", StepFitArguments(path, motor), &status);
  ASSERT_EQ(status, 0) << last_stderr_ << json;
  const double r_se = JsonNumber(json, "resistance", "std_error");
  const double l_se = JsonNumber(json, "inductance", "std_error");
  ASSERT_GT(r_se, 0.0);
  ASSERT_GT(l_se, 0.0);
  EXPECT_NEAR(JsonNumber(json, "resistance", "value"), motor.resistance_ohm, kStandardErrors * r_se);
  EXPECT_NEAR(JsonNumber(json, "inductance", "value"), motor.inductance_H, kStandardErrors * l_se);
  const double dof = JsonNumber(json, "", "dof");
  const double variance_ratio =
      JsonNumber(json, "", "rss") / dof / (bench.current_noise_sigma_A * bench.current_noise_sigma_A);
  EXPECT_NEAR(variance_ratio, 1.0, kStandardErrors * std::sqrt(2.0 / dof));
}

using Matrix3 = std::array<std::array<double, 3>, 3>;

// (JᵀJ)⁻¹ of a 3×3 normal matrix by cofactors (the adjugate over the determinant).
Matrix3 Inverse(const Matrix3& m) {
  Matrix3 inverse{};
  for (int r = 0; r < 3; ++r) {
    for (int c = 0; c < 3; ++c) {
      const int r1 = (c + 1) % 3, r2 = (c + 2) % 3, c1 = (r + 1) % 3, c2 = (r + 2) % 3;
      inverse[r][c] = m[r1][c1] * m[r2][c2] - m[r1][c2] * m[r2][c1];
    }
  }
  const double determinant =
      m[0][0] * inverse[0][0] + m[0][1] * inverse[1][0] + m[0][2] * inverse[2][0];
  for (auto& row : inverse) {
    for (double& value : row) value /= determinant;
  }
  return inverse;
}

TEST_F(SciPyReferenceTest, StepFitStandardErrorsMatchTheLinearisedCovariance) {
  // physics/statistics (Gauss–Newton linearisation): se_j = √(s²·[(JᵀJ)⁻¹]_jj) with J the
  // sensitivity of the current to (R, L, i0). Here J comes from the exact C++ simulator by
  // central differences, independent of the script's recursion and its analytic Jacobian;
  // ∂i/∂i0 = e^(−t·R/L) is the homogeneous solution of the ODE. The simulator starts at
  // i0 = 0 while the fit's î0 is about 1 mA, which moves J by about î0/i_settled (observed
  // 4e-4); the bound has a factor of five on that.
  const MotorParameters motor = StepMotor();
  BenchConditions bench;
  bench.current_noise_sigma_A = 0.02;
  bench.seed = 11;
  const StepPlan plan = TwelveVoltStep();
  const SampledLog log = SimulateLockedRotorStep(motor, plan, bench);
  const fs::path path = dir_ / "noisy.csv";
  output::WriteBenchLogCsv(log, path.string(), output::CsvStyle{});
  int status = 0;
  const std::string json = RunScript("scipy_step_fit.py", StepFitArguments(path, motor), &status);
  ASSERT_EQ(status, 0) << last_stderr_ << json;
  MotorParameters fitted = motor;
  fitted.resistance_ohm = JsonNumber(json, "resistance", "value");
  fitted.inductance_H = JsonNumber(json, "inductance", "value");
  const double variance = JsonNumber(json, "", "rss") / JsonNumber(json, "", "dof");

  constexpr double kRelativeStep = 1e-6;  // central differences: error O(h²) ≈ 1e-12
  const auto current_with = [&](double r_ohm, double l_H) {
    MotorParameters m = fitted;
    m.resistance_ohm = r_ohm;
    m.inductance_H = l_H;
    return SimulateLockedRotorStep(m, plan, BenchConditions{}).current_A;
  };
  const double h_r = kRelativeStep * fitted.resistance_ohm;
  const double h_l = kRelativeStep * fitted.inductance_H;
  const std::vector<double> r_plus = current_with(fitted.resistance_ohm + h_r, fitted.inductance_H);
  const std::vector<double> r_minus = current_with(fitted.resistance_ohm - h_r, fitted.inductance_H);
  const std::vector<double> l_plus = current_with(fitted.resistance_ohm, fitted.inductance_H + h_l);
  const std::vector<double> l_minus = current_with(fitted.resistance_ohm, fitted.inductance_H - h_l);
  Matrix3 normal{};
  for (std::size_t k = 0; k < log.time_s.size(); ++k) {
    const std::array<double, 3> row = {
        (r_plus[k] - r_minus[k]) / (2.0 * h_r), (l_plus[k] - l_minus[k]) / (2.0 * h_l),
        std::exp(-log.time_s[k] * fitted.resistance_ohm / fitted.inductance_H)};
    for (int a = 0; a < 3; ++a) {
      for (int b = 0; b < 3; ++b) normal[a][b] += row[a] * row[b];
    }
  }
  const Matrix3 covariance = Inverse(normal);
  constexpr double kLinearisationTolerance = 2e-3;
  const char* names[] = {"resistance", "inductance", "initial_current"};
  for (int j = 0; j < 3; ++j) {
    const double expected = std::sqrt(variance * covariance[j][j]);
    EXPECT_NEAR(JsonNumber(json, names[j], "std_error") / expected, 1.0, kLinearisationTolerance)
        << names[j];
  }
}

TEST_F(SciPyReferenceTest, StepFitRejectsALogWithoutTheColumns) {
  // common practice: bad input is an exit status, not a number
  const fs::path path = dir_ / "bad.csv";
  { std::ofstream(path) << "time [s],speed [rpm]\n0,1\n1,2\n2,3\n3,4\n4,5\n"; }
  int status = 0;
  RunScript("scipy_step_fit.py", StepFitArguments(path, StepMotor()), &status);
  EXPECT_NE(status, 0);
  EXPECT_NE(last_stderr_.find("current [A]"), std::string::npos) << last_stderr_;
}

TEST_F(SciPyReferenceTest, ExactSimulatorAgreesWithSolveIvp) {
  // SciPy solve_ivp (DOP853, rtol 1e-10) integrating L·di/dt = V_s − (R + R_s)·i − Vb·sgn(i)
  // with zero-crossing events; the exact C++ solution must agree to 1e-6 relative. The
  // levels reverse polarity and drop below Vb, so the brush rule is exercised.
  MotorParameters motor;
  motor.resistance_ohm = 2.0;
  motor.inductance_H = 2e-3;
  motor.brush_drop_V = 0.5;
  BenchConditions bench;
  bench.supply_resistance_ohm = 0.1;
  PlateauPlan plan;
  plan.supply_levels_V = {6.0, -4.0, 0.3, 3.0, -12.0, 1.0};
  plan.sample_period_s = 1e-4;
  plan.hold_s = 3e-3;  // about three time constants: the transients dominate
  constexpr std::size_t kSamplesPerLevel = 30;
  const SampledLog log = SimulateLockedRotorPlateaus(motor, plan, bench);
  ASSERT_EQ(log.current_A.size(), kSamplesPerLevel * plan.supply_levels_V.size());

  std::string levels;
  for (double v : plan.supply_levels_V) levels += (levels.empty() ? "" : ",") + Number(v);
  const std::string arguments =
      "--resistance " + Number(motor.resistance_ohm) + " --inductance " + Number(motor.inductance_H) +
      " --brush-drop " + Number(motor.brush_drop_V) + " --supply-resistance " +
      Number(bench.supply_resistance_ohm) + " --sample-period " + Number(plan.sample_period_s) +
      " --samples-per-level " + std::to_string(kSamplesPerLevel) + " --levels " + levels;
  int status = 0;
  const std::string output = RunScript("scipy_locked_rotor_sim.py", arguments, &status);
  ASSERT_EQ(status, 0) << last_stderr_;
  std::vector<double> reference_A;
  std::istringstream lines(output);
  for (double value = 0.0; lines >> value;) reference_A.push_back(value);
  ASSERT_EQ(reference_A.size(), log.current_A.size());

  constexpr double kRelativeTolerance = 1e-6;
  // Near a zero crossing a relative bound is meaningless; there the bound is relative to
  // a thousandth of the largest current.
  constexpr double kNearZeroFraction = 1e-3;
  double peak_A = 0.0;
  for (double i_A : reference_A) peak_A = std::max(peak_A, std::abs(i_A));
  int zero_samples = 0;
  for (std::size_t k = 0; k < reference_A.size(); ++k) {
    const double scale_A = std::max(std::abs(reference_A[k]), kNearZeroFraction * peak_A);
    EXPECT_NEAR(log.current_A[k], reference_A[k], kRelativeTolerance * scale_A) << "sample " << k;
    if (reference_A[k] == 0.0 && log.current_A[k] == 0.0) ++zero_samples;
  }
  // the level below Vb leaves the current at exactly zero in both (documented brush rule)
  EXPECT_GT(zero_samples, 10);
}

}  // namespace
}  // namespace coilspin::model

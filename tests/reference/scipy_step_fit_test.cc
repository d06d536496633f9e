// Outside check: the locked-rotor step fit against SciPy's
// scipy.optimize.least_squares (Debian python3-scipy) on the same simulated
// log and the same discretised model (tests/reference/scipy_step_fit.py:
// î_{k+1} = a_k·î_k + (1 − a_k)·u_k/R, a_k = e^(−Δt·R/L), residual i_k − î_k,
// standard errors from s²·(JᵀJ)⁻¹ with s² = RSS/(N − 3)). Two independent
// implementations of one estimator must agree: estimates to 1e-6 relative,
// standard errors to 1e-3 relative.

#include <gtest/gtest.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "reference/python_reference.h"
#include "src/ingest/read_bench_log.h"
#include "src/model/simulate_locked_rotor.h"
#include "src/output/bench_log_csv.h"

namespace coilspin {
namespace {

constexpr double kEstimateAgreement = 1e-6;
constexpr double kStdErrorAgreement = 1e-3;

using test_support::RunCapture;
using test_support::SciPyAvailable;

TEST(SciPyStepFit, EstimatesAndStandardErrorsAgree) {
  if (!SciPyAvailable())
    GTEST_SKIP() << "SciPy not found for " << COILSPIN_PYTHON
                 << " (install python3-scipy): the independent fitter of this check is scipy.optimize.least_squares";
  model::MotorParameters motor;
  motor.resistance_ohm = 2.7;
  motor.inductance_H = 1.2e-3;
  model::BenchConditions bench;
  bench.supply_resistance_ohm = 0.2;
  // Noise on the current only: the comparison is of the output-error estimator
  // itself. (coilspin adds the logged-voltage noise term to its covariance,
  // fitters/locked_rotor/input_noise.h, which SciPy's fit does not model; with
  // a noise-free voltage channel that term is zero.)
  bench.current_noise_sigma_A = 4e-3;
  bench.seed = 77;
  model::StepPlan plan;
  plan.supply_before_V = 0.0;
  plan.supply_after_V = 8.0;
  plan.before_s = 0.5e-3;
  plan.after_s = 4e-3;
  plan.sample_period_s = 5e-6;
  const auto dir = std::filesystem::temp_directory_path() / ("coilspin_scipy_" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const std::string csv = (dir / "step.csv").string();
  output::CsvStyle style;
  style.significant_digits = 17;  // both fitters read the same doubles
  output::WriteBenchLogCsv(model::SimulateLockedRotorStep(motor, plan, bench), csv, style);

  const BenchLog log = ReadBenchLog(csv, {});
  const MotorEstimate ours = locked_rotor::FitLockedRotor({&log}, {});
  ASSERT_NE(ours.Find("resistance"), nullptr);
  ASSERT_NE(ours.Find("inductance"), nullptr);

  const std::string script = std::string(COILSPIN_TEST_SOURCE_DIR) + "/reference/scipy_step_fit.py";
  const std::string output = RunCapture(std::string(COILSPIN_PYTHON) + " " + script + " " + csv +
                                        " --brush-drop 0 --resistance 2.5 --inductance 1e-3");
  std::filesystem::remove_all(dir);
  const auto theirs = nlohmann::json::parse(output);
  for (const char* key : {"resistance", "inductance"}) {
    const QuantityEstimate* q = ours.Find(key);
    const double value = theirs[key]["value"];
    const double se = theirs[key]["std_error"];
    EXPECT_NEAR(q->value, value, kEstimateAgreement * std::fabs(value)) << key;
    EXPECT_NEAR(q->std_error, se, kStdErrorAgreement * se) << key;
  }
}

}  // namespace
}  // namespace coilspin

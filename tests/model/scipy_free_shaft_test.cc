// The free-shaft simulators (no-load, spin-down, voltage step) against SciPy, an
// outside reference (python3-scipy from Debian):
// tests/reference/scipy_free_shaft_sim.py integrates the same ODE
// with scipy.integrate.solve_ivp (DOP853, rtol 1e-10) and terminal events at
// every switch of the brush and stiction rules. Skipped, with a message naming
// SciPy, when COILSPIN_PYTHON cannot import it.

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdio>
#include <cstdlib>
#include <sstream>
#include <string>
#include <vector>

#include "src/model/simulate_no_load.h"
#include "src/model/simulate_spin_down.h"
#include "src/model/simulate_step.h"

namespace coilspin::model {
namespace {

// The brief's agreement for an independent integrator.
constexpr double kRelativeTolerance = 1e-6;
// Near a zero crossing a relative bound is meaningless; there the bound is relative to a
// thousandth of the channel's largest value.
constexpr double kNearZeroFraction = 1e-3;
constexpr double kSamplePeriod_s = 1e-3;  // as long as L/R: the sub-steps come from the time constants
constexpr std::size_t kSamplesPerLevel = 60;
constexpr double kSupplyResistance_ohm = 0.1;
// The voltage steps: τe/10 = L/(R + R_s)/10 ≈ 1e-4 s, the default rule of src/model/step_plan_defaults.h;
// 60 ms after the step is six mechanical time constants J·(R + R_s)/(Kt·Ke) ≈ 10 ms.
constexpr double kStepSamplePeriod_s = 1e-4;
constexpr std::size_t kPreStepSamples = 10;
constexpr std::size_t kSettleSamples = 1000;
constexpr std::size_t kHoldSamples = 600;

// R, L, Ke, Kt, J, B, Tc, Vb: every term of the model, with Tc large enough to stop the rotor
// on a low level and Vb large enough to block the current while the rotor slows.
const MotorParameters kMotor{2.0, 2e-3, 0.02, 0.021, 2e-6, 1e-6, 2e-3, 0.3};

std::string Number(double value) {
  char buffer[32];
  std::snprintf(buffer, sizeof buffer, "%.17g", value);
  return buffer;
}

std::string Quoted(const std::string& text) { return "'" + text + "'"; }

bool SciPyAvailable() {
  const std::string python = COILSPIN_PYTHON;
  if (python.empty()) return false;
  const std::string probe = Quoted(python) + " -c 'import scipy.integrate' >/dev/null 2>&1";
  return std::system(probe.c_str()) == 0;
}

struct Reference {
  std::vector<double> current_A, speed_rad_s, position_rad;
};

// Runs the script for kMotor with `segments` ("supply:V:RS:N" or "open:N"); *status is its exit status.
Reference RunReference(const std::vector<std::string>& segments, int* status,
                       double sample_period_s = kSamplePeriod_s) {
  std::string command = Quoted(COILSPIN_PYTHON) + " " +
                        Quoted(std::string(COILSPIN_TEST_SOURCE_DIR) + "/reference/scipy_free_shaft_sim.py") +
                        " --resistance " + Number(kMotor.resistance_ohm) + " --inductance " +
                        Number(kMotor.inductance_H) + " --back-emf-constant " +
                        Number(kMotor.back_emf_constant_V_s_per_rad) + " --torque-constant " +
                        Number(kMotor.torque_constant_N_m_per_A) + " --inertia " + Number(kMotor.inertia_kg_m2) +
                        " --viscous-friction " + Number(kMotor.viscous_friction_N_m_s_per_rad) +
                        " --coulomb-friction " + Number(kMotor.coulomb_friction_N_m) + " --brush-drop " +
                        Number(kMotor.brush_drop_V) + " --sample-period " + Number(sample_period_s);
  for (const std::string& segment : segments) command += " --segment " + segment;
  Reference reference;
  FILE* pipe = ::popen(command.c_str(), "r");
  if (pipe == nullptr) {
    *status = -1;
    return reference;
  }
  std::string text;
  char buffer[4096];
  for (std::size_t got; (got = std::fread(buffer, 1, sizeof buffer, pipe)) > 0;) text.append(buffer, got);
  *status = ::pclose(pipe);
  std::istringstream lines(text);
  for (double i, w, theta; lines >> i >> w >> theta;) {
    reference.current_A.push_back(i);
    reference.speed_rad_s.push_back(w);
    reference.position_rad.push_back(theta);
  }
  return reference;
}

// Compares one channel; returns how many samples are exactly zero in both.
int ExpectAgreement(const std::vector<double>& simulated, const std::vector<double>& reference,
                    const std::string& channel) {
  EXPECT_EQ(simulated.size(), reference.size()) << channel;
  double peak = 0.0;
  for (double value : reference) peak = std::max(peak, std::abs(value));
  int exact_zeros = 0;
  for (std::size_t k = 0; k < std::min(simulated.size(), reference.size()); ++k) {
    const double scale = std::max(std::abs(reference[k]), kNearZeroFraction * peak);
    EXPECT_NEAR(simulated[k], reference[k], kRelativeTolerance * scale) << channel << ", sample " << k;
    if (simulated[k] == 0.0 && reference[k] == 0.0) ++exact_zeros;
  }
  return exact_zeros;
}

std::string SupplySegment(double supply_V, double resistance_ohm, std::size_t samples) {
  return "supply:" + Number(supply_V) + ":" + Number(resistance_ohm) + ":" + std::to_string(samples);
}

BenchConditions Bench() {
  BenchConditions bench;
  bench.supply_resistance_ohm = kSupplyResistance_ohm;
  return bench;
}

class SciPyFreeShaftTest : public ::testing::Test {
 protected:
  void SetUp() override {
    if (!SciPyAvailable()) {
      GTEST_SKIP() << "SciPy (python3-scipy) is not importable by " << COILSPIN_PYTHON
                   << "; install python3-scipy to run this outside-reference check";
    }
  }
};

TEST_F(SciPyFreeShaftTest, NoLoadLevelsAgreeWithSolveIvp) {
  // SciPy solve_ivp: the levels step down (the current reverses, then the brushes block it),
  // drop below the breakaway voltage (the rotor stops and stiction holds it), reverse and stop.
  NoLoadPlan plan;
  plan.supply_levels_V = {6.0, 2.0, 0.4, -6.0, 0.0};
  plan.hold_s = kSamplesPerLevel * kSamplePeriod_s;
  plan.sample_period_s = kSamplePeriod_s;
  plan.shaft = ShaftChannels::kSpeedAndPosition;
  const SampledLog log = SimulateNoLoad(kMotor, plan, Bench());
  std::vector<std::string> segments;
  for (double level_V : plan.supply_levels_V) {
    segments.push_back(SupplySegment(level_V, kSupplyResistance_ohm, kSamplesPerLevel));
  }
  int status = 0;
  const Reference reference = RunReference(segments, &status);
  ASSERT_EQ(status, 0);
  const int blocked = ExpectAgreement(log.current_A, reference.current_A, "current");
  const int at_rest = ExpectAgreement(log.speed_rad_s, reference.speed_rad_s, "speed");
  ExpectAgreement(log.position_rad, reference.position_rad, "position");
  EXPECT_GT(blocked, 10) << "the brush rule held the current at zero";
  EXPECT_GT(at_rest, 10) << "the stiction rule held the rotor";
}

TEST_F(SciPyFreeShaftTest, OpenCircuitSpinDownAgreesWithSolveIvp) {
  // SciPy solve_ivp: run up at 6 V, then coast open-circuit (i = 0) to rest
  SpinDownPlan plan;
  plan.supply_V = 6.0;
  plan.run_s = kSamplesPerLevel * kSamplePeriod_s;
  plan.coast_s = 6.0 * kSamplesPerLevel * kSamplePeriod_s;
  plan.sample_period_s = kSamplePeriod_s;
  plan.shaft = ShaftChannels::kSpeedAndPosition;
  const SampledLog log = SimulateSpinDown(kMotor, plan, Bench());
  int status = 0;
  const Reference reference = RunReference({SupplySegment(plan.supply_V, kSupplyResistance_ohm, kSamplesPerLevel),
                                            "open:" + std::to_string(6 * kSamplesPerLevel)},
                                           &status);
  ASSERT_EQ(status, 0);
  ExpectAgreement(log.current_A, reference.current_A, "current");
  EXPECT_GT(ExpectAgreement(log.speed_rad_s, reference.speed_rad_s, "speed"), 10) << "the rotor stopped";
  ExpectAgreement(log.position_rad, reference.position_rad, "position");
}

TEST_F(SciPyFreeShaftTest, BrakingResistorSpinDownAgreesWithSolveIvp) {
  // SciPy solve_ivp: the coast through R_brake = 1 ohm is V_s = 0 behind R_s = R_brake
  constexpr double kBrake_ohm = 1.0;
  SpinDownPlan plan;
  plan.supply_V = 6.0;
  plan.run_s = kSamplesPerLevel * kSamplePeriod_s;
  plan.coast_s = 2.0 * kSamplesPerLevel * kSamplePeriod_s;
  plan.sample_period_s = kSamplePeriod_s;
  plan.brake_resistance_ohm = kBrake_ohm;
  plan.shaft = ShaftChannels::kSpeedAndPosition;
  const SampledLog log = SimulateSpinDown(kMotor, plan, Bench());
  int status = 0;
  const Reference reference = RunReference({SupplySegment(plan.supply_V, kSupplyResistance_ohm, kSamplesPerLevel),
                                            SupplySegment(0.0, kBrake_ohm, 2 * kSamplesPerLevel)},
                                           &status);
  ASSERT_EQ(status, 0);
  ExpectAgreement(log.current_A, reference.current_A, "current");
  ExpectAgreement(log.speed_rad_s, reference.speed_rad_s, "speed");
  ExpectAgreement(log.position_rad, reference.position_rad, "position");
}

FreeShaftStepPlan StepPlan(double initial_V, double final_V) {
  FreeShaftStepPlan plan;
  plan.initial_supply_V = initial_V;
  plan.final_supply_V = final_V;
  plan.settle_s = initial_V == 0.0 ? 0.0 : kSettleSamples * kStepSamplePeriod_s;
  plan.pre_step_s = kPreStepSamples * kStepSamplePeriod_s;
  plan.hold_s = kHoldSamples * kStepSamplePeriod_s;
  plan.sample_period_s = kStepSamplePeriod_s;
  plan.shaft = ShaftChannels::kSpeedAndPosition;
  return plan;
}

// The reference for a step between levels: the script runs from rest through the unlogged settle,
// whose samples are dropped here as SimulateStep drops them.
Reference StepReference(double initial_V, double final_V, int* status) {
  const std::size_t unlogged = initial_V == 0.0 ? 0 : kSettleSamples;
  Reference reference = RunReference({SupplySegment(initial_V, kSupplyResistance_ohm, unlogged + kPreStepSamples),
                                      SupplySegment(final_V, kSupplyResistance_ohm, kHoldSamples)},
                                     status, kStepSamplePeriod_s);
  for (auto* channel : {&reference.current_A, &reference.speed_rad_s, &reference.position_rad}) {
    if (channel->size() < unlogged) continue;  // the size check in ExpectAgreement reports it
    channel->erase(channel->begin(), channel->begin() + static_cast<std::ptrdiff_t>(unlogged));
  }
  return reference;
}

// Simulates the step V_0 → V_1 and compares current, speed and position with the reference at every
// sample; returns the log and the exactly-zero counts of current and speed.
struct StepComparison {
  SampledLog log;
  int zero_currents = 0, zero_speeds = 0;
};

StepComparison CompareStep(double initial_V, double final_V) {
  StepComparison result;
  result.log = SimulateStep(kMotor, StepPlan(initial_V, final_V), Bench());
  int status = 0;
  const Reference reference = StepReference(initial_V, final_V, &status);
  EXPECT_EQ(status, 0);
  result.zero_currents = ExpectAgreement(result.log.current_A, reference.current_A, "current");
  result.zero_speeds = ExpectAgreement(result.log.speed_rad_s, reference.speed_rad_s, "speed");
  ExpectAgreement(result.log.position_rad, reference.position_rad, "position");
  return result;
}

TEST_F(SciPyFreeShaftTest, VoltageStepFromRestAgreesWithSolveIvp) {
  // SciPy solve_ivp: at rest (the brushes block the current, stiction holds the rotor), then 0 → 6 V
  // through R_s; the rotor breaks away once Kt·i exceeds Tc
  const StepComparison step = CompareStep(0.0, 6.0);
  EXPECT_GE(step.zero_currents, static_cast<int>(kPreStepSamples));
  EXPECT_GT(step.zero_speeds, static_cast<int>(kPreStepSamples)) << "the rotor stays at rest until it breaks away";
}

TEST_F(SciPyFreeShaftTest, VoltageStepBetweenTwoLevelsAgreesWithSolveIvp) {
  // SciPy solve_ivp: settled at 2 V (unlogged), then stepped up to 6 V
  const StepComparison step = CompareStep(2.0, 6.0);
  ASSERT_FALSE(step.log.speed_rad_s.empty());
  EXPECT_GT(step.log.speed_rad_s.front(), 0.0) << "the log starts with the rotor turning";
}

TEST_F(SciPyFreeShaftTest, VoltageStepDownReversesTheCurrentAndAgreesWithSolveIvp) {
  // SciPy solve_ivp: settled at 6 V (unlogged), then stepped down to 1 V: the back-EMF exceeds the
  // supply, the current reverses through zero (a brush-rule switch) and brakes the rotor
  const StepComparison step = CompareStep(6.0, 1.0);
  double lowest_A = 0.0;
  for (double i_A : step.log.current_A) lowest_A = std::min(lowest_A, i_A);
  EXPECT_LT(lowest_A, 0.0) << "the current reversed";
}

}  // namespace
}  // namespace coilspin::model

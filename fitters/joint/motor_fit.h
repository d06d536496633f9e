#pragma once
// One motor, all its bench tests, one least-squares problem.
//
// Every test adds its residual groups to a shared problem, asking for the
// parameters it informs by name, so R from a locked-rotor log and R in a
// no-load log are one R, and Ke from no-load plateaus and from a spin-down's
// back-EMF are one Ke. The noise of each group is estimated from the data.
//
// The mechanical basis is decided from what the tests can determine
// (docs/methods.md §2):
// - Kt is measured when a locked-rotor torque column is logged; otherwise it is
//   taken equal to Ke in SI units (the same parameter plays both roles) and
//   the result says so ("basis": "equal-to-Ke").
// - B and Tc are absolute when no-load plateaus give Kt-scaled friction (or
//   the inertia is known); J then follows from the spin-down's B/J and Tc/J.
// - A spin-down alone fixes only the ratios B/J and Tc/J.
// Derived quantities and the torque–speed line follow at the operating
// voltage; Kt/Ke consistency is checked when Kt and Ke come from independent
// evidence.

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
#include "fitters/core/progress.h"
#include "fitters/core/robust_loss.h"
#include "fitters/joint/interval_methods.h"
#include "fitters/locked_rotor/locked_rotor_fit.h"
#include "src/ingest/bench_log.h"
#include "src/ingest/test_kind.h"
#include "src/units/constants.h"

namespace coilspin::joint {

struct TestLog {
  TestKind kind;
  BenchLog log;
};

// A noise level given instead of estimated: σ of the logged channel's samples
// ("current" [A], "voltage" [V], "speed" [rad/s], "position" [rad]), for every
// test whose channel is fitted sample by sample (step captures and steps,
// coasts). Plateau means keep their σ from the within-plateau spread.
struct NoiseOverride {
  std::string channel;
  double sigma = 0.0;
};

struct MotorFitOptions {
  std::string motor_label;
  double confidence = 0.95;
  locked_rotor::LockedRotorOptions locked_rotor;
  std::optional<double> known_inertia_kg_m2;
  std::optional<double> at_voltage_V;        // operating voltage of the derived quantities
  std::optional<double> counts_per_rev;      // encoder, for the quantisation of position logs
  double gear_ratio = 1.0;
  double consistency_tolerance = units::kDefaultKtKeTolerance;  // |Kt/Ke − 1| allowed
  IntervalOptions intervals;                                       // wald | profile | bootstrap
  core::RobustLoss loss = core::RobustLoss::kSquared;              // --robust huber|cauchy
  std::vector<NoiseOverride> noise;                                // --noise channel=sigma
  core::Progress progress;  // planning, solving, covariance, profile or bootstrap (progress.h); empty: silent
  // Bounds on the work, for a caller that must stay fast (the fuzz harness,
  // tests/fuzz/fuzz_fit.cc): Levenberg–Marquardt iterations per solve (the core's
  // default) and the rounds that re-estimate each group's noise (3 by default:
  // the noise levels then agree with the residuals to well within their spread).
  int max_solver_iterations = core::SolveOptions().max_iterations;
  int group_sigma_rounds = 3;
  // Every log's current comes through one sensor (sensor_offsets.h): its zero reading,
  // seen in one log, corrects all. False: the sensors differ and no log corrects another.
  bool one_current_sensor = true;
  bool keep_model_traces = false;  // fill MotorEstimate::model_traces (the fitted model over each log)

  bool IsValid(std::string* error) const;
};

MotorEstimate FitMotor(const std::vector<TestLog>& tests, const MotorFitOptions& options);

// Every key a result can hold under parameters, ratios or derived (for --require).
std::vector<std::string> RequirableKeys();

}  // namespace coilspin::joint

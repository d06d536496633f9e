#pragma once
// The locked-rotor fitter: R, L and Vb of one motor (and Kt, when a torque
// column is logged) from any number of locked-rotor logs (plateau logs and
// step captures), which share R and Vb.
//
// Plateau logs contribute  v̄_j = R·f_j·ī_j + Vb·sgn(ī_j)  per settled plateau;
// step captures contribute the sample-by-sample current of
// L·di/dt = v − R·i − Vb·sgn(i)  driven by the logged voltage (step_residual.h);
// a torque column contributes  τ̄_j = Kt·ī_j + τ0  (torque_residual.h).
// Each log is one residual group with its own noise level, estimated from the
// data, so a log counts by how well it measures.
//
// Identifiability, stated rather than hidden:
// - Vb separates from R only with settled levels at two or more current
//   magnitudes (three levels at least, to leave a degree of freedom);
//   otherwise Vb is held at 0 and reported not identified.
// - L needs a step capture that resolves the current rise.
// - R needs two plateaus (one degree of freedom) or a step capture.
// - Kt needs a torque column on three plateaus or more at distinct currents.
// Temperature: with a logged temperature or a given winding temperature, R is
// reported at the reference temperature (copper, docs/methods.md §2.4); a drift
// of R across plateaus that temperature does not explain is warned about.
//
// Use: Plan → Add (into a problem shared with other tests) → solve → Report;
// FitLockedRotor does all four for locked-rotor logs alone.

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "fitters/core/motor_estimate.h"
#include "fitters/core/shared_parameters.h"
#include "fitters/locked_rotor/capture.h"
#include "fitters/locked_rotor/step_residual.h"
#include "src/ingest/bench_log.h"
#include "src/ingest/segmentation.h"

namespace coilspin::locked_rotor {

struct LockedRotorOptions {
  std::optional<double> winding_temperature_degC;     // during the test, if not logged
  std::optional<double> reference_temperature_degC;   // R is reported at this temperature
  double confidence = 0.95;
  PlateauOptions plateaus;

  bool IsValid(std::string* error) const;
};

struct PlateauLog {
  const BenchLog* log = nullptr;
  std::vector<LockedPlateau> plateaus;
  CaptureClassification classification;  // why it is a plateau log (capture.h)
  std::vector<double> factors;  // f_j
  int voltage_group = -1;
  int torque_group = -1;
};

struct StepLog {
  const BenchLog* log = nullptr;
  CaptureClassification classification;
  double factor = 1.0;
  double current_noise_A = 0.0;
  double voltage_noise_V = 0.0;   // marginal σ_v of the logged voltage (src/ingest/noise_level.h)
  double voltage_noise_lag1 = 0.0; // its lag-1 correlation φ_v as AR(1) noise
  double initial_current_A = 0.0;
  double inductance_start_H = 0.0;
  // The supply rests at 0 V before the step: those samples read zero current, so the
  // current sensor's zero reading (src/model/sensor_offsets.h).
  bool from_rest = false;
  int group = -1;
};

struct LockedRotorPlan {
  bool resistance_identified = false;
  bool estimate_brush_drop = false;
  bool measures_torque_constant = false;
  std::optional<double> reference_degC;   // R is fitted at this temperature
  bool reference_requested = false;       // ... because the user asked for it (else: mean test temperature)
  double resistance_start_ohm = 0.0;
  double brush_drop_start_V = 0.0;
  double brush_drop_scale_V = 1.0;
  double torque_constant_start = 0.0;
  std::size_t level_count = 0;
  int current_levels = 0;
  std::vector<PlateauLog> plateau_logs;
  std::vector<StepLog> step_logs;
  std::vector<std::size_t> summary_index;  // per plateau log then step log: index into estimate->tests
};

// Segments and classifies the logs, decides what they can determine, finds
// starting values; adds a TestSummary per log and any not_identified reasons
// and warnings to `estimate`.
LockedRotorPlan PlanLockedRotor(const std::vector<const BenchLog*>& logs, const LockedRotorOptions& options,
                                MotorEstimate* estimate);

// Adds the residual groups (nothing when R is not identified).
void AddLockedRotor(LockedRotorPlan* plan, core::SharedParameters* parameters);

// Reads the solution back: R, L, Vb, Kt (or their reasons), residual statistics, heating check.
void ReportLockedRotor(const LockedRotorPlan& plan, const core::FitResult& fit, MotorEstimate* estimate);

// The parameters this plan estimated, in covariance order.
std::vector<std::string> LockedRotorParameterNames(const LockedRotorPlan& plan);

// The step residual of a capture, with its rest noise bands.
StepCurrentResidual StepResidualOf(const StepLog& step);

// Locked-rotor logs on their own: plan, add, solve, report.
MotorEstimate FitLockedRotor(const std::vector<const BenchLog*>& logs, const LockedRotorOptions& options);

}  // namespace coilspin::locked_rotor

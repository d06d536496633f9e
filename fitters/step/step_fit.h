#pragma once
// The free-shaft voltage-step fitter (docs/methods.md §3.3).
//
// A step log (from rest, or between two supply levels) with logged v, i and
// speed or encoder position is fitted by output error: the model of
// step_dynamics.h is simulated with the LOGGED voltage as input, and its
// current and its speed (or angle) are compared sample by sample with the
// log (step_residual.h). One log determines R (with the copper factor), L, Ke
// and the mechanics Kt/J, B/J, Tc/J; in absolute units J, B and Tc follow
// with the torque-constant basis of the joint fit (Kt measured, Kt = Ke, or
// Kt from a known inertia). Vb·sgn(i) is nearly constant over a step, so a
// step alone cannot separate Vb from R: Vb is shared with the locked-rotor
// test when that test determines it and held at 0 otherwise.
//
// Noise: one group per channel, σ from first differences (current, speed) or
// encoder quantisation q/√12 (position). The initial state is a nuisance
// parameter: i₀ always; ω₀ only when the log starts turning (from rest it is
// exactly 0); θ₀ when position is fitted.
//
// Use: Plan → Add (into the joint problem) → solve → Report.

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "fitters/core/motor_estimate.h"
#include "fitters/core/shared_parameters.h"
#include "fitters/step/equation_error.h"
#include "fitters/step/step_residual.h"
#include "src/ingest/bench_log.h"

namespace coilspin::step {

struct StepTemperatures {
  std::optional<double> reference_degC;  // R is fitted at this temperature (from the locked-rotor plan)
  std::optional<double> winding_degC;    // during the test, if not logged
};

struct StepLog {
  const BenchLog* log = nullptr;
  std::size_t summary = 0;                 // index of its TestSummary
  bool fit_position = false;               // encoder position fitted directly
  std::vector<double> speed_rad_s;         // logged, or derived from position (start values only)
  double temperature_factor = 1.0;         // f
  double current_noise_A = 0.0;
  double voltage_noise_V = 0.0;           // marginal σ of the logged voltage (src/ingest/noise_level.h)
  double voltage_noise_lag1 = 0.0;        // its lag-1 correlation as AR(1) noise
  double motion_noise = 0.0;               // σ of speed [rad/s] or position [rad]
  double count_rad = 0.0;                  // the encoder's step q when positions are whole counts; 0 otherwise
  bool from_rest = false;                  // ω₀ = 0 exactly
  double jump_V = 0.0;                     // a larger change between samples is a switched edge
  EquationErrorStart start;
  // Set by AddStep: the residual groups and the problem's parameter indices of
  // each channel's residual, in the functor's order (step_residual.h).
  bool torque_constant_is_back_emf = false;
  int current_group = -1;
  int motion_group = -1;
  std::vector<int> current_parameters;
  std::vector<int> motion_parameters;

  StepChannel MotionChannel() const { return fit_position ? StepChannel::kPosition : StepChannel::kSpeed; }
  StepResidual Residual(StepChannel channel) const;
};

struct StepTestPlan {
  std::vector<StepLog> logs;
  bool usable = false;
  // Medians over the logs of the equation-error starts.
  double resistance_start_ohm = 0.0;       // at the reference temperature
  double inductance_start_H = 0.0;
  double back_emf_start = 0.0;
  double torque_over_inertia_start = 0.0;
  double viscous_over_inertia_start = 0.0;
  double coulomb_over_inertia_start = 0.0;
  std::vector<std::size_t> summary_index;
};

// position_step_rad: one encoder count at the motor shaft, when position came from an encoder.
StepTestPlan PlanStep(const std::vector<const BenchLog*>& logs, std::optional<double> position_step_rad,
                      const StepTemperatures& temperatures, double brush_drop_start_V, MotorEstimate* estimate);

// torque_constant_name: "torque_constant" (Kt its own parameter) or "back_emf_constant" (Kt = Ke).
// Inertia starts at inertia_start_kg_m2 when > 0 (else Kt/(Kt/J) of the start), fixed when inertia_known.
void AddStep(StepTestPlan* plan, const std::string& torque_constant_name, double inertia_start_kg_m2,
             bool inertia_known, core::SharedParameters* parameters);

// The inertia the plan's start implies for a torque constant Kt.
double InertiaStart(const StepTestPlan& plan, double torque_constant);

void ReportStep(const StepTestPlan& plan, const core::FitResult& fit, MotorEstimate* estimate);

}  // namespace coilspin::step

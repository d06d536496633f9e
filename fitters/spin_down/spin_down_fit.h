#pragma once
// The spin-down fitter: friction over inertia, B/J and Tc/J, from an
// open-circuit coast (coast_model.h), and Ke from the terminal voltage when it
// is logged during the coast (open terminals show the back-EMF, v = Ke·ω).
//
// The coast runs from the power-off instant to rest (src/ingest coast
// segmentation). Speed comes from a speed column; with an encoder position
// column the position model is fitted directly, so quantisation is the noise
// and no differentiation enters the fit.
//
// On its own the coast fixes only ratios; with Kt-scaled friction from a
// no-load test, or a known inertia, it fixes J, B and Tc in absolute units.
// Warnings: current flowing during the coast (not open circuit: a driver or
// diode brakes it), a log that stops long before rest. A coast with its current
// logged and open terminals reads the current sensor's zero (zero_reading_residual.h).

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "fitters/core/motor_estimate.h"
#include "fitters/core/shared_parameters.h"
#include "fitters/spin_down/coast_residual.h"
#include "fitters/spin_down/zero_reading_residual.h"
#include "src/ingest/bench_log.h"

namespace coilspin::spin_down {

struct CoastLog {
  const BenchLog* log = nullptr;
  std::size_t summary = 0;            // index of its TestSummary
  std::size_t power_off = 0;
  std::size_t rest = 0;
  double direction = 1.0;             // sgn of the speed at power-off; data are flipped to turn forward
  std::vector<double> time_s;         // since power-off
  std::vector<double> speed_rad_s;    // empty when position is fitted
  std::vector<double> position_rad;   // empty when speed is fitted
  std::vector<double> voltage_V;      // empty when not logged
  double speed_start_rad_s = 0.0;     // ω₀ start
  double position_start_rad = 0.0;    // θ₀ start
  double position_sigma_rad = 0.0;    // encoder quantisation σ = q/√12
  double count_rad = 0.0;             // the encoder's step q when positions are whole counts; 0 otherwise
  // The current after power off with open terminals (no braking seen): readings of
  // zero current, so of the sensor's zero reading (src/model/sensor_offsets.h); empty
  // when the current is not logged or flows.
  std::vector<double> zero_current_A;
  int motion_group = -1;
  int voltage_group = -1;
  int zero_current_group = -1;
};

struct SpinDownPlan {
  std::vector<CoastLog> logs;
  bool usable = false;
  bool measures_back_emf = false;     // a coast voltage was logged
  double back_emf_start = 0.0;        // Ke ≈ v/ω at power-off, when it was
  bool shows_current_at_zero = false; // a coast logged its current with open terminals
  double zero_current_start_A = 0.0;  // the median of those readings: the current sensor's zero reading
  double viscous_over_inertia_start = 0.0;  // b
  double coulomb_over_inertia_start = 0.0;  // c
  std::vector<std::size_t> summary_index;
};

// position_step_rad: one encoder count at the motor shaft, 2π·(gear ratio)/CPR, when
// position came from an encoder (sets the quantisation σ).
SpinDownPlan PlanSpinDown(const std::vector<const BenchLog*>& logs, std::optional<double> position_step_rad,
                          MotorEstimate* estimate);

// kAbsolute: uses viscous_friction, coulomb_friction and inertia (J started at
// inertia_start_kg_m2, fixed when inertia_known); kRatios: viscous_over_inertia
// and coulomb_over_inertia.
void AddSpinDown(SpinDownPlan* plan, Mechanics mechanics, double inertia_start_kg_m2, bool inertia_known,
                 core::SharedParameters* parameters);

void ReportSpinDown(const SpinDownPlan& plan, const core::FitResult& fit, MotorEstimate* estimate);

}  // namespace coilspin::spin_down

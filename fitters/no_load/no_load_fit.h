#pragma once
// The no-load fitter: Ke, and friction B, Tc relative to Kt, from settled
// free-shaft plateaus at several supply levels (no_load_residual.h).
//
// R and Vb come from the locked-rotor test, shared in the same problem. With
// no-load logs alone Ke is not identified: the plateau currents follow speed
// through friction, so the voltage equation fixes only Ke + R·B/Kt.
// Friction needs Kt: measured (a locked-rotor torque column) or taken equal to
// Ke in SI units; the caller decides which parameter plays Kt.
//
// Identifiability: Ke needs 2 plateaus with speed; B and Tc need 3 (two
// unknowns and a degree of freedom).

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/least_squares.h"
#include "fitters/core/motor_estimate.h"
#include "fitters/core/shared_parameters.h"
#include "src/ingest/bench_log.h"
#include "src/ingest/segmentation.h"

namespace coilspin::no_load {

// A log's shaft speed: the logged column, or one derived from position.
struct SpeedTrace {
  const std::vector<double>* speed_rad_s = nullptr;
  std::string method;  // "logged speed column", or how it was derived
};

struct NoLoadPlateau {
  double mean_voltage_V = 0.0;
  double mean_current_A = 0.0;
  double mean_speed_rad_s = 0.0;
  double voltage_std_V = 0.0;
  double current_std_A = 0.0;
  double speed_std_rad_s = 0.0;
  std::size_t samples = 0;
  std::size_t begin = 0;  // settled samples [begin, end) of the log
  std::size_t end = 0;
};

struct NoLoadLog {
  const BenchLog* log = nullptr;
  std::vector<NoLoadPlateau> plateaus;
  double temperature_factor = 1.0;  // f = (k + θ)/(k + θ_ref) of the log's winding temperature
  int voltage_group = -1;
  int current_group = -1;
};

struct NoLoadPlan {
  std::vector<NoLoadLog> logs;
  std::size_t plateau_count = 0;
  bool resistance_from_here = false;  // no locked-rotor R: Ke is then not identified
  bool back_emf_identified = false;
  bool friction_identified = false;
  double back_emf_start = 0.0;
  double resistance_start_ohm = 0.0;
  double viscous_start = 0.0;         // B at Kt = Ke start
  double coulomb_start = 0.0;
  std::vector<std::size_t> summary_index;
};

// Temperatures of the shared R: the reference it is fitted at (from the
// locked-rotor plan) and the winding temperature when no column is logged.
struct NoLoadTemperatures {
  std::optional<double> reference_degC;
  std::optional<double> winding_degC;
};

// resistance_ohm / brush_drop_V: starting values from a locked-rotor plan, when
// there is one. back_emf_elsewhere: a Ke start from another test (a coast
// voltage); without R the plateaus then still give friction, through Kt = Ke.
NoLoadPlan PlanNoLoad(const std::vector<const BenchLog*>& logs, const std::vector<SpeedTrace>& speeds,
                      std::optional<double> resistance_ohm, double brush_drop_V, const NoLoadTemperatures& temperatures,
                      std::optional<double> back_emf_elsewhere, const PlateauOptions& options,
                      MotorEstimate* estimate);

// torque_constant_name: "torque_constant" when Kt is measured, "back_emf_constant" when Kt = Ke.
void AddNoLoad(NoLoadPlan* plan, const std::string& torque_constant_name, core::SharedParameters* parameters);

// Residual statistics per log.
void ReportNoLoad(const NoLoadPlan& plan, const core::FitResult& fit, MotorEstimate* estimate);

}  // namespace coilspin::no_load

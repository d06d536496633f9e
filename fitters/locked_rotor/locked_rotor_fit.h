#pragma once
// The locked-rotor fitter: R, L and Vb of one motor from any number of
// locked-rotor logs (plateau logs and step captures), which share R and Vb.
//
// Plateau logs contribute  v̄_j = R·f_j·ī_j + Vb·sgn(ī_j)  per settled plateau;
// step captures contribute the sample-by-sample current of
// L·di/dt = v − R·i − Vb·sgn(i)  driven by the logged voltage (step_residual.h).
// Each log is one residual group with its own noise level, estimated from the
// data, so a log counts by how well it measures.
//
// Identifiability, stated rather than hidden:
// - Vb separates from R only with plateaus at two or more current magnitudes
//   (three plateaus at least, to leave a degree of freedom); otherwise Vb is
//   held at 0 and reported not identified.
// - L needs a step capture that resolves the current rise.
// - R needs two plateaus (one degree of freedom) or a step capture.
// Temperature: with a logged temperature or a given winding temperature, R is
// reported at the reference temperature (copper, docs/methods.md §7); a drift
// of R across plateaus that temperature does not explain is warned about.

#include <optional>
#include <string>
#include <vector>

#include "fitters/core/motor_estimate.h"
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

// Fills the locked-rotor part of a motor estimate: parameters resistance,
// inductance, brush_drop (or their not_identified reasons), one TestSummary per
// log, warnings, the solver summary and the covariance of what it estimated.
MotorEstimate FitLockedRotor(const std::vector<const BenchLog*>& logs, const LockedRotorOptions& options);

}  // namespace coilspin::locked_rotor

#pragma once
// Closed-form starting values for the locked-rotor fit (tested on their own).
//
// Plateaus: ordinary least squares of  v̄_j = R·f_j·ī_j + Vb·sgn(ī_j)  over the
// plateaus (two columns, or one when Vb is held at 0).
// Step capture: R from the last settled level, R = (v̄ − Vb)/ī; then L from the
// equation error  L·di/dt = v − R·i − Vb·sgn(i)  with di/dt by central
// differences:  L = Σ y_k·d_k / Σ d_k²,  y_k = u_k − R·i_k,  d_k = di/dt at k.

#include <optional>
#include <vector>

#include "fitters/locked_rotor/capture.h"
#include "src/ingest/bench_log.h"

namespace coilspin::locked_rotor {

struct PlateauLine {
  double resistance_ohm = 0.0;
  double brush_drop_V = 0.0;
};

// factors: f_j per plateau (same length as plateaus). With estimate_brush_drop
// false, Vb is 0 and only R is solved for. Empty when the plateaus cannot
// determine the line (fewer plateaus than unknowns, or all currents equal).
std::optional<PlateauLine> FitPlateauLine(const std::vector<LockedPlateau>& plateaus,
                                          const std::vector<double>& factors, bool estimate_brush_drop);

struct StepStart {
  double resistance_ohm = 0.0;
  double inductance_H = 0.0;
  double initial_current_A = 0.0;
};

// known_resistance_ohm: R from plateaus when available (used instead of the final level).
std::optional<StepStart> EstimateStepStart(const BenchLog& log, double brush_drop_V,
                                           std::optional<double> known_resistance_ohm);

}  // namespace coilspin::locked_rotor

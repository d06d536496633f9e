#pragma once
// A winding that warms up continuously while it is tested (docs/bench-artefacts.md):
//     θ_w(t) = θ_w0 + ΔT·(1 − e^(−t/τ_th))
// a first-order thermal rise of ΔT with time constant τ_th from the start of
// the log (t = 0), and R(θ_w) by the copper law (src/model/copper_resistance.h).
// The simulators hold R over each sample period at its value at the period's
// start; with Δ ≪ τ_th that is the continuous rise to O(Δ/τ_th).

#include "src/model/bench_artefacts.h"
#include "src/model/bench_conditions.h"

namespace coilspin::model {

// True when ΔT ≠ 0.
bool HasWarmUp(const WindingWarmUp& warm_up);

// ΔT·(1 − e^(−t/τ_th)) [K]; 0 without warm-up.
double WarmUpRise_K(const WindingWarmUp& warm_up, double time_s);

// θ_w(t) = bench.winding_temperature_degC + the rise.
double WindingTemperatureAt_degC(const BenchConditions& bench, double time_s);

// Throws std::invalid_argument unless ΔT is finite and, with ΔT ≠ 0, τ_th is finite and > 0.
void ValidateWarmUp(const WindingWarmUp& warm_up);

}  // namespace coilspin::model

#pragma once
// The sample period of a simulated free-shaft voltage step whose user gave
// none (src/model/simulate_step.h).
//
// The current's rise after the step decays with the electrical time constant
// τe = L/(R + R_s); a fitter sees L only if that rise is resolved, which takes
// at least kSamplesPerElectricalTimeConstant samples per τe. The default is
// a fast logger's period, kFastLoggerSamplePeriod_s, shortened to
// τe/kSamplesPerElectricalTimeConstant for a winding faster than
// kSamplesPerElectricalTimeConstant·kFastLoggerSamplePeriod_s (0.2 ms):
//     Δ = min(kFastLoggerSamplePeriod_s, τe/kSamplesPerElectricalTimeConstant)
// R is taken at the bench's winding temperature (copper law, docs/methods.md
// §7), as the simulation does.
//
// Throws std::invalid_argument for L ≤ 0, R + R_s ≤ 0 or a temperature the
// copper law rejects.

#include "src/model/bench_conditions.h"
#include "src/model/motor_parameters.h"

namespace coilspin::model {

// 50 kS/s: a DAQ card or a scope in roll mode, fast enough for the 0.2–5 ms
// electrical time constants of small brushed motors (from memory) while a
// one-second hold stays at 50 000 rows.
inline constexpr double kFastLoggerSamplePeriod_s = 20e-6;
// Samples per τe the current's rise needs (docs/procedures.md: at least 10, better 100).
inline constexpr double kSamplesPerElectricalTimeConstant = 10.0;

double StepSamplePeriod_s(const MotorParameters& motor, const BenchConditions& bench);

}  // namespace coilspin::model

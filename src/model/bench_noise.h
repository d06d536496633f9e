#pragma once
// Adds the bench's sensors to the channels a log has (src/model/sensor_chain.h):
//     reading = q(x + o + e + s), or 0 at a dropout
// voltage (σ_V, ADC step), current (σ_I, ADC step), speed (σ_ω, step) and
// torque (σ_τ, step), each with its sensor's artefacts
// (BenchConditions::voltage_sensor, …) and its own streams of
// BenchConditions::seed (src/model/noise_streams.h). Position and temperature
// are left exact: an encoder's error is its count quantisation, applied where
// the count is made. Throws std::invalid_argument for a negative σ or ADC step
// and for artefacts out of range.

#include "src/model/bench_conditions.h"
#include "src/model/sampled_log.h"

namespace coilspin::model {

void AddBenchNoise(const BenchConditions& bench, SampledLog& log);

}  // namespace coilspin::model

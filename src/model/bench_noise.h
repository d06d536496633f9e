#pragma once
// Adds the bench's measurement noise to the channels a log has:
//     x_logged = q(x + σ·z)   (src/model/measurement_noise.h)
// voltage (σ_V, ADC step), current (σ_I, ADC step), speed (σ_ω) and torque
// (σ_τ), each from its own stream of BenchConditions::seed
// (src/model/noise_streams.h). Position and temperature are left exact: an
// encoder's error is its count quantisation, applied where the count is made.
// Throws std::invalid_argument for a negative σ or ADC step.

#include "src/model/bench_conditions.h"
#include "src/model/sampled_log.h"

namespace coilspin::model {

void AddBenchNoise(const BenchConditions& bench, SampledLog& log);

}  // namespace coilspin::model

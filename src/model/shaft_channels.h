#pragma once
// How the shaft's motion reaches the log.
//
// Gearbox. Speed and position are read at the gearbox output, N motor turns
// per output turn (BenchConditions::gear_ratio, 1 without a gearbox):
//     ω_out = ω/N,   θ_out = θ/N
// Encoder. With cpr counts per revolution (BenchConditions::
// encoder_counts_per_rev > 0) the logged position is the whole count
//     n = floor(θ_out·cpr/2π + φ),   θ_logged = n·2π/cpr
// (an incremental encoder zeroed at the start, θ = 0, counting edges passed;
// φ ∈ [0, 1) = BenchConditions::encoder_start_phase is where the shaft rests
// within its count then, so the first edge comes after (1 − φ) of a count).
// Without an encoder the position is logged exactly. Speed noise is added
// later with the other channels (src/model/bench_noise.h).

#include <cstdint>
#include <vector>

#include "src/model/bench_conditions.h"
#include "src/model/sampled_log.h"

namespace coilspin::model {

// Which shaft channels a free-shaft log carries.
enum class ShaftChannels { kSpeed, kPosition, kSpeedAndPosition };

// n = floor(θ_out·cpr/2π + φ). Expects counts_per_rev > 0 and φ in [0, 1).
std::int64_t EncoderCount(double output_position_rad, int counts_per_rev, double start_phase = 0.0);

// Fills log.speed_rad_s and/or log.position_rad from the motor shaft's ω and θ.
// Throws std::invalid_argument for a gear ratio that is not finite and > 0 or
// a negative counts per revolution.
void LogShaft(const std::vector<double>& motor_speed_rad_s,
              const std::vector<double>& motor_position_rad, ShaftChannels channels,
              const BenchConditions& bench, SampledLog& log);

// Throws std::invalid_argument unless the gear ratio is finite and > 0, the
// counts per revolution are >= 0 and the encoder's start phase lies in [0, 1).
void ValidateShaftReadout(const BenchConditions& bench);

}  // namespace coilspin::model

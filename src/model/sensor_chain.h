#pragma once
// One logged channel from its exact value to the logger's reading
// (docs/bench-artefacts.md; the artefacts are defined in src/model/bench_artefacts.h):
//     y_k = x_k + o + e_k + s_k,   reading_k = q(y_k),   or 0 at a dropout
// in that order: a zero offset o; AR(1) noise e_k of stationary σ and lag-1
// correlation φ (src/model/ar1_noise.h; white when φ = 0); a spike s_k = ±k·FS
// with probability p_s, FS = max_k |x_k|; the ADC step q; and, with
// probability p_d, a dropout that replaces the reading by 0.
// Noise, dropouts and spikes each draw from their own stream of the seed, so
// turning one on does not move the others. With every artefact off this is
// x_logged = q(x + σ·z) of src/model/measurement_noise.h, bit for bit.

#include <cstdint>
#include <string>
#include <vector>

#include "src/model/bench_artefacts.h"

namespace coilspin::model {

// The streams of one channel (src/model/noise_streams.h).
struct SensorStreams {
  std::uint32_t noise = 0;
  std::uint32_t dropout = 0;
  std::uint32_t spike = 0;
};

// channel[k] ← the reading. Throws std::invalid_argument (message starting
// "<name> sensor: ") for σ < 0, lsb < 0, |φ| ≥ 1, a rate outside [0, 1], a
// negative spike size or a non-finite offset.
void ApplySensor(std::vector<double>& channel, double sigma, double lsb, const SensorArtefacts& sensor,
                 std::uint64_t seed, const SensorStreams& streams, const std::string& name);

}  // namespace coilspin::model

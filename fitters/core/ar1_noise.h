#pragma once
// Noise on a logged channel as a first-order autoregression, the model the
// input-noise terms probe (input_noise_autocovariance.h, the fitters' sandwich
// terms):
//     δ_k = φ·δ_{k−1} + √(1 − φ²)·σ·z_k,   δ_0 = σ·z_0,   z_k ~ N(0, 1) independent,
// stationary from the first sample with marginal σ and lag-1 correlation φ
// (autocorrelation φ^m at lag m; Box & Jenkins §3.2.4 — from memory). φ = 0 is
// white noise. Real sensors are coloured (an anti-aliasing filter, a filtered
// tachometer): a voltage channel with φ = 0.9 passes ten times more of its
// noise variance through a motor's slow dynamics than white noise of the same
// σ would, so probing it as white noise left the step models' input-noise
// terms an order of magnitude short on real-rig benches.

#include <cmath>
#include <random>
#include <vector>

namespace coilspin::core {

struct NoiseLevel {
  double sigma = 0.0;  // marginal σ, in the channel's unit
  double lag1 = 0.0;   // φ in [0, 1)
};

// δ_0 … δ_{n−1} of the model above, drawn from `generator` (std::normal_distribution).
inline void DrawAr1(std::mt19937_64& generator, const NoiseLevel& level, std::vector<double>* out) {
  std::normal_distribution<double> normal(0.0, 1.0);
  const double innovation = level.sigma * std::sqrt(1.0 - level.lag1 * level.lag1);
  double value = 0.0;
  for (std::size_t k = 0; k < out->size(); ++k) {
    value = k == 0 ? level.sigma * normal(generator) : level.lag1 * value + innovation * normal(generator);
    (*out)[k] = value;
  }
}

}  // namespace coilspin::core

#pragma once
// Coloured (first-order autoregressive, AR(1)) Gaussian noise, stationary from
// the first sample:
//     e_0 = σ·z_0,   e_k = φ·e_(k−1) + √(1 − φ²)·σ·z_k,   |φ| < 1,
// so every e_k has variance σ² and corr(e_k, e_(k−m)) = φ^m (Box, Jenkins &
// Reinsel, Time Series Analysis, §3.2.4: the AR(1) process). The z_k are the
// N(0, 1) deviates of one stream of src/model/measurement_noise.h; with φ = 0
// the sequence is σ·z_k, the white noise of that stream, bit for bit.
// An Ornstein–Uhlenbeck process of correlation time τ sampled every Δ is this
// process with φ = e^(−Δ/τ) (the exact discretisation; src/model/wandering_friction.h).

#include <cstdint>

#include "src/model/measurement_noise.h"

namespace coilspin::model {

class Ar1Noise {
 public:
  // Throws std::invalid_argument unless σ ≥ 0 and −1 < φ < 1 (both finite).
  Ar1Noise(std::uint64_t seed, std::uint32_t stream, double sigma, double lag1_correlation);

  // e_0, e_1, … in turn.
  double Next();

 private:
  MeasurementNoise deviates_;
  double sigma_;
  double phi_;
  double innovation_sigma_;  // √(1 − φ²)·σ
  double previous_ = 0.0;
  bool started_ = false;
};

}  // namespace coilspin::model

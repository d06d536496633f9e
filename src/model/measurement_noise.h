#pragma once
// The random numbers of a simulated bench, and ADC quantisation.
//
// The analogue signal x picks up white Gaussian noise before the converter
// rounds it to its step (lsb):
//     x_logged = q(x + σ·z),   z ~ N(0, 1) independent per sample,
//     q(y) = lsb·round(y/lsb)   (q is the identity when lsb = 0).
// (src/model/sensor_chain.h applies it, with a real sensor's other faults.)
//
// Reproducible: the deviates come from std::mt19937_64 seeded through
// std::seed_seq (both specified exactly by the C++ standard) and the
// Box–Muller transform written here, not std::normal_distribution, whose
// algorithm differs between standard libraries. A (seed, stream) pair gives the
// same sequence everywhere; each logged channel uses its own stream, so the
// noise on one channel does not change when another channel's σ does.

#include <cstdint>
#include <random>

namespace coilspin::model {

// q(y) = lsb·round(y/lsb); y itself when lsb = 0.
double Quantise(double value, double lsb);

class MeasurementNoise {
 public:
  MeasurementNoise(std::uint64_t seed, std::uint32_t stream);

  // One N(0, 1) deviate.
  double StandardNormal();

  // Uniform on (0, 1], from the top 53 bits of one engine output: u ≤ p has
  // probability p (to 2⁻⁵³) for p in [0, 1].
  double UniformOpenZero();

 private:
  std::mt19937_64 engine_;
  bool has_spare_ = false;  // Box–Muller makes deviates in pairs
  double spare_ = 0.0;
};

}  // namespace coilspin::model

#include "src/model/measurement_noise.h"

#include <cmath>

namespace coilspin::model {

namespace {

constexpr int kMantissaBits = 53;                 // IEEE 754 double
constexpr int kEngineBits = 64;                   // std::mt19937_64 output width
constexpr double kTwoPi = 6.283185307179586477;   // 2π
constexpr std::uint32_t kLowWordMask = 0xFFFFFFFFu;
constexpr int kWordBits = 32;

std::seed_seq MakeSeedSequence(std::uint64_t seed, std::uint32_t stream) {
  return std::seed_seq{static_cast<std::uint32_t>(seed & kLowWordMask),
                       static_cast<std::uint32_t>(seed >> kWordBits), stream};
}

}  // namespace

double Quantise(double value, double lsb) {
  if (lsb == 0.0) return value;
  return lsb * std::round(value / lsb);
}

MeasurementNoise::MeasurementNoise(std::uint64_t seed, std::uint32_t stream) {
  std::seed_seq sequence = MakeSeedSequence(seed, stream);
  engine_.seed(sequence);
}

double MeasurementNoise::UniformOpenZero() {
  const std::uint64_t top_bits = engine_() >> (kEngineBits - kMantissaBits);
  return (static_cast<double>(top_bits) + 1.0) * std::ldexp(1.0, -kMantissaBits);
}

double MeasurementNoise::StandardNormal() {
  if (has_spare_) {
    has_spare_ = false;
    return spare_;
  }
  // Box–Muller: z0 = √(−2·ln u1)·cos(2π·u2), z1 = √(−2·ln u1)·sin(2π·u2)
  const double radius = std::sqrt(-2.0 * std::log(UniformOpenZero()));
  const double angle = kTwoPi * UniformOpenZero();
  spare_ = radius * std::sin(angle);
  has_spare_ = true;
  return radius * std::cos(angle);
}

}  // namespace coilspin::model

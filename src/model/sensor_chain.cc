#include "src/model/sensor_chain.h"

#include <algorithm>
#include <cmath>
#include <optional>
#include <stdexcept>

#include "src/model/ar1_noise.h"
#include "src/model/measurement_noise.h"

namespace coilspin::model {

namespace {

constexpr double kEvenOdds = 0.5;  // a spike is positive or negative with equal probability

bool IsRate(double p) { return p >= 0.0 && p <= 1.0; }

void Validate(double sigma, double lsb, const SensorArtefacts& s, const std::string& name) {
  const auto require = [&name](bool condition, const std::string& what) {
    if (!condition) throw std::invalid_argument(name + " sensor: " + what);
  };
  require(sigma >= 0.0 && lsb >= 0.0, "sigma and lsb must be >= 0");
  require(s.noise_lag1_correlation > -1.0 && s.noise_lag1_correlation < 1.0,
          "the noise's lag-1 correlation must lie in (-1, 1)");
  require(std::isfinite(s.zero_offset), "the zero offset must be finite");
  require(IsRate(s.dropout_rate) && IsRate(s.spike_rate), "dropout and spike rates must lie in [0, 1]");
  require(std::isfinite(s.spike_full_scales) && s.spike_full_scales >= 0.0,
          "the spike size must be >= 0 full scales");
}

double FullScale(const std::vector<double>& channel) {
  double largest = 0.0;
  for (double x : channel) largest = std::max(largest, std::abs(x));
  return largest;
}

}  // namespace

void ApplySensor(std::vector<double>& channel, double sigma, double lsb, const SensorArtefacts& sensor,
                 std::uint64_t seed, const SensorStreams& streams, const std::string& name) {
  Validate(sigma, lsb, sensor, name);
  const double spike_height = sensor.spike_full_scales * FullScale(channel);  // k·FS
  std::optional<Ar1Noise> noise;
  if (sigma > 0.0) noise.emplace(seed, streams.noise, sigma, sensor.noise_lag1_correlation);
  std::optional<MeasurementNoise> dropouts, spikes;
  if (sensor.dropout_rate > 0.0) dropouts.emplace(seed, streams.dropout);
  if (sensor.spike_rate > 0.0 && spike_height > 0.0) spikes.emplace(seed, streams.spike);
  for (double& value : channel) {
    double y = value;
    if (sensor.zero_offset != 0.0) y += sensor.zero_offset;  // + o
    if (noise) y = y + noise->Next();                        // + e_k
    if (spikes && spikes->UniformOpenZero() <= sensor.spike_rate) {
      y += spikes->UniformOpenZero() <= kEvenOdds ? spike_height : -spike_height;  // ± k·FS
    }
    y = Quantise(y, lsb);
    if (dropouts && dropouts->UniformOpenZero() <= sensor.dropout_rate) y = 0.0;  // a dropout reads 0
    value = y;
  }
}

}  // namespace coilspin::model

#include "src/model/shaft_channels.h"

#include <cmath>
#include <cstddef>
#include <stdexcept>

#include "src/units/constants.h"

namespace coilspin::model {

std::int64_t EncoderCount(double output_position_rad, int counts_per_rev, double start_phase) {
  // n = floor(θ_out·cpr/2π + φ)
  return static_cast<std::int64_t>(
      std::floor(output_position_rad * counts_per_rev / units::kRadiansPerRevolution + start_phase));
}

void ValidateShaftReadout(const BenchConditions& bench) {
  if (!(std::isfinite(bench.gear_ratio) && bench.gear_ratio > 0.0)) {
    throw std::invalid_argument("shaft readout: the gear ratio must be > 0");
  }
  if (bench.encoder_counts_per_rev < 0) {
    throw std::invalid_argument("shaft readout: the encoder counts per revolution must be >= 0");
  }
  if (!(bench.encoder_start_phase >= 0.0 && bench.encoder_start_phase < 1.0)) {
    throw std::invalid_argument("shaft readout: the encoder start phase must lie in [0, 1) of a count");
  }
}

void LogShaft(const std::vector<double>& motor_speed_rad_s,
              const std::vector<double>& motor_position_rad, ShaftChannels channels,
              const BenchConditions& bench, SampledLog& log) {
  ValidateShaftReadout(bench);
  const double ratio = bench.gear_ratio;
  if (channels != ShaftChannels::kPosition) {
    log.speed_rad_s.resize(motor_speed_rad_s.size());
    for (std::size_t k = 0; k < motor_speed_rad_s.size(); ++k) {
      log.speed_rad_s[k] = motor_speed_rad_s[k] / ratio;  // ω_out = ω/N
    }
  }
  if (channels == ShaftChannels::kSpeed) return;
  const int cpr = bench.encoder_counts_per_rev;
  log.position_rad.resize(motor_position_rad.size());
  for (std::size_t k = 0; k < motor_position_rad.size(); ++k) {
    const double output_rad = motor_position_rad[k] / ratio;  // θ_out = θ/N
    log.position_rad[k] = output_rad;
    if (cpr > 0) {
      // θ_logged = n·2π/cpr
      log.position_rad[k] =
          static_cast<double>(EncoderCount(output_rad, cpr, bench.encoder_start_phase)) * units::kRadiansPerRevolution / cpr;
    }
  }
}

}  // namespace coilspin::model

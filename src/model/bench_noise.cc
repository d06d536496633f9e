#include "src/model/bench_noise.h"

#include "src/model/measurement_noise.h"
#include "src/model/noise_streams.h"

namespace coilspin::model {

namespace {

constexpr double kNotQuantised = 0.0;

}  // namespace

void AddBenchNoise(const BenchConditions& bench, SampledLog& log) {
  MeasurementNoise(bench.seed, kVoltageNoiseStream)
      .Apply(log.voltage_V, bench.voltage_noise_sigma_V, bench.voltage_lsb_V);
  MeasurementNoise(bench.seed, kCurrentNoiseStream)
      .Apply(log.current_A, bench.current_noise_sigma_A, bench.current_lsb_A);
  MeasurementNoise(bench.seed, kSpeedNoiseStream)
      .Apply(log.speed_rad_s, bench.speed_noise_sigma_rad_s, kNotQuantised);
  MeasurementNoise(bench.seed, kTorqueNoiseStream)
      .Apply(log.torque_N_m, bench.torque_noise_sigma_N_m, kNotQuantised);
}

}  // namespace coilspin::model

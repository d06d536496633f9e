#include "src/model/bench_noise.h"

#include "src/model/noise_streams.h"
#include "src/model/sensor_chain.h"

namespace coilspin::model {

void AddBenchNoise(const BenchConditions& bench, SampledLog& log) {
  ApplySensor(log.voltage_V, bench.voltage_noise_sigma_V, bench.voltage_lsb_V, bench.voltage_sensor, bench.seed,
              {kVoltageNoiseStream, kVoltageDropoutStream, kVoltageSpikeStream}, "voltage");
  ApplySensor(log.current_A, bench.current_noise_sigma_A, bench.current_lsb_A, bench.current_sensor, bench.seed,
              {kCurrentNoiseStream, kCurrentDropoutStream, kCurrentSpikeStream}, "current");
  ApplySensor(log.speed_rad_s, bench.speed_noise_sigma_rad_s, bench.speed_lsb_rad_s, bench.speed_sensor, bench.seed,
              {kSpeedNoiseStream, kSpeedDropoutStream, kSpeedSpikeStream}, "speed");
  ApplySensor(log.torque_N_m, bench.torque_noise_sigma_N_m, bench.torque_lsb_N_m, bench.torque_sensor, bench.seed,
              {kTorqueNoiseStream, kTorqueDropoutStream, kTorqueSpikeStream}, "torque");
}

}  // namespace coilspin::model

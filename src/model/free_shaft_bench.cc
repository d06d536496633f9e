#include "src/model/free_shaft_bench.h"

#include <cmath>
#include <stdexcept>
#include <utility>

#include "src/model/bench_noise.h"
#include "src/model/copper_resistance.h"
#include "src/model/sample_plan.h"

namespace coilspin::model {

namespace {

// The exact, motor-side record of a run.
struct FreeShaftRecord {
  std::vector<double> time_s;
  std::vector<double> voltage_V;
  std::vector<double> current_A;
  std::vector<double> speed_rad_s;
  std::vector<double> position_rad;
};

FreeShaftRecord Integrate(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                          double sample_period_s) {
  FreeShaftRecord record;
  FreeShaftState state;  // from rest
  std::size_t k = 0;
  for (const FreeShaftSegment& segment : segments) {
    if (segment.input.open_circuit) state.current_A = 0.0;  // the ideal switch opens
    for (std::size_t n = 0; n < segment.samples; ++n, ++k) {
      record.time_s.push_back(static_cast<double>(k) * sample_period_s);  // t_k = k·Δ
      record.voltage_V.push_back(FreeShaftTerminalVoltage(motor, segment.input, state));
      record.current_A.push_back(state.current_A);
      record.speed_rad_s.push_back(state.speed_rad_s);
      record.position_rad.push_back(state.position_rad);
      state = AdvanceFreeShaft(motor, segment.input, state, sample_period_s);
    }
  }
  return record;
}

SampledLog LogOf(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                 double sample_period_s, const FreeShaftChannels& channels, const BenchConditions& bench) {
  ValidateShaftReadout(bench);
  MotorParameters warm = motor;
  warm.resistance_ohm = CopperResistanceAt(motor.resistance_ohm, bench.resistance_reference_temperature_degC,
                                           bench.winding_temperature_degC);
  FreeShaftRecord record = Integrate(warm, segments, sample_period_s);
  SampledLog log;
  log.time_s = std::move(record.time_s);
  if (channels.voltage) log.voltage_V = std::move(record.voltage_V);
  if (channels.current) log.current_A = std::move(record.current_A);
  LogShaft(record.speed_rad_s, record.position_rad, channels.shaft, bench, log);
  if (channels.temperature) log.temperature_degC.assign(log.time_s.size(), bench.winding_temperature_degC);
  AddBenchNoise(bench, log);
  return log;
}

}  // namespace

SampledLog RunFreeShaftBench(const MotorParameters& motor, const std::vector<FreeShaftSegment>& segments,
                             double sample_period_s, const FreeShaftChannels& channels,
                             const BenchConditions& bench, const std::string& simulation) {
  RequireSamplePeriod(sample_period_s, simulation);
  const auto positive = [](double value) { return std::isfinite(value) && value > 0.0; };
  RequirePlan(positive(motor.back_emf_constant_V_s_per_rad) && positive(motor.torque_constant_N_m_per_A),
              simulation, "Ke and Kt must be > 0");
  try {
    return LogOf(motor, segments, sample_period_s, channels, bench);
  } catch (const std::invalid_argument& e) {
    throw std::invalid_argument(simulation + ": " + e.what());
  }
}

}  // namespace coilspin::model
